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
 * (one bucket of rows). When `nExpected` fits in `maxPoints`, every sample is kept as is.
 * A run that stops early (fewer pushes) returns the buckets filled so far, the last one partial.
 *
 * The samples are held row-major (a sample's channels side by side), so a sample is written in one
 * sequential run, by `push` or directly: `slot(t)` gives the offset of the sample's row in `buf`
 * (or -1 when it is beyond nExpected), the caller writes buf[offset + c], and `commit()` ends it.
 * The minimum and maximum of a bucket are found once, when it is full. Nothing is allocated per sample.
 */
export class StreamingMinMax {
  readonly nChannels: number;
  /** samples pushed so far */
  count = 0;
  /** the rows being held, row-major: buf[j * nChannels + c] (raw mode: the whole trace) */
  readonly buf: Float64Array;
  private readonly raw: boolean;
  private readonly nExpected: number;
  private readonly buckets: number;
  private readonly size: number;
  private readonly tOut: Float64Array;
  /** decimated output, channel-major: out[c * cap + i] */
  private readonly out: Float64Array;
  private readonly cap: number;
  private b = 0;
  private bStart = 0;
  private bEnd: number;
  private bFirstT = 0;
  private bLastT = 0;
  /** some bucket's extreme was not finite (or its range overflowed) */
  private nonFinite = false;

  constructor(nChannels: number, nExpected: number, maxPoints: number = DEFAULT_MAX_POINTS) {
    const cap = Math.max(2, Math.floor(maxPoints / 2) * 2);
    const n = Math.max(0, Math.floor(nExpected));
    this.nChannels = nChannels;
    this.nExpected = n;
    this.raw = n <= cap;
    if (this.raw) {
      this.buckets = 0;
      this.size = 1;
      this.cap = n;
      this.buf = new Float64Array(nChannels * n);
      this.tOut = new Float64Array(n);
      this.out = new Float64Array(0);
      this.bEnd = n;
    } else {
      this.buckets = cap / 2;
      this.size = n / this.buckets;
      this.cap = cap;
      this.buf = new Float64Array(nChannels * (Math.ceil(this.size) + 1));
      this.tOut = new Float64Array(cap);
      this.out = new Float64Array(nChannels * cap);
      this.bEnd = this.buckets === 1 ? n : Math.min(n, Math.floor(this.size));
    }
  }

  /** the time of the sample `slotAt` opens (a caller that is not inlined hands it over unboxed) */
  readonly time = new Float64Array(1);

  /** Offset in `buf` of the row of a sample at time t, or -1 when the sample is beyond nExpected (ignored). Follow with `commit()`. */
  slot(t: number): number {
    this.time[0] = t;
    return this.slotAt();
  }

  /** `slot(time[0])`. */
  slotAt(): number {
    const t = this.time[0]!;
    if (this.raw) {
      const j = this.count;
      if (j >= this.cap) return -1;
      this.tOut[j] = t;
      return j * this.nChannels;
    }
    if (this.b >= this.buckets) return -1;
    const j = this.count - this.bStart;
    if (j === 0) this.bFirstT = t;
    this.bLastT = t;
    return j * this.nChannels;
  }

  /** Every decimated value is finite (false: some may not be; always false while every sample is kept). */
  get allFinite(): boolean {
    return !this.raw && !this.nonFinite;
  }

  /** The number of the first sample whose row `buf` holds (its row at offset 0). */
  get first(): number {
    return this.raw ? 0 : this.bStart;
  }

  /** The next `commit` ends a bucket: the rows held are reduced and then overwritten. */
  get ending(): boolean {
    return !this.raw && this.count + 1 >= this.bEnd;
  }

  /** End the sample whose row was written at `slot`'s offset. */
  commit(): void {
    this.count++;
    if (!this.raw && this.count >= this.bEnd) this.flush();
  }

  /** Append one sample: time t and row[c] for every channel c. Samples beyond nExpected are ignored. */
  push(t: number, row: ArrayLike<number>): void {
    const o = this.slot(t);
    if (o < 0) return;
    const buf = this.buf;
    for (let c = 0; c < this.nChannels; c++) buf[o + c] = row[c]!;
    this.commit();
  }

  private flush(): void {
    const len = this.count - this.bStart;
    if (len <= 0) return;
    const b = this.b;
    const buf = this.buf;
    const nc = this.nChannels;
    const cap = this.cap;
    const out = this.out;
    this.tOut[2 * b] = this.bFirstT;
    this.tOut[2 * b + 1] = this.bLastT;
    // two channels at a time (independent work side by side); a value below the minimum is not
    // above the maximum (minimum <= maximum, and NaN passes neither test): one test for most values
    const at0 = 2 * b;
    let c = 0;
    for (; c + 1 < nc; c += 2) {
      let iMinA = 0, iMaxA = 0, vMinA = buf[c]!, vMaxA = vMinA;
      let iMinB = 0, iMaxB = 0, vMinB = buf[c + 1]!, vMaxB = vMinB;
      for (let i = 1, o = nc + c; i < len; i++, o += nc) {
        const va = buf[o]!, vb = buf[o + 1]!;
        if (va < vMinA) { vMinA = va; iMinA = i; } else if (va > vMaxA) { vMaxA = va; iMaxA = i; }
        if (vb < vMinB) { vMinB = vb; iMinB = i; } else if (vb > vMaxB) { vMaxB = vb; iMaxB = i; }
      }
      // a non-finite extreme (or a range beyond the largest double) noted: see allFinite
      if (!(vMaxA - vMinA < Infinity) || !(vMaxB - vMinB < Infinity)) this.nonFinite = true;
      const at = c * cap + at0;
      if (iMinA <= iMaxA) { out[at] = vMinA; out[at + 1] = vMaxA; } else { out[at] = vMaxA; out[at + 1] = vMinA; }
      const bt = at + cap;
      if (iMinB <= iMaxB) { out[bt] = vMinB; out[bt + 1] = vMaxB; } else { out[bt] = vMaxB; out[bt + 1] = vMinB; }
    }
    if (c < nc) {
      let iMin = 0, iMax = 0, vMin = buf[c]!, vMax = vMin;
      for (let i = 1, o = nc + c; i < len; i++, o += nc) {
        const v = buf[o]!;
        if (v < vMin) { vMin = v; iMin = i; } else if (v > vMax) { vMax = v; iMax = i; }
      }
      if (!(vMax - vMin < Infinity)) this.nonFinite = true;
      const at = c * cap + at0;
      if (iMin <= iMax) { out[at] = vMin; out[at + 1] = vMax; } else { out[at] = vMax; out[at + 1] = vMin; }
    }
    this.b = b + 1;
    this.bStart = this.count;
    this.bEnd = this.b >= this.buckets ? this.count : this.b === this.buckets - 1 ? this.nExpected : Math.floor((this.b + 1) * this.size);
  }

  /**
   * The decimated traces of the samples pushed so far (call once, at the end). Once decimated, the
   * time axis and the channels are views on the decimator's own output buffers (one for the
   * channels), each channel its own range: nothing is copied.
   */
  finish(): Decimated {
    const nc = this.nChannels;
    const channels: Float64Array[] = [];
    if (this.raw) {
      const n = this.count;
      const buf = this.buf;
      for (let c = 0; c < nc; c++) {
        const a = new Float64Array(n);
        for (let j = 0, o = c; j < n; j++, o += nc) a[j] = buf[o]!;
        channels.push(a);
      }
      return { t: this.tOut.slice(0, n), channels };
    }
    if (this.b < this.buckets) this.flush();
    const m = 2 * this.b;
    // the channels are views on the one output buffer (nothing copied): each its own range of it
    for (let c = 0; c < nc; c++) channels.push(this.out.subarray(c * this.cap, c * this.cap + m));
    return { t: this.tOut.subarray(0, m), channels };
  }
}
