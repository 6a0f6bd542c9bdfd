import { describe, expect, it } from 'vitest';
import { lookupCurrentTable, type CurrentTableView } from '../src/core/control/current-table-lookup';

// a 3 x 5 table by hand: x 0..2, torque -10..10; id = 100 r + j, iq = 10 r - j (bilinear reproduces an affine function exactly: common practice (no source))
const nS = 3, nT = 5;
const id = Float32Array.from({ length: nS * nT }, (_, k) => 100 * Math.floor(k / nT) + (k % nT));
const iq = Float32Array.from({ length: nS * nT }, (_, k) => 10 * Math.floor(k / nT) - (k % nT));
const view: CurrentTableView = { nS, nT, xMax: 2, torquePeak: 10, tMot: [10, 8, 4], tGen: [10, 9, 6], id, iq };
const out = new Float64Array(2);

describe('current table lookup (as the firmware reads it)', () => {
  it('nodes give their values; between them the affine function exactly', () => {
    expect(lookupCurrentTable(view, 0, -5, out)).toBe(-5);
    expect([out[0], out[1]]).toEqual([1, -1]);
    lookupCurrentTable(view, 0.5, 2.5, out); // row 0.5, column 2.5
    expect(out[0]).toBeCloseTo(50 + 2.5, 12);
    expect(out[1]).toBeCloseTo(5 - 2.5, 12);
  });

  it('clamps the demand to the row maximum interpolated in x, and x to the axis', () => {
    // at x = 1.5 the motoring limit is 6: T = 9 is read as 6 (column 3.2)
    expect(lookupCurrentTable(view, 1.5, 9, out)).toBeCloseTo(6, 12);
    expect(out[0]).toBeCloseTo(150 + 3.2, 12);
    expect(lookupCurrentTable(view, 1.5, -100, out)).toBeCloseTo(-7.5, 12);
    // beyond the axis: the last row
    expect(lookupCurrentTable(view, 7, 100, out)).toBe(4);
    expect(out[0]).toBeCloseTo(200 + 2.8, 12);
  });

  it('a negative speed reads the mirrored demand and negates iq and the torque', () => {
    const a = new Float64Array(2);
    const Ta = lookupCurrentTable(view, 0.8, -3, a);
    const Tb = lookupCurrentTable(view, -0.8, 3, out);
    expect(Tb).toBe(-Ta);
    expect(out[0]).toBe(a[0]);
    expect(out[1]).toBe(-a[1]!);
  });
});
