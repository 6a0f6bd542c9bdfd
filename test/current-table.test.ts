import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { loadProjectText } from '../src/core/project/project';
import { buildCurrentTable, rowSpeed, type CurrentTableSpec } from '../src/core/control/current-table';
import { LinearDqModel } from '../src/core/machine/linear-dq';
import { maxTorquePoint } from '../src/core/steady-state/envelope';
import { solveOperatingPoint } from '../src/core/steady-state/operating-point';
import { newPointLossScratch, pointLosses, type LossConditions } from '../src/core/steady-state/point-losses';
import { lossConditionsFromProject } from '../src/core/project/loss-conditions-from-project';
import { refusal } from './helpers';

const demo = (name: string) => loadProjectText(readFileSync(join(__dirname, '..', 'resources', `${name}.json`), 'utf8'));
// an invented salient machine
const ipm = (Rs: number) => new LinearDqModel({ polePairs: 4, Rs, Ld: 0.0002, Lq: 0.0005, psiM: 0.06 });
const G = 0.95 / Math.sqrt(3);
const spec = (bus: number, over: Partial<CurrentTableSpec> = {}): CurrentTableSpec => ({ bus_V: bus, limits: { Vmax: G * bus, Imax: 400 }, xMax: 12, speedPoints: 9, torquePoints: 7, ...over });

