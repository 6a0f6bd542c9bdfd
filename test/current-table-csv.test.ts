import { describe, expect, it } from 'vitest';
import { buildCurrentTable } from '../src/core/control/current-table';
import { currentTableBound } from '../src/core/control/current-table-bound';
import { currentTableCsv, CURRENT_TABLE_CSV_HEADER } from '../src/core/reports/current-table-csv';
import { parseCsv } from '../src/core/reports/csv';
import { LinearDqModel } from '../src/core/machine/linear-dq';

const m = new LinearDqModel({ polePairs: 4, Rs: 0.02, Ld: 0.0002, Lq: 0.0005, psiM: 0.06 });
const t = buildCurrentTable([{ name: 'hot', model: m }, { name: 'cold', model: m }], { bus_V: 300, limits: { Vmax: 165, Imax: 400 }, xMax: 12, speedPoints: 4, torquePoints: 3 });
const about = { project: '=evil,"name"', date: '2026-01-02', tool: 'Torquewise 0.1.0', Vdc: 302, deviceDrop: 1, polePairs: 4, Rs: [0.02, 0.02], bound: currentTableBound(t, [m, m]) };

describe('current table CSV', () => {
  it('reads back (RFC 4180, Shafranovich (2005)): comments, the header, one row per corner, speed and torque node, float32 values', () => {
    const rows = parseCsv(currentTableCsv(t, about));
    expect(rows.slice(0, 3).every((r) => r.length === 1 && r[0]!.startsWith('# '))).toBe(true);
    expect(rows[0]![0]).toContain('=evil,"name"');
    expect(rows[3]).toEqual([...CURRENT_TABLE_CSV_HEADER]);
    const data = rows.slice(4);
    expect(data).toHaveLength(2 * t.nS * t.nT);
    const k = t.nT + 2; // hot, row 1, column 2
    const r = data[k]!;
    expect(r[0]).toBe('hot');
    expect(Math.fround(Number(r[1]))).toBe(t.x[1]);
    // speed at the table's bus: x V_bus / p, in rpm
    expect(Number(r[2])).toBeCloseTo((t.x[1]! * 300 / 4) * 30 / Math.PI, 5);
    expect(Math.fround(Number(r[4]))).toBe(t.corners[0]!.id[k]);
    expect(Math.fround(Number(r[5]))).toBe(t.corners[0]!.iq[k]);
    expect(data[t.nS * t.nT]![0]).toBe('cold');
    // the zero-torque column is inside, the axis ends (the peak torque) beyond at least one row
    expect(data.filter((d) => Number(d[3]) === 0).every((d) => d[8] === '1')).toBe(true);
    expect(data.some((d) => d[8] === '0')).toBe(true);
  });
});
