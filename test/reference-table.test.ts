import { describe, expect, it } from 'vitest';
import { buildReferenceTable, lookupCurrents, torqueLimitsAt } from '../src/core/control/reference-table';
import { solveOperatingPoint } from '../src/core/steady-state/operating-point';
import { maxTorquePoint } from '../src/core/steady-state/envelope';
import type { DqMachine } from '../src/core/machine/dq-machine';
import type { DriveLimits } from '../src/core/drive/inverter-spec';

const ipm: DqMachine = { polePairs: 4, Rs: 0.02, Ld: 0.3e-3, Lq: 0.75e-3, psiM: 0.07 };
const lim: DriveLimits = { Vmax: 190, Imax: 450 };
const torque = (m: DqMachine, id: number, iq: number): number => 1.5 * m.polePairs * (m.psiM * iq + (m.Ld - m.Lq) * id * iq);
const wMax = 1400; // rad/s, deep in field weakening

describe('torque -> current reference table', () => {
  const tab = buildReferenceTable(ipm, lim, { speedMax_rad_s: wMax });
  const out = new Float64Array(2);

  it('row limits agree with the envelope\'s maximum torque', () => {
    // cross-check against envelope.ts (independent closed-form/root-finding implementation)
    for (const r of [0, 10, 24, tab.nS - 1]) {
      const w = (wMax * r) / (tab.nS - 1);
      const mot = maxTorquePoint(ipm, lim, w, 'motoring').torque;
      expect(tab.tMot[r]!).toBeCloseTo(mot, 3);
      const gen = maxTorquePoint(ipm, lim, w, 'generating').torque;
      expect(tab.tGen[r]!).toBeCloseTo(Math.abs(gen), 3);
    }
  });

  it('interpolated currents give the asked torque within 1 % of the limit and stay within Imax', () => {
    let worst = 0;
    for (let k = 0; k <= 60; k++) {
      const w = (wMax * k) / 60.3;
      torqueLimitsAt(tab, w, out);
      const [tHi, tLo] = [out[0]!, out[1]!];
      for (let j = -10; j <= 10; j++) {
        const T = j >= 0 ? (tHi * j) / 10 : (tLo * -j) / 10;
        const asked = lookupCurrents(tab, w, T, out);
        expect(asked).toBeCloseTo(T, 9);
        const err = Math.abs(torque(ipm, out[0]!, out[1]!) - T) / Math.max(tHi, 1e-9);
        worst = Math.max(worst, err);
        expect(Math.hypot(out[0]!, out[1]!)).toBeLessThanOrEqual(lim.Imax * 1.005);
      }
    }
    expect(worst).toBeLessThan(0.01);
  });

  it('at a grid node it returns the solver\'s least-current point', () => {
    const w = (wMax * 12) / (tab.nS - 1);
    const T = 0.5 * tab.tMot[12]!;
    lookupCurrents(tab, w, T, out);
    const op = solveOperatingPoint(ipm, lim, w, T);
    expect(out[0]).toBeCloseTo(op.id, 6);
    expect(out[1]).toBeCloseTo(op.iq, 6);
  });

  it('negative speed mirrors: same id, opposite iq for the opposite torque', () => {
    const a = new Float64Array(2);
    const b = new Float64Array(2);
    lookupCurrents(tab, 700, 60, a);
    lookupCurrents(tab, -700, -60, b);
    expect(b[0]).toBeCloseTo(a[0]!, 12);
    expect(b[1]).toBeCloseTo(-a[1]!, 12);
    // and the exact solver agrees with the symmetry (dq model, Rs included)
    const op = solveOperatingPoint(ipm, lim, -700, -60);
    const oq = solveOperatingPoint(ipm, lim, 700, 60);
    expect(op.id).toBeCloseTo(oq.id, 6);
    expect(op.iq).toBeCloseTo(-oq.iq, 6);
  });

  it('clamps torque beyond the limit and returns the clamped torque', () => {
    torqueLimitsAt(tab, 300, out);
    const tHi = out[0]!;
    expect(lookupCurrents(tab, 300, 10 * tHi, out)).toBeCloseTo(tHi, 9);
  });
});

