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
  /** |ref - y| at the first sample at or after the step (null without samples) */
  errorAtStep: number | null;
  /** the loop was settled at the step (always true with the default settledFloor) */
  settled: boolean;
}

/**
 * A load step is measured only from a settled loop: the error at the step within this fraction of
 * the reference (and within `settledFloor`, in y's units, near zero reference). Otherwise the
 * error left over from an earlier step would be counted as dip; dip and recovery are then null.
 * `settledFloor` = Infinity (the default) measures every step as it is.
 */
export const SETTLED_FRACTION = 0.02;

function unsettled(e0: number, yRef0: number, settledFloor: number): boolean {
  return e0 > Math.max(SETTLED_FRACTION * Math.abs(yRef0), settledFloor);
}

export function loadStepResponse(
  t: ArrayLike<number>, yRef: ArrayLike<number>, y: ArrayLike<number>, n: number,
  tStep: number, tEnd: number, recoveryFraction = DEFAULT_RECOVERY_FRACTION, settledFloor = Infinity,
): LoadStepMetrics {
  const i0 = firstIndexAtOrAfter(t, n, tStep);
  const i1 = firstIndexAtOrAfter(t, n, tEnd);
  const errorAtStep = i0 < i1 ? Math.abs(yRef[i0]! - y[i0]!) : null;
  const settled = errorAtStep === null || !unsettled(errorAtStep, yRef[i0]!, settledFloor);
  if (i1 - i0 < 2 || !settled) return { dip: null, recovery_s: null, errorAtStep, settled };
  let dip = 0;
  for (let i = i0; i < i1; i++) dip = Math.max(dip, Math.abs(yRef[i]! - y[i]!));
  if (!Number.isFinite(dip)) return { dip: null, recovery_s: null, errorAtStep, settled };
  const bandAbs = Math.max(recoveryFraction * dip, 1e-12);
  let lastOut = -1;
  for (let i = i0; i < i1; i++) if (Math.abs(yRef[i]! - y[i]!) > bandAbs) lastOut = i;
  let recovery_s: number | null;
  if (lastOut === i1 - 1) recovery_s = null;
  else if (lastOut < 0) recovery_s = 0;
  else recovery_s = t[lastOut + 1]! - tStep;
  return { dip, recovery_s, errorAtStep, settled };
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

// ------------------------------------------------------------------ streaming forms
// The same figures, fed one sample at a time (times ascending) while a run goes on, so that a long
// run needs no full-rate traces. Each gives exactly the number its array form above gives on the
// same samples; `push` allocates nothing (LoadStepTracker grows its candidate list by doubling,
// rarely, see there). `takeRows` takes a run of samples at once, from rows i0 <= i < i1 of a
// row-major array (row i at i·stride: the reference at `at`, y at `at + 1`) taken at the times
// (k0 + i)·Ts; `take` is its one-row case.

/** `stepResponse` fed sample by sample: only samples with tStep <= t < tEnd count. */
export class StepResponseTracker {
  private readonly delta: number;
  private readonly valid: boolean;
  private n = 0;
  private t10: number | null = null;
  private t90: number | null = null;
  private zMax = -Infinity;
  private prevZ = 0;
  private prevT = 0;
  private lastWasOut = false;
  private anyOut = false;
  /** time of the sample after the last one outside the band */
  private tAfterOut = 0;

  constructor(private readonly tStep: number, private readonly tEnd: number, private readonly y0: number, yFinal: number, private readonly band = DEFAULT_SETTLING_BAND) {
    this.delta = yFinal - y0;
    const scale = Math.max(Math.abs(y0), Math.abs(yFinal));
    this.valid = Math.abs(this.delta) > 1e-9 * Math.max(scale, 1e-300) && Number.isFinite(this.delta);
  }

  /** the sample of `push` as `take` reads it */
  private readonly one = new Float64Array(3);

  push(t: number, y: number): void {
    const o = this.one;
    o[0] = t;
    o[2] = y;
    this.take(o);
  }

  /**
   * The sample [t, reference, y] as the simulator hands it (s[1] unused here): the doubles cross the
   * call in the array, never boxed, whether the engine inlines the call or not.
   */
  take(s: Float64Array): void {
    this.takeRows(s, 3, 1, 0, 1, s[0]!, 1);
  }

  /** The samples of rows i0..i1-1 at times (k0 + i)·Ts, ascending (see above); those outside [tStep, tEnd) skipped. */
  takeRows(rows: Float64Array, stride: number, at: number, i0: number, i1: number, k0: number, Ts: number): void {
    for (let i = i0; i < i1; i++) {
      const t = (k0 + i) * Ts;
      if (!(t >= this.tStep)) continue;
      if (!(t < this.tEnd)) return;
      const y = rows[i * stride + at + 1]!;
      const z = (y - this.y0) / this.delta;
      if (this.lastWasOut) this.tAfterOut = t;
      if (this.n > 0) {
        const prevZ = this.prevZ;
        if (this.t10 === null && z >= 0.1) this.t10 = this.prevT + ((0.1 - prevZ) / (z - prevZ)) * (t - this.prevT);
        if (this.t90 === null && z >= 0.9) this.t90 = this.prevT + ((0.9 - prevZ) / (z - prevZ)) * (t - this.prevT);
      } else {
        if (z >= 0.1) this.t10 = t;
        if (z >= 0.9) this.t90 = t;
      }
      if (z > this.zMax) this.zMax = z;
      this.lastWasOut = Math.abs(z - 1) > this.band;
      if (this.lastWasOut) this.anyOut = true;
      this.prevZ = z;
      this.prevT = t;
      this.n++;
    }
  }

  result(): StepMetrics {
    if (!this.valid || this.n < 2) return { riseTime_s: null, overshoot_pct: null, settlingTime_s: null };
    const riseTime_s = this.t10 !== null && this.t90 !== null ? Math.max(0, this.t90 - this.t10) : null;
    const overshoot_pct = Number.isFinite(this.zMax) ? Math.max(0, this.zMax - 1) * 100 : null;
    const settlingTime_s = this.lastWasOut ? null : !this.anyOut ? 0 : this.tAfterOut - this.tStep;
    return { riseTime_s, overshoot_pct, settlingTime_s };
  }
}

/**
 * `loadStepResponse` fed sample by sample (tStep <= t < tEnd). The recovery time depends on the
 * final dip, known only at the end, so the tracker keeps the candidates for "the last sample
 * outside the band": the samples whose |error| exceeds every later one and 5 % of the dip so far
 * (a sample at or under the running threshold can never be outside the final band). They are few
 * except during a long monotone recovery, and never more than the samples of the window.
 */
export class LoadStepTracker {
  private n = 0;
  private dip = 0;
  private top = 0;
  private val: Float64Array;
  /** time of the sample after each candidate (NaN while it is the latest sample) */
  private next: Float64Array;
  private lastPushed = false;
  private e0 = NaN;
  private ref0 = NaN;

  constructor(readonly tStep: number, readonly tEnd: number, private readonly recoveryFraction = DEFAULT_RECOVERY_FRACTION, initialCapacity = 1024, private readonly settledFloor = Infinity) {
    this.val = new Float64Array(Math.max(16, initialCapacity));
    this.next = new Float64Array(this.val.length);
  }

  /** the sample of `push` as `take` reads it */
  private readonly one = new Float64Array(3);

  push(t: number, yRef: number, y: number): void {
    const o = this.one;
    o[0] = t;
    o[1] = yRef;
    o[2] = y;
    this.take(o);
  }

  /** The sample [t, reference, y] (doubles in the array: never boxed). */
  take(s: Float64Array): void {
    this.takeRows(s, 3, 1, 0, 1, s[0]!, 1);
  }

  /** The samples of rows i0..i1-1 at times (k0 + i)·Ts, ascending (see above); those outside [tStep, tEnd) skipped. */
  takeRows(rows: Float64Array, stride: number, at: number, i0: number, i1: number, k0: number, Ts: number): void {
    for (let i = i0; i < i1; i++) {
      const t = (k0 + i) * Ts;
      if (!(t >= this.tStep)) continue;
      if (!(t < this.tEnd)) return;
      const o = i * stride + at;
      const yRef = rows[o]!, y = rows[o + 1]!;
      const e = Math.abs(yRef - y);
      if (this.n === 0) {
        this.e0 = e;
        this.ref0 = yRef;
      }
      if (this.lastPushed) this.next[this.top - 1] = t;
      this.n++;
      this.dip = Math.max(this.dip, e);
      const thr = Math.max(this.recoveryFraction * this.dip, 1e-12);
      let top = this.top;
      while (top > 0 && this.val[top - 1]! <= e) top--;
      this.lastPushed = e > thr;
      if (this.lastPushed) {
        if (top === this.val.length) this.grow();
        this.val[top] = e;
        this.next[top] = NaN;
        top++;
      }
      this.top = top;
    }
  }

  private grow(): void {
    const v = new Float64Array(this.val.length * 2);
    v.set(this.val);
    const x = new Float64Array(this.val.length * 2);
    x.set(this.next);
    this.val = v;
    this.next = x;
  }

  result(): LoadStepMetrics {
    const errorAtStep = this.n > 0 ? this.e0 : null;
    const settled = this.n === 0 || !unsettled(this.e0, this.ref0, this.settledFloor);
    if (this.n < 2 || !settled || !Number.isFinite(this.dip)) return { dip: null, recovery_s: null, errorAtStep, settled };
    const bandAbs = Math.max(this.recoveryFraction * this.dip, 1e-12);
    let k = this.top - 1;
    while (k >= 0 && !(this.val[k]! > bandAbs)) k--;
    let recovery_s: number | null;
    if (k < 0) recovery_s = 0;
    else if (Number.isNaN(this.next[k]!)) recovery_s = null;
    else recovery_s = this.next[k]! - this.tStep;
    return { dip: this.dip, recovery_s, errorAtStep, settled };
  }
}

/**
 * `steadyStateError` over the last samples of a run, kept in a ring of `capacity` samples: exact
 * when the window holds at most `capacity` samples (otherwise the mean is over the newest
 * `capacity`).
 */
export class SteadyStateTracker {
  private readonly t: Float64Array;
  private readonly d: Float64Array;
  private n = 0;
  /** the ring's next slot, n mod capacity (kept apart: no integer division per sample) */
  private j = 0;

  constructor(readonly capacity: number) {
    const c = Math.max(2, Math.ceil(capacity));
    this.t = new Float64Array(c);
    this.d = new Float64Array(c);
  }

  /** The sample [t, reference, y] (doubles in the array: never boxed). */
  take(s: Float64Array): void {
    this.takeRows(s, 3, 1, 0, 1, s[0]!, 1);
  }

  /** The samples of rows i0..i1-1 at times (k0 + i)·Ts (see above): only those the ring keeps are written. */
  takeRows(rows: Float64Array, stride: number, at: number, i0: number, i1: number, k0: number, Ts: number): void {
    const c = this.t.length;
    const from = i1 - i0 > c ? i1 - c : i0;
    let j = from === i0 ? this.j : (this.j + (from - i0)) % c;
    for (let i = from; i < i1; i++) {
      const o = i * stride + at;
      this.t[j] = (k0 + i) * Ts;
      this.d[j] = rows[o]! - rows[o + 1]!;
      j = j + 1 === c ? 0 : j + 1;
    }
    this.j = j;
    this.n += i1 - i0;
  }

  /** the sample of `push` as `take` reads it */
  private readonly one = new Float64Array(3);

  push(t: number, ref: number, y: number): void {
    const o = this.one;
    o[0] = t;
    o[1] = ref;
    o[2] = y;
    this.take(o);
  }

  result(window: number): number | null {
    const n = this.n;
    if (n < 1) return null;
    const c = this.t.length;
    const held = Math.min(n, c);
    const first = n - held; // absolute index of the oldest held sample
    const tEnd = this.t[(n - 1) % c]!;
    let i0 = first;
    while (i0 < n - 1 && this.t[i0 % c]! < tEnd - window) i0++;
    let s = 0;
    for (let i = i0; i < n; i++) s += this.d[i % c]!;
    const e = s / (n - i0);
    return Number.isFinite(e) ? e : null;
  }
}

/** Replace a non-finite figure by null. */
export const finiteOrNull = (x: number | null | undefined): number | null => (x === null || x === undefined || !Number.isFinite(x) ? null : x);
