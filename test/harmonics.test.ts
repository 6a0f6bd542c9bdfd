// DFT harmonics and THD over whole fundamental periods (src/core/mathematics/harmonics.ts).
import { describe, expect, it } from 'vitest';
import { harmonicAmplitude, harmonicCoefficients, thd } from '../src/core/mathematics/harmonics';

describe('harmonics over whole fundamental periods', () => {
  const n = 400, cycles = 2;
  const x = Float64Array.from({ length: n }, (_, j) => {
    const w = (2 * Math.PI * cycles * j) / n;
    return 3 * Math.cos(w) + 4 * Math.sin(w) + 0.5 * Math.cos(5 * w + 0.3) + 0.2 * Math.sin(7 * w) + 1;
  });
  it('recovers each harmonic\'s coefficients and amplitude (orthogonality of the DFT, common practice, no source)', () => {
    const c = new Float64Array(2);
    harmonicCoefficients(x, n, cycles, 1, c);
    expect(c[0]).toBeCloseTo(3, 12);
    expect(c[1]).toBeCloseTo(4, 12);
    expect(harmonicAmplitude(x, n, cycles, 5)).toBeCloseTo(0.5, 12);
    expect(harmonicAmplitude(x, n, cycles, 3)).toBeCloseTo(0, 12);
  });
  it('THD = sqrt(0.5² + 0.2²)/5, the DC left out; a square wave\'s THD to harmonic 49 against its series sqrt(sum 1/h², h odd 3..49) (Fourier series of a square wave, common practice, no source)', () => {
    expect(thd(x, n, cycles, 20)).toBeCloseTo(Math.hypot(0.5, 0.2) / 5, 12);
    const m = 10000;
    const sq = Float64Array.from({ length: m }, (_, j) => (j + 0.5 < m / 2 ? 1 : -1));
    let s = 0;
    for (let h = 3; h <= 49; h += 2) s += 1 / (h * h);
    expect(thd(sq, m, 1, 49)).toBeCloseTo(Math.sqrt(s), 4);
  });
  it('refuses a harmonic at or past the Nyquist bin and a fraction of a period', () => {
    expect(() => thd(x, n, cycles, 100)).toThrow(/maxHarmonic/);
    expect(() => thd(x, n, 1.5, 10)).toThrow(/cycles/);
  });
});