describe('the reference table of a model that is not linear', () => {
  it('a model that hides its constant terms gives the linear table within the limit bisection (30 halvings)', async () => {
    const { numericOnly } = await import('./model-paths');
    const nodes = { speedMax_rad_s: wMax, speedNodes: 9, torqueNodes: 7 };
    const a = buildReferenceTable(ipm, lim, nodes);
    const b = buildReferenceTable(numericOnly(ipm), lim, nodes);
    // common practice (no source): both bisect the same torque limit from different upper bounds
    // (the linear bound 1.5 p (psiM + |Ld - Lq| Imax) Imax, or 1.05 x the MTPA torque at Imax), so
    // they agree to the bisection's resolution, 2^-30 of the bound, about 3e-7 N·m here
    const bound = 1.5 * ipm.polePairs * (ipm.psiM + Math.abs(ipm.Ld - ipm.Lq) * lim.Imax) * lim.Imax;
    for (let r = 0; r < 9; r++) {
      expect(Math.abs(a.tMot[r]! - b.tMot[r]!)).toBeLessThan(2 * bound * 2 ** -30);
      expect(Math.abs(a.tGen[r]! - b.tGen[r]!)).toBeLessThan(2 * bound * 2 ** -30);
    }
    // the currents of the inner nodes solve the same torque: equal to 1e-8 of Imax; the end nodes
    // sit at the torque limit, where the torque is at its maximum along the limit boundary and so
    // flat in the current's direction: the 2^-30 difference of the limits moves their current by
    // up to a few 1e-5 of Imax (common practice (no source): sensitivity at a maximum)
    for (let k = 0; k < a.id.length; k++) {
      const end = k % 7 === 0 || k % 7 === 6;
      const tol = (end ? 1e-4 : 1e-8) * lim.Imax;
      expect(Math.abs(a.id[k]! - b.id[k]!)).toBeLessThan(tol);
      expect(Math.abs(a.iq[k]! - b.iq[k]!)).toBeLessThan(tol);
    }
  });
});

describe('the reference table built directly (constant-parameter machine)', () => {
  it('equals the table of the solver at every cell (bisected limits), for the demos and invented machines', async () => {
    const { demoCases } = await import('./model-paths');
    // the same solver behind a wrapper: the table then takes the solver per cell and bisects the limits
    const viaSolver = (m: Parameters<typeof solveOperatingPoint>[0], l: DriveLimits, w: number, T: number) => solveOperatingPoint(m, l, w, T);
    const cases = [
      ...demoCases(),
      { name: 'IPM', m: ipm, lim },
      { name: 'IPM, large Rs', m: { polePairs: 3, Rs: 0.8, Ld: 4e-3, Lq: 9e-3, psiM: 0.15 }, lim: { Vmax: 300, Imax: 20 } },
    ];
    for (const { m, lim: l } of cases) {
      const nodes = { speedMax_rad_s: 1.5 * l.Vmax / (m.polePairs * m.psiM), speedNodes: 17, torqueNodes: 9 };
      const a = buildReferenceTable(m, l, nodes);
      const b = buildReferenceTable(m, l, nodes, viaSolver);
      // common practice (no source): the limits are the envelope's largest torque (accurate to 1e-9)
      // against a bisection of 30 halvings of the bound 1.5 p (psiM + |Ld - Lq| Imax) Imax: equal to
      // that resolution (as above)
      const bound = 1.5 * m.polePairs * (m.psiM + Math.abs(m.Ld - m.Lq) * l.Imax) * l.Imax;
      for (let r = 0; r < nodes.speedNodes; r++) {
        expect(Math.abs(a.tMot[r]! - b.tMot[r]!)).toBeLessThan(2 * bound * 2 ** -30);
        expect(Math.abs(a.tGen[r]! - b.tGen[r]!)).toBeLessThan(2 * bound * 2 ** -30);
      }
      // the inner cells to 2e-8 of Imax; the end cells sit at the torque limit, where the current
      // moves with the square root of a torque difference (up to 1e-4 of Imax, as above)
      const nU = nodes.torqueNodes;
      for (let k = 0; k < a.id.length; k++) {
        const end = k % nU === 0 || k % nU === nU - 1;
        const tol = (end ? 1e-4 : 2e-8) * l.Imax;
        expect(Math.abs(a.id[k]! - b.id[k]!)).toBeLessThan(tol);
        expect(Math.abs(a.iq[k]! - b.iq[k]!)).toBeLessThan(tol);
      }
    }
  });
});
