import { describe, expect, it } from 'vitest';
import { bilinear, cellOf, gridPosition, lerp } from '../src/core/mathematics/interpolation';

// Common practice (no source): linear and bilinear interpolation reproduce any function affine in
// each coordinate exactly; values below worked by hand.
describe('interpolation on a uniform grid', () => {
  it('finds the cell and the fraction, clamped to the grid', () => {
    // 5 nodes over [0, 100]: nodes at 0, 25, 50, 75, 100; x = 60 sits 0.4 of the way from node 2 to 3
    const s = gridPosition(60, 100, 5);
    expect(s).toBeCloseTo(2.4, 14);
    expect(cellOf(s, 5)).toBe(2);
    // beyond the grid: clamped to the last node, which the last cell holds at fraction 1
    const e = gridPosition(130, 100, 5);
    expect(e).toBe(4);
    expect(cellOf(e, 5)).toBe(3);
    expect(e - cellOf(e, 5)).toBe(1);
    expect(cellOf(gridPosition(0, 100, 5), 5)).toBe(0);
  });

  it('lerp is exact at the ends and linear between', () => {
    expect(lerp(2, 6, 0)).toBe(2);
    expect(lerp(2, 6, 1)).toBe(6);
    expect(lerp(2, 6, 0.25)).toBe(3);
  });

  it('bilinear reproduces z = 3 + 2 r + 5 c + r c on a 3 x 4 table', () => {
    const nR = 3, nC = 4;
    const v = new Float64Array(nR * nC);
    const z = (r: number, c: number): number => 3 + 2 * r + 5 * c + r * c;
    for (let r = 0; r < nR; r++) for (let c = 0; c < nC; c++) v[r * nC + c] = z(r, c);
    // at (r, c) = (1.25, 2.5): 3 + 2.5 + 12.5 + 3.125 = 21.125
    expect(bilinear(v, nC, 1, 0.25, 2, 0.5)).toBeCloseTo(21.125, 12);
    expect(bilinear(v, nC, 0, 0, 0, 0)).toBe(3);
    expect(bilinear(v, nC, 1, 1, 2, 1)).toBe(z(2, 3));
  });
});
