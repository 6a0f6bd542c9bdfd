import { describe, expect, it } from 'vitest';
import { buildCurrentTable } from '../src/core/control/current-table';
import { currentTableBound } from '../src/core/control/current-table-bound';
import { currentTableNotes } from '../src/core/reports/current-table-notes';
import { LinearDqModel } from '../src/core/machine/linear-dq';

const m = new LinearDqModel({ polePairs: 4, Rs: 0.02, Ld: 0.0002, Lq: 0.0005, psiM: 0.06 });
const t = buildCurrentTable([{ name: 'hot', model: m }], { bus_V: 300, limits: { Vmax: 165, Imax: 400 }, xMax: 12, speedPoints: 4, torquePoints: 3 });
const bound = currentTableBound(t, [m]);

describe('current table notes', () => {
  it('say how to read it: normalise by the measured bus, clamp, bilinear; the bound, its method, Rs and the nodes beyond the envelope', () => {
    const text = currentTableNotes(t, { project: 'line\nbreak', date: '2026-01-02', tool: 'Torquewise 0.1.0', Vdc: 302, deviceDrop: 1, polePairs: 4, Rs: [0.02], bound });
    expect(text.split('\n')[0]).toBe('# Current-reference table: line break');
    for (const s of ['Vdc_measured - 2 TWCT_DEVICE_DROP_V', 'Clamp the demand', 'bilinear', 'twct_id_hot[r][c]', 'Rs |i| |1 - V\'/V_bus|', "holds that row's maximum-torque point", `${bound.refine} steps per cell`, 'same i_d and the opposite i_q']) expect(text).toContain(s);
    // one page: under 60 lines (common practice (no source))
    expect(text.split('\n').length).toBeLessThan(60);
  });
});
