/**
 * Harmonics of a uniformly sampled periodic signal by the discrete Fourier transform over whole
 * fundamental periods: with `cycles` fundamental periods in the n samples, harmonic h is the bin
 * h·cycles, x ≈ sum_h a_h cos(h w t) + b_h sin(h w t) (common practice, no source).
 */

/** The cosine and sine coefficients (peak) of harmonic h of x[0..n) holding `cycles` whole periods, into out[0], out[1]. */
export function harmonicCoefficients(x: ArrayLike<number>, n: number, cycles: number, h: number, out: Float64Array): void {
  const k = h * cycles;
  let a = 0, b = 0;
  const w = (2 * Math.PI * k) / n;
  for (let j = 0; j < n; j++) {
    a += x[j]! * Math.cos(w * j);
    b += x[j]! * Math.sin(w * j);
  }
  out[0] = (2 * a) / n;
  out[1] = (2 * b) / n;
}

/** Peak amplitude of harmonic h of x[0..n) holding `cycles` whole periods. */
export function harmonicAmplitude(x: ArrayLike<number>, n: number, cycles: number, h: number): number {
  const c = new Float64Array(2);
  harmonicCoefficients(x, n, cycles, h, c);
  return Math.hypot(c[0]!, c[1]!);
}

/**
 * Total harmonic distortion of x[0..n) holding `cycles` whole fundamental periods, harmonics 2 to
 * maxHarmonic against the fundamental: sqrt(sum A_h²) / A_1. maxHarmonic must stay below the
 * Nyquist bin, n / (2 cycles).
 */
export function thd(x: ArrayLike<number>, n: number, cycles: number, maxHarmonic: number): number {
  if (!(Number.isInteger(cycles) && cycles >= 1)) throw new RangeError('cycles must be a whole number >= 1');
  if (!(maxHarmonic >= 2 && maxHarmonic * cycles < n / 2)) throw new RangeError(`maxHarmonic must be in 2..${Math.floor((n / 2 - 1) / cycles)}`);
  const A1 = harmonicAmplitude(x, n, cycles, 1);
  let s = 0;
  for (let h = 2; h <= maxHarmonic; h++) {
    const A = harmonicAmplitude(x, n, cycles, h);
    s += A * A;
  }
  return Math.sqrt(s) / A1;
}
