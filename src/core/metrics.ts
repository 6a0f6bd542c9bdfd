/**
 * Figures of merit of simulated responses, from traces sampled at the control rate.
 * Every function returns null where a figure is not defined (no step, never settles), never NaN.
 *
 * - Step response of y to a reference step at tStep from y0 to yFinal, over [tStep, tEnd]:
 *   rise time 10 % -> 90 % of the step (linear interpolation between samples); overshoot beyond
 *   the final value in % of the step; settling time = time after the step from which y stays within
 *   `band` (default 2 %) of the step around yFinal.
 * - Load step at tStep against a reference yRef: dip = largest |yRef - y| over [tStep, tEnd];
 *   recovery time = time after the step from which |yRef - y| stays within `recoveryFraction`
 *   (default 5 %) of the dip.
 * - Steady-state error: mean of (ref - y) over the last `window` seconds.
 */

export const DEFAULT_SETTLING_BAND = 0.02;
export const DEFAULT_RECOVERY_FRACTION = 0.05;

export interface StepMetrics {
  riseTime_s: number | null;
  overshoot_pct: number | null;
  settlingTime_s: number | null;
}

function firstIndexAtOrAfter(t: ArrayLike<number>, n: number, x: number): number {
  let lo = 0;
  let hi = n;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (t[mid]! < x) lo = mid + 1; else hi = mid;
  }
  return lo;
}

export function stepResponse(
  t: ArrayLike<number>, y: ArrayLike<number>, n: number,
  tStep: number, tEnd: number, y0: number, yFinal: number, band = DEFAULT_SETTLING_BAND,
): StepMetrics {
  const none = { riseTime_s: null, overshoot_pct: null, settlingTime_s: null };
  const delta = yFinal - y0;
  const scale = Math.max(Math.abs(y0), Math.abs(yFinal));
  if (!(Math.abs(delta) > 1e-9 * Math.max(scale, 1e-300)) || !Number.isFinite(delta)) return none;
  const i0 = firstIndexAtOrAfter(t, n, tStep);
  const i1 = firstIndexAtOrAfter(t, n, tEnd); // exclusive
  if (i1 - i0 < 2) return none;
  let t10: number | null = null;
  let t90: number | null = null;
  let zMax = -Infinity;
  let lastOut = -1;
  let prevZ = (y[i0]! - y0) / delta;
  for (let i = i0; i < i1; i++) {
    const z = (y[i]! - y0) / delta;
    if (i > i0) {
      if (t10 === null && z >= 0.1) t10 = t[i - 1]! + ((0.1 - prevZ) / (z - prevZ)) * (t[i]! - t[i - 1]!);
      if (t90 === null && z >= 0.9) t90 = t[i - 1]! + ((0.9 - prevZ) / (z - prevZ)) * (t[i]! - t[i - 1]!);
    } else {
      if (z >= 0.1) t10 = t[i]!;
      if (z >= 0.9) t90 = t[i]!;
    }
    if (z > zMax) zMax = z;
    if (Math.abs(z - 1) > band) lastOut = i;
    prevZ = z;
  }
  const riseTime_s = t10 !== null && t90 !== null ? Math.max(0, t90 - t10) : null;
  const overshoot_pct = Number.isFinite(zMax) ? Math.max(0, zMax - 1) * 100 : null;
  let settlingTime_s: number | null;
  if (lastOut === i1 - 1) settlingTime_s = null;
  else if (lastOut < 0) settlingTime_s = 0;
  else settlingTime_s = t[lastOut + 1]! - tStep;
  return { riseTime_s, overshoot_pct, settlingTime_s };
}

export interface LoadStepMetrics {
  dip: number | null;
  recovery_s: number | null;
}

export function loadStepResponse(
  t: ArrayLike<number>, yRef: ArrayLike<number>, y: ArrayLike<number>, n: number,
  tStep: number, tEnd: number, recoveryFraction = DEFAULT_RECOVERY_FRACTION,
): LoadStepMetrics {
  const i0 = firstIndexAtOrAfter(t, n, tStep);
  const i1 = firstIndexAtOrAfter(t, n, tEnd);
  if (i1 - i0 < 2) return { dip: null, recovery_s: null };
  let dip = 0;
  for (let i = i0; i < i1; i++) dip = Math.max(dip, Math.abs(yRef[i]! - y[i]!));
  if (!Number.isFinite(dip)) return { dip: null, recovery_s: null };
  const bandAbs = Math.max(recoveryFraction * dip, 1e-12);
  let lastOut = -1;
  for (let i = i0; i < i1; i++) if (Math.abs(yRef[i]! - y[i]!) > bandAbs) lastOut = i;
  let recovery_s: number | null;
  if (lastOut === i1 - 1) recovery_s = null;
  else if (lastOut < 0) recovery_s = 0;
  else recovery_s = t[lastOut + 1]! - tStep;
  return { dip, recovery_s };
}

export function steadyStateError(t: ArrayLike<number>, ref: ArrayLike<number>, y: ArrayLike<number>, n: number, window: number): number | null {
  if (n < 1) return null;
  const tEnd = t[n - 1]!;
  const i0 = Math.min(firstIndexAtOrAfter(t, n, tEnd - window), n - 1);
  let s = 0;
  for (let i = i0; i < n; i++) s += ref[i]! - y[i]!;
  const e = s / (n - i0);
  return Number.isFinite(e) ? e : null;
}

/** Replace a non-finite figure by null. */
export const finiteOrNull = (x: number | null | undefined): number | null => (x === null || x === undefined || !Number.isFinite(x) ? null : x);