describe('current-reference table', () => {
  it('with Rs = 0 the table against x = w_e / V_bus is the same at any bus (|psi(i)| <= g / x; steady-state dq voltage, Morimoto et al. (1990), IEEE Trans. Ind. Appl. 26(5))', () => {
    const a = buildCurrentTable([{ name: 'c', model: ipm(0) }], spec(300));
    const b = buildCurrentTable([{ name: 'c', model: ipm(0) }], spec(150));
    expect(Array.from(b.torque)).toEqual(Array.from(a.torque));
    for (let k = 0; k < a.nS * a.nT; k++) {
      expect(Math.abs(a.corners[0]!.id[k]! - b.corners[0]!.id[k]!)).toBeLessThan(1e-4);
      expect(Math.abs(a.corners[0]!.iq[k]! - b.corners[0]!.iq[k]!)).toBeLessThan(1e-4);
    }
    // the rows do reach field weakening: the largest torque falls along x
    expect(a.corners[0]!.tMot[a.nS - 1]!).toBeLessThan(0.5 * a.corners[0]!.tMot[0]!);
  });

  it('with Rs the voltage a table point asks at another bus V2 exceeds the limit by at most Rs |i| |1 - V2/V1| (triangle inequality, from the steady-state equations)', () => {
    const Rs = 0.05, V1 = 300, V2 = 200;
    const m = ipm(Rs);
    const t = buildCurrentTable([{ name: 'c', model: m }], spec(V1));
    const v = new Float64Array(2);
    let worstExcess = 0, largest = 0;
    for (let r = 0; r < t.nS; r++) {
      for (let j = 0; j < t.nT; j++) {
        const id = t.corners[0]!.id[r * t.nT + j]!, iq = t.corners[0]!.iq[r * t.nT + j]!;
        m.steadyVoltage(id, iq, t.x[r]! * V2, v);
        const excess = Math.hypot(v[0]!, v[1]!) - G * V2;
        const stated = Rs * Math.hypot(id, iq) * Math.abs(1 - V2 / V1);
        expect(excess).toBeLessThanOrEqual(stated + 1e-4);
        worstExcess = Math.max(worstExcess, excess);
        largest = Math.max(largest, stated);
      }
    }
    // and Rs does move it: some point asks more than the lower bus gives
    expect(worstExcess).toBeGreaterThan(0.1);
    expect(worstExcess).toBeLessThanOrEqual(largest);
  });

  it('rows: the largest torque is maxTorquePoint\'s; inside nodes are the least-current solver\'s point, beyond ones the row\'s extreme point', () => {
    const p = demo('demo-ipm-traction');
    const bus = 348;
    const t = buildCurrentTable([{ name: 'hot', model: p.models.hot }], { bus_V: bus, limits: p.peak, xMax: 14, speedPoints: 8, torquePoints: 6 });
    const c = t.corners[0]!;
    let inside = 0, beyond = 0;
    for (let r = 0; r < t.nS; r++) {
      const w = rowSpeed(t.x[r]!, bus, 4);
      const mot = maxTorquePoint(p.models.hot, p.peak, w, 'motoring');
      const gen = maxTorquePoint(p.models.hot, p.peak, w, 'generating');
      expect(c.tMot[r]).toBe(Math.fround(mot.torque));
      expect(c.tGen[r]).toBe(Math.fround(-gen.torque));
      for (let j = 0; j < t.nT; j++) {
        const T = t.torque[j]!;
        const k = r * t.nT + j;
        const lim = T >= 0 ? mot : gen;
        if (Math.abs(T) >= Math.abs(lim.torque)) {
          expect([c.id[k], c.iq[k]]).toEqual([Math.fround(lim.id), Math.fround(lim.iq)]);
          beyond++;
        } else {
          const op = solveOperatingPoint(p.models.hot, p.peak, w, T);
          expect([c.id[k], c.iq[k]]).toEqual([Math.fround(op.id), Math.fround(op.iq)]);
          expect(Math.abs(p.models.hot.torque(c.id[k]!, c.iq[k]!) - T)).toBeLessThan(1e-5 * t.torquePeak);
          inside++;
        }
      }
    }
    expect(inside).toBeGreaterThan(30);
    expect(beyond).toBeGreaterThan(10);
    expect(c.solvedNodes).toBe(inside - t.nS); // the zero-torque column is solved apart
    // the torque axis: 2N - 1 nodes, zero on one, ends at the largest torque of any row
    expect(t.nT).toBe(11);
    expect(t.torque[5]).toBe(0);
    expect(t.torquePeak).toBe(Math.max(...c.tMot, ...c.tGen));
  });

  it('a negative speed needs no rows of its own: (-w, -T) has the same id and the opposite iq, Rs included (dq symmetry, from the steady-state equations)', () => {
    const p = demo('demo-ipm-traction');
    for (const [w, T] of [[300, 150], [900, -60], [1200, 40], [50, -300]] as const) {
      const a = solveOperatingPoint(p.models.hot, p.peak, w, T);
      const b = solveOperatingPoint(p.models.hot, p.peak, -w, -T);
      expect(b.feasible).toBe(a.feasible);
      expect(Math.abs(b.id - a.id)).toBeLessThan(1e-9 * p.peak.Imax);
      expect(Math.abs(b.iq + a.iq)).toBeLessThan(1e-9 * p.peak.Imax);
    }
  });

  it('loss-minimising: no losses gives the least-current table; with losses each node has no more loss at the same torque', () => {
    const m = ipm(0.02);
    const none: LossConditions = { Vdc: 300, friction: { B: 0, Tc: 0 }, losses: {} };
    const a = buildCurrentTable([{ name: 'c', model: m }], spec(300));
    const b = buildCurrentTable([{ name: 'c', model: m }], spec(300, { minLoss: none }));
    expect(b.control).toBe('min-loss');
    // the least copper loss is the least current: the same nodes, up to the search's resolution
    let worst = 0;
    for (let k = 0; k < a.nS * a.nT; k++) worst = Math.max(worst, Math.abs(b.corners[0]!.id[k]! - a.corners[0]!.id[k]!), Math.abs(b.corners[0]!.iq[k]! - a.corners[0]!.iq[k]!));
    expect(worst).toBeLessThan(1e-3);
    const p = demo('demo-ipm-traction');
    const c = lossConditionsFromProject(p);
    const sp: CurrentTableSpec = { bus_V: 348, limits: p.peak, xMax: 14, speedPoints: 5, torquePoints: 5 };
    const lc = buildCurrentTable([{ name: 'hot', model: p.models.hot }], sp);
    const ml = buildCurrentTable([{ name: 'hot', model: p.models.hot }], { ...sp, minLoss: c });
    const sc = newPointLossScratch();
    let less = 0;
    for (let r = 0; r < lc.nS; r++) {
      const w = rowSpeed(lc.x[r]!, 348, 4);
      for (let j = 0; j < lc.nT; j++) {
        const k = r * lc.nT + j;
        const L0 = pointLosses(p.models.hot, c, w, lc.corners[0]!.id[k]!, lc.corners[0]!.iq[k]!, sc);
        const L1 = pointLosses(p.models.hot, c, w, ml.corners[0]!.id[k]!, ml.corners[0]!.iq[k]!, sc);
        // float32 storage: 1e-6 relative
        expect(L1).toBeLessThanOrEqual(L0 * (1 + 1e-5) + 1e-3);
        const T0 = p.models.hot.torque(lc.corners[0]!.id[k]!, lc.corners[0]!.iq[k]!);
        expect(Math.abs(p.models.hot.torque(ml.corners[0]!.id[k]!, ml.corners[0]!.iq[k]!) - T0)).toBeLessThan(1e-4 * lc.torquePeak);
        if (L1 < L0 * (1 - 1e-3)) less++;
      }
    }
    // iron loss falls with more field weakening (Morimoto et al. (1994), Loss minimization control of permanent magnet synchronous motor drives, IEEE Trans. Ind. Electron. 41(5))
    expect(less).toBeGreaterThan(0);
  });

  it('refuses a bad grid by name', () => {
    const m = [{ name: 'c', model: ipm(0) }];
    expect(refusal(() => buildCurrentTable(m, spec(300, { speedPoints: 1 }))).field).toBe('--speed-points');
    expect(refusal(() => buildCurrentTable(m, spec(300, { torquePoints: 2.5 }))).field).toBe('--torque-points');
    expect(refusal(() => buildCurrentTable(m, spec(300, { xMax: 0 }))).field).toBe('current table speed range');
    expect(refusal(() => buildCurrentTable(m, spec(0))).field).toBe('current table bus');
  });
});
