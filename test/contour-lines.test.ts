// Iso-lines by marching squares (Lorensen and Cline 1987, "Marching cubes", SIGGRAPH 87, in two
// dimensions), checked against contours known in closed form.
import { describe, expect, it } from 'vitest';
import { contourLines } from '../src/core/mathematics/contour-lines';

/** A grid xs x ys over [lo, hi]² with n points per axis and f sampled at z[i * n + j]. */
function sample(f: (x: number, y: number) => number, lo: number, hi: number, n: number) {
  const xs = Array.from({ length: n }, (_, k) => lo + ((hi - lo) * k) / (n - 1));
  const z = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) z[i * n + j] = f(xs[i]!, xs[j]!);
  return { xs, ys: xs, z };
}

/** Shoelace area of a closed polyline (signed). */
const area = (x: number[], y: number[]): number => {
  let s = 0;
  for (let k = 0; k + 1 < x.length; k++) s += x[k]! * y[k + 1]! - x[k + 1]! * y[k]!;
  return s / 2;
};

describe('contour lines (marching squares)', () => {
  it('finds a plane\'s iso-line exactly: linear interpolation is exact for a linear function (common practice)', () => {
    const g = sample((x, y) => 2 * x + 3 * y, -1, 1, 21);
    const lines = contourLines(g.xs, g.ys, g.z, 1);
    expect(lines).toHaveLength(1);
    const l = lines[0]!;
    expect(l.closed).toBe(false);
    expect(l.x.length).toBeGreaterThan(20);
    for (let k = 0; k < l.x.length; k++) expect(2 * l.x[k]! + 3 * l.y[k]!).toBeCloseTo(1, 12);
    // both ends on the grid's border
    for (const k of [0, l.x.length - 1]) {
      const onBorder = [l.x[k]!, l.y[k]!].some((v) => Math.abs(Math.abs(v) - 1) < 1e-12);
      expect(onBorder).toBe(true);
    }
  });

  it('finds the circle x² + y² = r² of a radial function as one closed loop (analytic contour, common practice)', () => {
    const n = 41, h = 2 / (n - 1);
    const g = sample((x, y) => x * x + y * y, -1, 1, n);
    for (const r of [0.3, 0.5, 0.8]) {
      const lines = contourLines(g.xs, g.ys, g.z, r * r);
      expect(lines).toHaveLength(1);
      const l = lines[0]!;
      expect(l.closed).toBe(true);
      expect(l.x[0]).toBe(l.x[l.x.length - 1]);
      expect(l.y[0]).toBe(l.y[l.y.length - 1]);
      // along an edge x² is interpolated linearly: the error in f is at most h²/4, in radius h²/(8 r)
      for (let k = 0; k < l.x.length; k++) expect(Math.abs(Math.hypot(l.x[k]!, l.y[k]!) - r)).toBeLessThanOrEqual((h * h) / (8 * r) + 1e-12);
      // the enclosed area is pi r² to within 1 % (chords inside the circle make it a little less)
      expect(Math.abs(Math.abs(area(l.x, l.y)) / (Math.PI * r * r) - 1)).toBeLessThan(0.01);
    }
  });

  it('gives nested loops for nested levels and nothing for a level outside the values', () => {
    const g = sample((x, y) => Math.hypot(x, y), -1, 1, 31);
    const inner = contourLines(g.xs, g.ys, g.z, 0.4);
    const outer = contourLines(g.xs, g.ys, g.z, 0.7);
    expect(inner).toHaveLength(1);
    expect(outer).toHaveLength(1);
    expect(Math.abs(area(outer[0]!.x, outer[0]!.y))).toBeGreaterThan(Math.abs(area(inner[0]!.x, inner[0]!.y)));
    expect(contourLines(g.xs, g.ys, g.z, 2)).toEqual([]);
    expect(contourLines(g.xs, g.ys, g.z, -0.1)).toEqual([]);
  });

  it('stops a line at cells with a missing value: the circle cut by NaN for x > 0.3 is one open arc (common practice)', () => {
    const n = 41;
    const g = sample((x, y) => (x > 0.3 ? Number.NaN : x * x + y * y), -1, 1, n);
    const lines = contourLines(g.xs, g.ys, g.z, 0.25);
    expect(lines).toHaveLength(1);
    const l = lines[0]!;
    expect(l.closed).toBe(false);
    for (let k = 0; k < l.x.length; k++) {
      expect(l.x[k]!).toBeLessThanOrEqual(0.3);
      expect(Math.abs(Math.hypot(l.x[k]!, l.y[k]!) - 0.5)).toBeLessThan(2e-3);
    }
    // the arc runs from the cut near (0.25, -0.43) round the left to the cut near (0.25, +0.43)
    const ys = [l.y[0]!, l.y[l.y.length - 1]!].sort((a, b) => a - b);
    expect(ys[0]!).toBeCloseTo(-Math.sqrt(0.25 - 0.25 * 0.25), 1);
    expect(ys[1]!).toBeCloseTo(Math.sqrt(0.25 - 0.25 * 0.25), 1);
  });

  it('contours a cell with one missing corner on the triangle of the other three: the line reaches the diagonal (common practice)', () => {
    // f = x - 0.013, no value where x + y > 0.52; h = 0.05. The line x = 0.013 runs up the column of
    // cells 0 <= x <= 0.05; the cell 0.45 <= y <= 0.5 lacks its corner (0.05, 0.5) and is contoured on
    // the triangle (0, 0.45), (0.05, 0.45), (0, 0.5): f is linear there, so the line ends exactly on
    // the diagonal x + y = 0.5, at y = 0.487 (a square cell alone would stop it at y = 0.45)
    const g = sample((x, y) => (x + y > 0.52 ? Number.NaN : x - 0.013), -1, 1, 41);
    const lines = contourLines(g.xs, g.ys, g.z, 0);
    expect(lines).toHaveLength(1);
    const l = lines[0]!;
    for (let k = 0; k < l.x.length; k++) expect(l.x[k]!).toBeCloseTo(0.013, 12);
    expect(Math.min(...l.y)).toBeCloseTo(-1, 12);
    expect(Math.max(...l.y)).toBeCloseTo(0.487, 12);
  });

  it('follows both branches of the hyperbola x y = c and keeps them apart (analytic contour, common practice)', () => {
    const g = sample((x, y) => x * y, -1, 1, 41);
    const lines = contourLines(g.xs, g.ys, g.z, 0.1);
    expect(lines).toHaveLength(2);
    for (const l of lines) {
      expect(l.closed).toBe(false);
      const sign = Math.sign(l.x[0]!);
      for (let k = 0; k < l.x.length; k++) {
        expect(Math.sign(l.x[k]!)).toBe(sign);
        expect(Math.abs(l.x[k]! * l.y[k]! - 0.1)).toBeLessThan(2e-3);
      }
    }
  });

  it('resolves a saddle cell by its centre value (common practice)', () => {
    // one cell: a (0,0) = 1, b (1,0) = 0, c (1,1) = 1, d (0,1) = 0; centre value 0.5
    const xs = [0, 1], ys = [0, 1];
    const z = [1, 0, 0, 1]; // z[i * 2 + j]: (0,0)=1, (0,1)=0, (1,0)=0, (1,1)=1
    // level 0.4: the centre (0.5) is above, with a and c: b and d are cut off
    const joined = contourLines(xs, ys, z, 0.4).map((l) => l.x.map((x, k) => [x, l.y[k]!]));
    expect(joined).toHaveLength(2);
    const around = (pts: number[][], cx: number, cy: number) => pts.every(([x, y]) => Math.hypot(x! - cx, y! - cy) < 0.61);
    expect(joined.some((pts) => around(pts, 1, 0))).toBe(true);
    expect(joined.some((pts) => around(pts, 0, 1))).toBe(true);
    // on the edges at t = (0.4 - 1) / (0 - 1) = 0.6 from a and from c
    expect(joined.flat().map(([x, y]) => `${x!.toFixed(3)},${y!.toFixed(3)}`).sort()).toEqual(['0.000,0.600', '0.400,1.000', '0.600,0.000', '1.000,0.400']);
    // level 0.6: the centre is below, with b and d: a and c are cut off
    const apart = contourLines(xs, ys, z, 0.6).map((l) => l.x.map((x, k) => [x, l.y[k]!]));
    expect(apart).toHaveLength(2);
    expect(apart.some((pts) => around(pts, 0, 0))).toBe(true);
    expect(apart.some((pts) => around(pts, 1, 1))).toBe(true);
  });

  it('refuses a grid it cannot read, naming the field', () => {
    expect(() => contourLines([0], [0, 1], [0, 0], 0)).toThrow(/xs, ys/);
    expect(() => contourLines([0, 1], [0, 1], [0, 0, 0], 0)).toThrow(/z must hold .* 4 values/);
    expect(() => contourLines([0, 1], [1, 0], [0, 0, 0, 0], 0)).toThrow(/ys must be finite and strictly increasing/);
    expect(() => contourLines([0, 1], [0, 1], [0, 0, 0, 0], Number.NaN)).toThrow(/level/);
  });
});
