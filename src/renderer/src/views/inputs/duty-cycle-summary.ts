// What the input side shows of a duty cycle instead of its rows (a cycle may hold 180 000 samples):
// its sample count, duration, speed and torque ranges, RMS torque, and a decimated trace for a
// sparkline. Read from the draft as typed, so a half-valid cycle still gives what can be read.

export interface DutyCycleSummary {
  samples: number;
  duration_s: number;
  /** smallest and largest time step between samples, s */
  stepMin_s: number;
  stepMax_s: number;
  speedMin_rpm: number;
  speedMax_rpm: number;
  torqueMin_Nm: number;
  torqueMax_Nm: number;
  /** RMS of the shaft torque over the cycle, the torque linear between samples */
  torqueRms_Nm: number;
}

const isObj = (x: unknown): x is Record<string, unknown> => x !== null && typeof x === 'object' && !Array.isArray(x);
const finite = (x: unknown): x is number => typeof x === 'number' && Number.isFinite(x);

/** The three columns when they are lists (of anything), else null. */
export function dutyCycleColumns(dc: unknown): { t: unknown[]; speed: unknown[]; torque: unknown[] } | null {
  if (!isObj(dc)) return null;
  const { t_s, speed_rpm, torque_Nm } = dc;
  if (!Array.isArray(t_s) || !Array.isArray(speed_rpm) || !Array.isArray(torque_Nm)) return null;
  return { t: t_s, speed: speed_rpm, torque: torque_Nm };
}

/**
 * The summary of a duty cycle's columns, or null when they are not lists of at least two samples.
 * Ranges are over the finite entries; the duration, steps and RMS over the segments whose ends are
 * finite and ascending in time. The RMS of a quantity linear from a to b over dt is
 * sqrt((a² + ab + b²) / 3) (the integral of a straight line squared; from memory).
 */
export function summariseDutyCycle(dc: unknown): DutyCycleSummary | null {
  const c = dutyCycleColumns(dc);
  if (!c) return null;
  const n = Math.min(c.t.length, c.speed.length, c.torque.length);
  if (n < 2) return null;
  let sMin = Infinity;
  let sMax = -Infinity;
  let qMin = Infinity;
  let qMax = -Infinity;
  let stepMin = Infinity;
  let stepMax = -Infinity;
  let sq = 0;
  let span = 0;
  for (let i = 0; i < n; i++) {
    const s = c.speed[i];
    const q = c.torque[i];
    if (finite(s)) {
      if (s < sMin) sMin = s;
      if (s > sMax) sMax = s;
    }
    if (finite(q)) {
      if (q < qMin) qMin = q;
      if (q > qMax) qMax = q;
    }
    if (i === 0) continue;
    const t0 = c.t[i - 1];
    const t1 = c.t[i];
    const q0 = c.torque[i - 1];
    if (!finite(t0) || !finite(t1) || !(t1 > t0)) continue;
    const dt = t1 - t0;
    if (dt < stepMin) stepMin = dt;
    if (dt > stepMax) stepMax = dt;
    span += dt;
    if (finite(q0) && finite(q)) sq += (dt * (q0 * q0 + q0 * q + q * q)) / 3;
  }
  const t0 = c.t[0];
  const tn = c.t[n - 1];
  return {
    samples: n,
    duration_s: finite(t0) && finite(tn) ? tn - t0 : NaN,
    stepMin_s: span > 0 ? stepMin : NaN,
    stepMax_s: span > 0 ? stepMax : NaN,
    speedMin_rpm: sMin <= sMax ? sMin : NaN,
    speedMax_rpm: sMin <= sMax ? sMax : NaN,
    torqueMin_Nm: qMin <= qMax ? qMin : NaN,
    torqueMax_Nm: qMin <= qMax ? qMax : NaN,
    torqueRms_Nm: span > 0 ? Math.sqrt(sq / span) : NaN,
  };
}

/**
 * A trace of one column against time for a sparkline: the time span cut into `buckets` equal
 * slices, each slice's smallest and largest value kept in the order they occur (min-max
 * decimation, so no peak is lost), at most 2 points per slice; points as [x, y] in 0..1 (x along the
 * time span, y 0 at the column's smallest and 1 at its largest value). Empty when the time
 * column cannot be read.
 */
export function sparkline(t: readonly unknown[], y: readonly unknown[], buckets: number): Array<[number, number]> {
  const n = Math.min(t.length, y.length);
  let t0 = Infinity;
  let t1 = -Infinity;
  let lo = Infinity;
  let hi = -Infinity;
  for (let i = 0; i < n; i++) {
    const ti = t[i];
    const yi = y[i];
    if (!finite(ti) || !finite(yi)) continue;
    if (ti < t0) t0 = ti;
    if (ti > t1) t1 = ti;
    if (yi < lo) lo = yi;
    if (yi > hi) hi = yi;
  }
  if (!(t1 > t0) || buckets < 1) return [];
  const yr = hi > lo ? hi - lo : 1;
  const out: Array<[number, number]> = [];
  let b = -1;
  let iMin = -1;
  let iMax = -1;
  const flush = (): void => {
    if (iMin < 0) return;
    const pts = iMin === iMax ? [iMin] : iMin < iMax ? [iMin, iMax] : [iMax, iMin];
    for (const i of pts) out.push([((t[i] as number) - t0) / (t1 - t0), ((y[i] as number) - lo) / yr]);
  };
  for (let i = 0; i < n; i++) {
    const ti = t[i];
    const yi = y[i];
    if (!finite(ti) || !finite(yi)) continue;
    const k = Math.min(buckets - 1, Math.floor(((ti - t0) / (t1 - t0)) * buckets));
    if (k !== b) {
      flush();
      b = k;
      iMin = i;
      iMax = i;
    } else {
      if (yi < (y[iMin] as number)) iMin = i;
      if (yi > (y[iMax] as number)) iMax = i;
    }
  }
  flush();
  return out;
}

/**
 * Whether two cycles have the same columns, entry by entry: the draft's tree is copied on every
 * edit, so a cycle that did not change is a new object with equal lists, and comparing them (one
 * pass, no arithmetic) is cheaper than summarising them again.
 */
export function sameColumns(a: unknown, b: unknown): boolean {
  if (a === b) return true;
  const x = dutyCycleColumns(a);
  const y = dutyCycleColumns(b);
  if (!x || !y) return false;
  for (const k of ['t', 'speed', 'torque'] as const) {
    const p = x[k];
    const q = y[k];
    if (p.length !== q.length) return false;
    for (let i = 0; i < p.length; i++) if (!Object.is(p[i], q[i])) return false;
  }
  return true;
}
