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
  it('the shortcuts without the division give the formula\'s value bit for bit, at their edges too', () => {
    const TWO_PI = 2 * Math.PI;
    const formula = (x: number): number => x - TWO_PI * Math.round(x / TWO_PI);
    const xs: number[] = [];
    for (const e of [3.14, 3.15, 9.42, 9.43, 15.7, Math.PI, 3 * Math.PI, 5 * Math.PI]) for (const s of [1, -1]) for (const d of [-1e-12, 0, 1e-12, -1e-3, 1e-3]) xs.push(s * (e + d));
    // a dense sweep over the shortcuts' ranges and beyond (a fixed pseudo-random sequence)
    let u = 12345;
    for (let i = 0; i < 20000; i++) { u = (u * 1103515245 + 12345) % 2147483648; xs.push((u / 2147483648 - 0.5) * 40); }
    for (const x of xs) expect(Object.is(wrapToPi(x), formula(x))).toBe(true);
  });
});
