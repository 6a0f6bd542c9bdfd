import { describe, expect, it } from 'vitest';
import { wrapToPi } from '../src/core/control/angle-estimator';

// common practice (no source): an angle difference wrapped to [-pi, pi] by x - 2 pi round(x / 2 pi)
describe('wrapToPi', () => {
  it('maps onto [-pi, pi] keeping the angle modulo 2 pi', () => {
    for (const x of [0, 1, -1, 3.2, -3.2, 7, -7, 100.5, -1e4 - 0.25]) {
      const w = wrapToPi(x);
      expect(Math.abs(w)).toBeLessThanOrEqual(Math.PI);
      expect(Math.sin(w)).toBeCloseTo(Math.sin(x), 9);
      expect(Math.cos(w)).toBeCloseTo(Math.cos(x), 9);
    }
    expect(wrapToPi(3 * Math.PI / 2)).toBeCloseTo(-Math.PI / 2, 14);
    expect(wrapToPi(0.25)).toBe(0.25);
  });
});
