/**
 * What the switching model keeps of a run for its result (switching-summary.ts), in typed arrays
 * allocated when the run is set up and written in place during it (nothing allocated per period):
 *   - per carrier period, in a ring of the last `cap` periods (recorded from `recordFrom` on): the start time, the electrical angle
 *     at the start (unwrapped: continuous over the run), phase a's current at the start (the
 *     carrier's valley, where a centred pulse pattern's ripple crosses its mean: what a drive's
 *     current sampling sees), phase a's peak-to-peak ripple, each leg's mean voltage error (actual
 *     less commanded, V), the integrals of the DC-link current and of its square (A·s, A²·s) and the
 *     period's length; plus the state at the last period's end;
 *   - the full-resolution traces at every segment boundary (WindowTrace): over a window the
 *     project chooses (kept from its start, up to the capacity; its start must lie before the run's
 *     end, InputError naming control.pwm.window_s.from), or, without one, a ring of the last
 *     boundaries, written over the run's last DEFAULT_WINDOW_SAMPLES / 8 carrier periods only (the
 *     summary takes the last two fundamental periods of it; a run stopped well before its end has
 *     none).
 * Common practice (no source).
 */

import { InputError } from '../base/errors';

/** Largest number of carrier periods the ring keeps (a few whole fundamental periods at any speed the analysis takes). */
export const RECORD_CAPACITY = 4096;
/** Largest number of boundary samples a window keeps (at most 14 boundaries per carrier period). */
export const WINDOW_CAPACITY = 200_000;
/** Boundary samples the default window's ring keeps. */
export const DEFAULT_WINDOW_SAMPLES = 8192;

/** Full-resolution traces at the segment boundaries: time, phase currents, phase a's voltage and the DC-link current over the segment ending there. */
export class WindowTrace {
  /** samples written in all (the ring's valid samples are the last min(n, cap)) */
  n = 0;
  readonly t: Float64Array;
  readonly ia: Float64Array;
  readonly ib: Float64Array;
  readonly ic: Float64Array;
  readonly va: Float64Array;
  readonly idc: Float64Array;
  /**
   * `from`..`to` the times kept (s); `ring` true: the last `cap` samples are kept (the default
   * window), false: the first `cap` samples within [from, to]. (Fields with a value of their kind
   * before the constructor's: a field declared without one starts as undefined, and the engine then
   * keeps its doubles boxed behind a check at every read.)
   */
  readonly from: number = NaN;
  readonly to: number = NaN;
  readonly cap: number = 0;
  readonly ring: boolean = false;
  constructor(from: number, to: number, cap: number, ring: boolean) {
    this.from = from;
    this.to = to;
    this.cap = cap;
    this.ring = ring;
    this.t = new Float64Array(cap);
    this.ia = new Float64Array(cap);
    this.ib = new Float64Array(cap);
    this.ic = new Float64Array(cap);
    this.va = new Float64Array(cap);
    this.idc = new Float64Array(cap);
  }

  /** The index to write the next sample to, or -1 when a window (not a ring) is full. */
  slot(): number {
    const n = this.n;
    if (this.ring) { this.n = n + 1; return n % this.cap; }
    if (n >= this.cap) return -1;
    this.n = n + 1;
    return n;
  }
}

export class SwitchingCapture {
  /** periods recorded in all (the ring's valid records are the last min(count, cap)) */
  count = 0;
  readonly cap: number = 0;
  readonly t: Float64Array;
  readonly theta: Float64Array;
  readonly ia: Float64Array;
  readonly p2p: Float64Array;
  readonly ea: Float64Array;
  readonly eb: Float64Array;
  readonly ec: Float64Array;
  readonly idc: Float64Array;
  readonly idc2: Float64Array;
  readonly span: Float64Array;
  /** the state at the last recorded period's end: time, unwrapped electrical angle, phase a current (double fields start as non-integers) */
  tEnd = NaN;
  thetaEnd = NaN;
  iaEnd = NaN;
  /** the unwrapped electrical angle the run is at (see SwitchingStepper) */
  thetaRun = NaN;
  /** the time from which periods are recorded: the ring's span before the run's end (earlier periods could not reach it), s */
  readonly recordFrom: number = NaN;
  readonly window: WindowTrace;

  /**
   * `periods` the carrier periods the run asks for (the ring holds at most RECORD_CAPACITY);
   * `window` the project's zoom window (s), or null for the default (a ring of the last
   * DEFAULT_WINDOW_SAMPLES boundaries); `fsw` the carrier frequency, Hz, to size a window.
   */
  constructor(periods: number, window: { from_s: number; to_s: number } | null, fsw: number) {
    const duration = periods / fsw;
    const cap = Math.max(2, Math.min(RECORD_CAPACITY, Math.ceil(periods) + 2));
    this.cap = cap;
    this.recordFrom = Math.max(0, duration - (cap - 2) / fsw);
    this.t = new Float64Array(cap);
    this.theta = new Float64Array(cap);
    this.ia = new Float64Array(cap);
    this.p2p = new Float64Array(cap);
    this.ea = new Float64Array(cap);
    this.eb = new Float64Array(cap);
    this.ec = new Float64Array(cap);
    this.idc = new Float64Array(cap);
    this.idc2 = new Float64Array(cap);
    this.span = new Float64Array(cap);
    if (window === null) {
      // the ring written only over the run's last cap/8 carrier periods (about 8 boundaries each): the
      // periods before could not reach the end
      const cap = Math.max(16, Math.min(DEFAULT_WINDOW_SAMPLES, 14 * Math.ceil(periods) + 16));
      this.window = new WindowTrace(Math.max(0, duration - cap / (8 * fsw)), Infinity, cap, true);
    } else {
      // a window that starts after the run's end would keep nothing: refused, naming the key (the
      // project's checks refuse it first; this holds for a duration changed after them)
      if (!(window.from_s < duration)) throw new InputError('control.pwm.window_s.from', `must be < the run's duration (${+duration.toPrecision(12)} s): the zoom window starts after the run ends`);
      // sized for the part of it the run reaches
      const need = 14 * Math.ceil((Math.min(window.to_s, duration) - window.from_s) * fsw) + 16;
      this.window = new WindowTrace(window.from_s, window.to_s, Math.max(16, Math.min(WINDOW_CAPACITY, need)), false);
    }
  }

  /** The ring index for the next period's record. */
  slot(): number {
    const j = this.count % this.cap;
    this.count++;
    return j;
  }

  /** The valid records' ring indices, oldest first, into a new array (for the summary). */
  order(): Int32Array {
    const n = Math.min(this.count, this.cap);
    const out = new Int32Array(n);
    const first = this.count - n;
    for (let i = 0; i < n; i++) out[i] = (first + i) % this.cap;
    return out;
  }
}
