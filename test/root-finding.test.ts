import { describe, expect, it } from 'vitest';
import { GOLD, bisectPredicate, goldenSectionMax, parabolaZero, polishMax } from '../src/core/mathematics/root-finding';

describe('root finding', () => {
  it('golden section finds the maximum of sin on [0, 3] at pi/2 (Kiefer (1953), Sequential minimax search for a maximum)', () => {
    const out = new Float64Array(2);
    goldenSectionMax(Math.sin, 0, 3, 60, out);
    expect(out[0]).toBeCloseTo(Math.PI / 2, 7); // golden section alone: about sqrt(eps) in x
    expect(out[1]).toBeCloseTo(1, 14);
    expect(GOLD).toBeCloseTo(0.6180339887498949, 15);
  });

  it('the Newton polish takes the maximum to round-off (Abramowitz and Stegun (1964), 25.3.6)', () => {
    const f = (x: number) => Math.cos(x - 0.7) + 0.3 * Math.cos(2 * (x - 0.7)); // maximum at 0.7 (by hand)
    expect(polishMax(f, 0.7 + 3e-8, 0, 1.5, 1e-3)).toBeCloseTo(0.7, 12);
    // a convex point is left as it is
    expect(polishMax((x) => x * x, 0.2, -1, 1, 1e-3)).toBe(0.2);
  });

  it('bisection of a monotone predicate brackets the switch (common practice (no source))', () => {
    const out = new Float64Array(2);
    bisectPredicate((x) => x * x >= 2, 0, 2, 1e-14, out);
    expect(out[1]! * out[1]!).toBeGreaterThanOrEqual(2);
    expect(out[0]! * out[0]!).toBeLessThan(2);
    expect(out[1]).toBeCloseTo(Math.SQRT2, 13);
  });

  it('parabola zero through three samples, nearest to 0 (Press et al. (2007), Numerical Recipes, 5.6)', () => {
    // p(x) = x² - 0.25 through (-1, 0.75), (0, -0.25), (1, 0.75): zeros ±0.5
    expect(Math.abs(parabolaZero(0.75, -0.25, 0.75))).toBeCloseTo(0.5, 15);
    // p(x) = 2x + 1 (A = 0): zero at -0.5
    expect(parabolaZero(-1, 1, 3)).toBeCloseTo(-0.5, 15);
    // p(x) = x² + 2x + 2 through (-1, 1), (0, 2), (1, 5): no real zero
    expect(parabolaZero(1, 2, 5)).toBeNaN();
  });
});
