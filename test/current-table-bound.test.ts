import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { loadProjectText } from '../src/core/project/project';
import { buildCurrentTable, type CurrentTableSpec } from '../src/core/control/current-table';
import { currentTableBound } from '../src/core/control/current-table-bound';
import { LinearDqModel } from '../src/core/machine/linear-dq';
import { baseSpeed } from '../src/core/steady-state/envelope';

const demo = (name: string) => loadProjectText(readFileSync(join(__dirname, '..', 'resources', `${name}.json`), 'utf8'));

describe('current table error bound', () => {
  it('an SPM below its base speed: bilinear reads are exact (iq linear in T, id = 0; Morimoto et al. (1990), IEEE Trans. Ind. Appl. 26(5)): the bound is float rounding only', () => {
    const m = new LinearDqModel({ polePairs: 5, Rs: 0.01, Ld: 5e-5, Lq: 5e-5, psiM: 0.01 });
    const lim = { Vmax: 26, Imax: 200 };
    const xBase = (5 * baseSpeed(m, lim)) / 48;
    const t = buildCurrentTable([{ name: 'c', model: m }], { bus_V: 48, limits: lim, xMax: 0.9 * xBase, speedPoints: 5, torquePoints: 5 });
    const b = currentTableBound(t, [m]);
    expect(b.torque_Nm).toBeLessThan(1e-5 * t.torquePeak);
    expect(b.current_A).toBeLessThan(1e-5 * lim.Imax);
    expect(b.voltage_V).toBe(0);
    expect(b.samples).toBe((4 * 4 + 1) * (8 * 4 + 1));
  });

  it('halving the step cuts the torque bound (inside, the bilinear error falls with the square of the step, in the cells at the envelope edge with the step; common practice (no source))', () => {
    const p = demo('demo-ipm-traction');
    const sp = (n: number): CurrentTableSpec => ({ bus_V: 348, limits: p.peak, xMax: 14, speedPoints: n, torquePoints: n });
    const coarse = currentTableBound(buildCurrentTable([{ name: 'hot', model: p.models.hot }], sp(9)), [p.models.hot]);
    const fine = currentTableBound(buildCurrentTable([{ name: 'hot', model: p.models.hot }], sp(17)), [p.models.hot]);
    expect(fine.torque_Nm).toBeLessThan(0.85 * coarse.torque_Nm);
    expect(fine.relative).toBeLessThan(coarse.relative);
    // the least-current nodes lie within the current circle, a convex set: a convex mix never leaves it
    expect(coarse.current_A).toBeLessThan(1e-4);
    expect(coarse.worstTorque.corner).toBe('hot');
  });

  it('refuses a refinement that is not a whole number >= 1', () => {
    const m = new LinearDqModel({ polePairs: 5, Rs: 0.01, Ld: 5e-5, Lq: 5e-5, psiM: 0.01 });
    const t = buildCurrentTable([{ name: 'c', model: m }], { bus_V: 48, limits: { Vmax: 26, Imax: 200 }, xMax: 10, speedPoints: 2, torquePoints: 2 });
    expect(() => currentTableBound(t, [m], 0)).toThrow(RangeError);
  });
});
