// The current table's progress hook (src/core/control/current-table.ts onRow): one call per speed row
// of each corner, in order up to corners x rows, and the table's numbers the same as without it
// (common practice (no source): progress as items done / items).
import { describe, expect, it } from 'vitest';
import { buildCurrentTable, type CurrentTableSpec } from '../src/core/control/current-table';
import { LinearDqModel } from '../src/core/machine/linear-dq';

// an invented salient machine
const ipm = (Rs: number) => new LinearDqModel({ polePairs: 4, Rs, Ld: 0.0002, Lq: 0.0005, psiM: 0.06 });
const G = 0.95 / Math.sqrt(3);
const spec: CurrentTableSpec = { bus_V: 300, limits: { Vmax: G * 300, Imax: 400 }, xMax: 12, speedPoints: 6, torquePoints: 4 };

describe('current table progress', () => {
  it('reports rows done out of 2 corners x 6 rows, and the numbers do not move', () => {
    const corners = [{ name: 'hot', model: ipm(0.05) }, { name: 'cold', model: ipm(0.03) }];
    const calls: Array<[number, number]> = [];
    const a = buildCurrentTable(corners, spec, { onRow: (d, t) => calls.push([d, t]) });
    expect(calls).toEqual(Array.from({ length: 12 }, (_, k) => [k + 1, 12]));
    const b = buildCurrentTable(corners, spec);
    expect(a).toEqual(b);
    expect(a.corners[1]!.iq.some((v) => v !== 0)).toBe(true);
  });
});
