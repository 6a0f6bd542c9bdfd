import { describe, expect, it } from 'vitest';
import { cosSinNear } from '../src/core/mathematics/rotation';

// Reference: Math.cos / Math.sin (IEEE 754 double, the JavaScript runtime); the series bound is
// the Taylor remainder d^13/13! and d^14/14! at |d| = 0.5 (common practice, no source).
describe('cos and sin near a known angle', () => {
  const out = new Float64Array(2);
  it('agrees with Math.cos / Math.sin within 2e-14 for offsets up to 0.5 rad', () => {
    for (const th0 of [0, 0.3, 1.7, -2.9, 6.1]) {
      for (const d of [0, 1e-6, -0.01, 0.2, -0.37, 0.499]) {
        cosSinNear(Math.cos(th0), Math.sin(th0), d, th0 + d, out);
        expect(Math.abs(out[0]! - Math.cos(th0 + d))).toBeLessThan(2e-14);
        expect(Math.abs(out[1]! - Math.sin(th0 + d))).toBeLessThan(2e-14);
      }
    }
  });
  it('rotates (1, 0) by pi/6 to (sqrt(3)/2, 1/2)', () => {
    cosSinNear(1, 0, Math.PI / 6, Math.PI / 6, out);
    expect(out[0]).toBeCloseTo(Math.sqrt(3) / 2, 14);
    expect(out[1]).toBeCloseTo(0.5, 14);
  });
  it('falls back to Math.cos / Math.sin of the angle itself at |d| >= 0.5', () => {
    cosSinNear(NaN, NaN, 2, 2.5, out);
    expect(out[0]).toBe(Math.cos(2.5));
    expect(out[1]).toBe(Math.sin(2.5));
  });
});
