/**
 * Min/max preserving decimation of traces that share one time axis: each bucket of consecutive
 * samples becomes two output samples (its first and last time), and on every channel they carry
 * the bucket's minimum and maximum in the order they occurred. Peaks and dips survive; their times
 * move by at most one bucket. Traces at most `maxPoints` long are copied unchanged.
 */

export const DEFAULT_MAX_POINTS = 5000;

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
    const i1 = Math.min(n, Math.floor((b + 1) * size)); // exclusive
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
