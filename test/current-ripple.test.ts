// Per-period peak-to-peak ripple and its envelope over the fundamental (src/core/simulation/current-ripple.ts).
import { describe, expect, it } from 'vitest';
import { periodRipple, rippleEnvelope } from '../src/core/simulation/current-ripple';

describe('current ripple', () => {
  it('a triangle on a ramp: the ramp through the period ends is removed, the triangle\'s height is left (common practice, no source)', () => {
    // boundaries of a period of 1: ramp 10 A/s, triangle 0 -> +2 -> -1 -> 0
    const t = [0, 0.25, 0.75, 1];
    const tri = [0, 2, -1, 0];
    const i = t.map((tt, j) => 5 + 10 * tt + tri[j]!);
    expect(periodRipple(t, i, 4)).toBeCloseTo(3, 12);
    // interleaved phases: stride 3, offset 1
    const inter = new Float64Array(12);
    i.forEach((v, j) => { inter[3 * j + 1] = v; });
    expect(periodRipple(t, inter, 4, 3, 1)).toBeCloseTo(3, 12);
    expect(periodRipple(t, i, 1)).toBe(0);
  });
  it('the envelope keeps the largest value per angle bin (common practice, no source)', () => {
    const env = rippleEnvelope([0.1, 0.2, 3.3, 0.1 + 2 * Math.PI, -0.1], [1, 2, 5, 4, 7], 5, 4);
    expect([...env]).toEqual([4, 0, 5, 7]);
  });
});
