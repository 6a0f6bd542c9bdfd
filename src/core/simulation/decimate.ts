/**
 * Min/max preserving decimation of traces that share one time axis: each bucket of consecutive
 * samples becomes two output samples (its first and last time), and on every channel they carry
 * the bucket's minimum and maximum in the order they occurred. Peaks and dips survive; their times
 * move by at most one bucket. Traces at most `maxPoints` long are copied unchanged.
 */

export const DEFAULT_MAX_POINTS = 5000;

/**
 * Largest trace length per channel a run may ask for: 16 channels x 200 000 samples of 8 bytes are
 * 26 MB of traces, and the JSON document of them stays well under V8's string limit.
 */
export const MAX_TRACE_POINTS = 200_000;

export interface Decimated {
  t: Float64Array;
  channels: Float64Array[];
}

/**
 * Decimate the first `n` samples of `t` and of every channel to at most `maxPoints` samples
 * (rounded down to an even number, at least 2).
 */
export function decimateMinMax(t: Float64Array, channels: readonly Float64Array[], n: number = t.length, maxPoints: number = DEFAULT_MAX_POINTS): Decimated {
  const cap = Math.max(2, Math.floor(maxPoints / 2) * 2);
  if (n <= cap) {
    return { t: t.slice(0, n), channels: channels.map((c) => c.slice(0, n)) };
  }
  const buckets = cap / 2;
  const size = n / buckets;
  const tOut = new Float64Array(cap);
  const out = channels.map(() => new Float64Array(cap));
  for (let b = 0; b < buckets; b++) {
    const i0 = Math.floor(b * size);
    const i1 = b === buckets - 1 ? n : Math.min(n, Math.floor((b + 1) * size)); // exclusive; the last bucket ends at n whatever the rounding
    tOut[2 * b] = t[i0]!;
    tOut[2 * b + 1] = t[i1 - 1]!;
    for (let c = 0; c < channels.length; c++) {
      const x = channels[c]!;
      let iMin = i0;
      let iMax = i0;
      let vMin = x[i0]!;
      let vMax = vMin;
      for (let i = i0 + 1; i < i1; i++) {
        const v = x[i]!;
        if (v < vMin) { vMin = v; iMin = i; }
        if (v > vMax) { vMax = v; iMax = i; }
      }
      const o = out[c]!;
      if (iMin <= iMax) {
        o[2 * b] = vMin;
        o[2 * b + 1] = vMax;
      } else {
        o[2 * b] = vMax;
        o[2 * b + 1] = vMin;
      }
    }
  }
  return { t: tOut, channels: out };
}

/**
 * The same min/max decimation, fed one sample at a time while a run goes on, so that only a
 * bounded amount is kept: the number of samples `nExpected` is known up front, the buckets are
 * those of `decimateMinMax(t, channels, nExpected, maxPoints)` (identical output when exactly
 * `nExpected` samples are pushed), and only the samples of the bucket being filled are held
 * (nChannels x one bucket). When `nExpected` fits in `maxPoints`, every sample is kept as is.
 * A run that stops early (fewer pushes) returns the buckets filled so far, the last one partial.
 * `push` allocates nothing.
 */
export class StreamingMinMax {
  readonly nChannels: number;
  /** samples pushed so far */
  count = 0;
  private readonly raw: boolean;
  private readonly nExpected: number;
  private readonly buckets: number;
  private readonly size: number;
  /** bucket buffer, channel-major: buf[c * stride + j] (raw mode: the whole trace) */
  private readonly buf: Float64Array;
  private readonly stride: number;
  private readonly tOut: Float64Array;
  private readonly out: Float64Array[];
  private b = 0;
  private bStart = 0;
  private bEnd: number;
  private bFirstT = 0;
  private bLastT = 0;

  constructor(nChannels: number, nExpected: number, maxPoints: number = DEFAULT_MAX_POINTS) {
    const cap = Math.max(2, Math.floor(maxPoints / 2) * 2);
    const n = Math.max(0, Math.floor(nExpected));
    this.nChannels = nChannels;
    this.nExpected = n;
    this.raw = n <= cap;
    if (this.raw) {
      this.buckets = 0;
      this.size = 1;
      this.stride = n;
      this.buf = new Float64Array(nChannels * n);
      this.tOut = new Float64Array(n);
      this.out = [];
      this.bEnd = n;
    } else {
      this.buckets = cap / 2;
      this.size = n / this.buckets;
      this.stride = Math.ceil(this.size) + 1;
      this.buf = new Float64Array(nChannels * this.stride);
      this.tOut = new Float64Array(cap);
      this.out = Array.from({ length: nChannels }, () => new Float64Array(cap));
      this.bEnd = this.buckets === 1 ? n : Math.min(n, Math.floor(this.size));
    }
  }

  /** Append one sample: time t and row[c] for every channel c. Samples beyond nExpected are ignored. */
  push(t: number, row: ArrayLike<number>): void {
    const nc = this.nChannels;
    const buf = this.buf;
    const stride = this.stride;
    if (this.raw) {
      const j = this.count;
      if (j >= stride) return;
      this.tOut[j] = t;
      for (let c = 0; c < nc; c++) buf[c * stride + j] = row[c]!;
      this.count = j + 1;
      return;
    }
    if (this.b >= this.buckets) return;
    const j = this.count - this.bStart;
    if (j === 0) this.bFirstT = t;
    this.bLastT = t;
    for (let c = 0; c < nc; c++) buf[c * stride + j] = row[c]!;
    this.count++;
    if (this.count >= this.bEnd) this.flush();
  }

  private flush(): void {
    const len = this.count - this.bStart;
    if (len <= 0) return;
    const b = this.b;
    const buf = this.buf;
    const stride = this.stride;
    this.tOut[2 * b] = this.bFirstT;
    this.tOut[2 * b + 1] = this.bLastT;
    for (let c = 0; c < this.nChannels; c++) {
      const base = c * stride;
      let iMin = 0;
      let iMax = 0;
      let vMin = buf[base]!;
      let vMax = vMin;
      for (let i = 1; i < len; i++) {
        const v = buf[base + i]!;
        if (v < vMin) { vMin = v; iMin = i; }
        if (v > vMax) { vMax = v; iMax = i; }
      }
      const o = this.out[c]!;
      if (iMin <= iMax) { o[2 * b] = vMin; o[2 * b + 1] = vMax; } else { o[2 * b] = vMax; o[2 * b + 1] = vMin; }
    }
    this.b = b + 1;
    this.bStart = this.count;
    this.bEnd = this.b >= this.buckets ? this.count : this.b === this.buckets - 1 ? this.nExpected : Math.floor((this.b + 1) * this.size);
  }

  /** The decimated traces of the samples pushed so far (call once, at the end). */
  finish(): Decimated {
    if (this.raw) {
      const n = this.count;
      const channels: Float64Array[] = [];
      for (let c = 0; c < this.nChannels; c++) channels.push(this.buf.slice(c * this.stride, c * this.stride + n));
      return { t: this.tOut.slice(0, n), channels };
    }
    if (this.b < this.buckets) this.flush();
    const m = 2 * this.b;
    return { t: this.tOut.slice(0, m), channels: this.out.map((o) => o.slice(0, m)) };
  }
}
