/**
 * The bridge's DC-link current i_dc = sum_x s_x i_x (s_x = 1 while leg x is on the plus rail) over a
 * window, from the integrals of i_dc and of its square the switching model's probe accumulates: its
 * mean (the bus's DC current), its rms and the rms of its ripple about the mean,
 * sqrt(rms² - mean²), which the bus capacitor carries when the source supplies only the mean.
 * Kolar and Round (2006), "Analytical calculation of the RMS current stress on the DC-link capacitor
 * of voltage-PWM converter systems", IEE Proc. Electric Power Applications 153(4).
 */
export interface DcLinkCurrent {
  mean_A: number;
  rms_A: number;
  rippleRms_A: number;
}

/** Mean, rms and ripple rms of i_dc from its integral (A·s) and its square's (A²·s) over `span` seconds. */
export function dcLinkCurrent(integral: number, squareIntegral: number, span: number): DcLinkCurrent {
  if (!(span > 0)) throw new RangeError('span must be > 0 s');
  const mean = integral / span;
  const ms = squareIntegral / span;
  return { mean_A: mean, rms_A: Math.sqrt(Math.max(0, ms)), rippleRms_A: Math.sqrt(Math.max(0, ms - mean * mean)) };
}
