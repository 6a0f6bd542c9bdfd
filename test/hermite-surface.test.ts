import { describe, expect, it } from 'vitest';
import { HermiteSurfacePair, findCell, hermiteNodes } from '../src/core/mathematics/hermite-surface';

// Fritsch and Carlson (1980), Monotone piecewise cubic interpolation, SIAM J. Numer. Anal. 17(2);
// Fritsch and Butland (1984), SIAM J. Sci. Stat. Comput. 5(2): monotone node slopes; bicubic Hermite patches.
const x = Float64Array.from([-3, -2.2, -1, -0.5, 0, 0.7, 2, 3.5]);
const y = Float64Array.from([-2, -1.1, 0, 0.4, 1.5, 3]);
function surface(f: (a: number, b: number) => number, g: (a: number, b: number) => number): HermiteSurfacePair {
  const F = new Float64Array(x.length * y.length), G = new Float64Array(x.length * y.length);
  for (let i = 0; i < x.length; i++) for (let j = 0; j < y.length; j++) { F[i * y.length + j] = f(x[i]!, y[j]!); G[i * y.length + j] = g(x[i]!, y[j]!); }
  return new HermiteSurfacePair(x, y, hermiteNodes(x, y, F), hermiteNodes(x, y, G));
}
const o = new Float64Array(2), d = new Float64Array(4);

describe('bicubic Hermite surface with monotone slopes', () => {
  it('reproduces bilinear data exactly, inside and beyond the grid (common practice (no source))', () => {
    const s = surface((a, b) => 1 + 2 * a - 3 * b + 0.5 * a * b, (a, b) => -a + 4 * b);
    for (const [a, b] of [[0.3, 0.2], [-2.9, 2.9], [3.4, -1.9], [4, 3.3], [-3.5, -2.5]] as const) {
      s.evaluate(a, b, o, d);
      expect(o[0]).toBeCloseTo(1 + 2 * a - 3 * b + 0.5 * a * b, 12);
      expect(o[1]).toBeCloseTo(-a + 4 * b, 12);
      expect(d[0]).toBeCloseTo(2 + 0.5 * b, 12);
      expect(d[1]).toBeCloseTo(-3 + 0.5 * a, 12);
      expect(d[2]).toBeCloseTo(-1, 12);
      expect(d[3]).toBeCloseTo(4, 12);
    }
  });

  it('gives the exact derivatives of the interpolant (against central differences), C1 across cell edges', () => {
    const s = surface((a, b) => Math.tanh(a) * Math.exp(-0.2 * b * b), (a, b) => Math.sin(a + b) + b * b * b / 9);
    const h = 1e-6;
    for (const [a, b] of [[0.3, 0.2], [-1.7, 1.9], [2.5, -1.5], [3.9, 0.1], [-3.2, 3.3]] as const) {
      s.evaluate(a, b, o, d);
      const D = [...d];
      s.evaluate(a + h, b, o, null); const px = [o[0]!, o[1]!];
      s.evaluate(a - h, b, o, null); const mx = [o[0]!, o[1]!];
      s.evaluate(a, b + h, o, null); const py = [o[0]!, o[1]!];
      s.evaluate(a, b - h, o, null); const my = [o[0]!, o[1]!];
      expect(D[0]).toBeCloseTo((px[0]! - mx[0]!) / (2 * h), 6);
      expect(D[1]).toBeCloseTo((py[0]! - my[0]!) / (2 * h), 6);
      expect(D[2]).toBeCloseTo((px[1]! - mx[1]!) / (2 * h), 6);
      expect(D[3]).toBeCloseTo((py[1]! - my[1]!) / (2 * h), 6);
    }
    // across the edge x = 0.7 and y = 0.4: value and both derivatives continuous
    for (const [a, b, da, db] of [[0.7, 1, 1e-10, 0], [-0.3, 0.4, 0, 1e-10]] as const) {
      s.evaluate(a - da, b - db, o, d); const l = [o[0]!, ...d];
      s.evaluate(a + da, b + db, o, d); const r = [o[0]!, ...d];
      for (let k = 0; k < 5; k++) expect(Math.abs(l[k]! - r[k]!)).toBeLessThan(1e-8);
    }
  });

  it('does not overshoot monotone data along a grid line (a steep step stays within its values)', () => {
    const s = surface((a) => (a < 0 ? 0 : 1), (a, b) => b);
    let prev = -Infinity;
    for (let a = -3; a <= 3.5; a += 0.01) {
      s.evaluate(a, 0.4, o, null);
      expect(o[0]).toBeGreaterThanOrEqual(-1e-15);
      expect(o[0]).toBeLessThanOrEqual(1 + 1e-15);
      expect(o[0]!).toBeGreaterThanOrEqual(prev - 1e-15);
      prev = o[0]!;
    }
  });

  it('converges on smooth monotone data at third order in the grid step (the monotone slopes drop to second order only at extrema)', () => {
    const err = (n: number): number => {
      const gx = Float64Array.from({ length: n }, (_, k) => -1 + (2 * k) / (n - 1));
      const F = new Float64Array(n * n);
      const f = (a: number, b: number): number => Math.exp(0.5 * a) + Math.sinh(b) + 0.2 * a * b;
      for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) F[i * n + j] = f(gx[i]!, gx[j]!);
      const s = new HermiteSurfacePair(gx, gx, hermiteNodes(gx, gx, F), hermiteNodes(gx, gx, F));
      let e = 0;
      for (let a = -0.97; a < 1; a += 0.0731) for (let b = -0.95; b < 1; b += 0.0677) { s.evaluate(a, b, o, null); e = Math.max(e, Math.abs(o[0]! - f(a, b))); }
      return e;
    };
    const e1 = err(11), e2 = err(21);
    expect(e1 / e2).toBeGreaterThan(6); // 2^3 = 8 for third order
  });

  it('finds the cell by bisection or from the last one', () => {
    expect(findCell(x, -1, 0)).toBe(2);
    expect(findCell(x, 0.1, 4)).toBe(4);
    expect(findCell(x, -9, 3)).toBe(0);
    expect(findCell(x, 9, 3)).toBe(6);
  });
});
