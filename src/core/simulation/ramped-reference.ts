/** The speed reference as the speed loop sees it after the controller's ramp limit. */

/** The speed reference at time t after the ramp limit (rate in rad/s², Infinity for none), as the speed loop sees it. */
export function rampedReference(w0: number, steps: ReadonlyArray<{ t: number; v: number }>, rate: number, t: number): number {
  const sorted = [...steps].sort((a, b) => a.t - b.t);
  let w = w0;
  let target = w0;
  let tc = 0;
  const advance = (to: number): void => {
    const d = target - w;
    const most = rate * Math.max(0, to - tc);
    w += Math.abs(d) <= most ? d : Math.sign(d) * most;
    tc = to;
  };
  for (const st of sorted) {
    if (st.t > t) break;
    advance(st.t);
    target = st.v;
  }
  advance(t);
  return w;
}
