import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { loadProjectText } from '../src/core/project/project';
import { efficiencyMap, mapAxis, newEfficiencyMap } from '../src/core/steady-state/efficiency-map';
import { solveLossPoint } from '../src/core/steady-state/loss-point';
import { canHoldTorque } from '../src/core/steady-state/operating-point';
import type { LossConditions, LossSpec } from '../src/core/steady-state/point-losses';

const demo = (name: string) => loadProjectText(readFileSync(join(__dirname, '..', 'resources', `${name}.json`), 'utf8'));
// invented loss data
const LOSSES: LossSpec = {
  iron: { kh: 100, beta: 2, ke: 0.5 }, windage: { kw: 5e-8 },
  inverter: { Vce0: 0.8, rce: 0.002, Vf0: 0.9, rd: 0.0015, EonEoff_J: 0.022, Err_J: 0.006, Vref_V: 300, Iref_A: 200, fsw_Hz: 10000 },
};

describe('efficiency map', () => {
  for (const [name, n] of [['demo-ipm-traction', 24], ['demo-ipm-saturated', 10]] as const) {
    it(`${name}: energy balance at every point inside the envelope, motoring and generating`, () => {
      const p = demo(name);
      const c: LossConditions = { Vdc: p.inverter.Vdc, friction: { B: p.mechanics.viscousFriction, Tc: p.mechanics.coulombFriction }, losses: LOSSES };
      const S = mapAxis(-2000 * Math.PI / 30, 13000 * Math.PI / 30, n), T = mapAxis(-240, 240, n);
      const r = efficiencyMap(p.models.hot, p.peak, c, S, T);
      let inside = 0, motoring = 0, generating = 0;
      for (let i = 0; i < n; i++) {
        for (let j = 0; j < n; j++) {
          const k = i * n + j;
          if (r.feasible[k] === 0) { expect(r.system[k]).toBeNaN(); continue; }
          inside++;
          const ps = T[j]! * S[i]!;
          if (ps > 0) motoring++;
          if (ps < 0) generating++;
          const loss = r.copper[k]! + r.iron[k]! + r.mechanical[k]! + r.inverterLoss[k]!;
          const scale = Math.max(Math.abs(r.dcPower[k]!), Math.abs(ps), loss);
          // electrical input = shaft output + all losses (conservation of energy, common practice (no source))
          expect(Math.abs(r.dcPower[k]! - (ps + loss)) / scale, `${S[i]} rad/s ${T[j]} N·m`).toBeLessThan(1e-9);
          expect(r.system[k]).toBeGreaterThanOrEqual(0);
          expect(r.system[k]).toBeLessThan(1);
          // the electromagnetic torque can be held: inside the envelope (common practice (no source))
          expect(canHoldTorque(p.models.hot, p.peak, S[i]!, r.torqueEm[k]! * (1 - 1e-9))).toBe(true);
        }
      }
      expect(motoring).toBeGreaterThan(n);
      expect(generating).toBeGreaterThan(n);
      expect(inside).toBeLessThan(n * n);
    });
  }

  it('every map point is the operating point with losses solved on its own', () => {
    const p = demo('demo-ipm-traction');
    const c: LossConditions = { Vdc: p.inverter.Vdc, friction: { B: 0.002, Tc: 0.3 }, losses: LOSSES };
    const S = mapAxis(0, 12000 * Math.PI / 30, 7), T = mapAxis(-200, 200, 9);
    const r = efficiencyMap(p.models.hot, p.peak, c, S, T);
    for (let i = 0; i < 7; i++) {
      for (let j = 0; j < 9; j++) {
        const q = solveLossPoint(p.models.hot, p.peak, c, S[i]!, T[j]!);
        const k = i * 9 + j;
        // same fixed point from a different start: equal to its tolerance (common practice (no source))
        expect(r.feasible[k]).toBe(q.feasible ? 1 : 0);
        if (q.feasible) expect(Math.abs(r.system[k]! - q.efficiency.system)).toBeLessThan(1e-9);
      }
    }
  });

  it('min-loss control: every point is solveLossPoint\'s loss-minimising point, energy balanced, least-current start kept', () => {
    const p = demo('demo-ipm-traction');
    const c: LossConditions = { Vdc: p.inverter.Vdc, friction: { B: 0.002, Tc: 0.3 }, losses: LOSSES };
    const S = mapAxis(-2000 * Math.PI / 30, 12000 * Math.PI / 30, 8), T = mapAxis(-200, 200, 9);
    const lc = newEfficiencyMap(S, T);
    const r = efficiencyMap(p.models.hot, p.peak, c, S, T, { control: 'min-loss', leastCurrent: lc });
    const plain = efficiencyMap(p.models.hot, p.peak, c, S, T, {});
    let inside = 0;
    for (let i = 0; i < 8; i++) {
      for (let j = 0; j < 9; j++) {
        const k = i * 9 + j;
        const q = solveLossPoint(p.models.hot, p.peak, c, S[i]!, T[j]!, { minLoss: true });
        const a = solveLossPoint(p.models.hot, p.peak, c, S[i]!, T[j]!);
        // the same solver from the same start: identical numbers (common practice (no source))
        expect(r.feasible[k]).toBe(q.feasible ? 1 : 0);
        expect(lc.feasible[k]).toBe(plain.feasible[k]);
        if (!q.feasible) { expect(r.system[k]).toBeNaN(); continue; }
        inside++;
        expect(r.system[k]).toBe(q.efficiency.system);
        expect(r.copper[k]).toBe(q.losses.copper_W);
        expect(r.iron[k]).toBe(q.losses.iron_W);
        expect(r.inverterLoss[k]).toBe(q.losses.inverter_W);
        expect(r.torqueEm[k]).toBe(q.torqueEm_Nm);
        expect(lc.copper[k]).toBe(a.losses.copper_W);
        const loss = r.copper[k]! + r.iron[k]! + r.mechanical[k]! + r.inverterLoss[k]!;
        const ps = T[j]! * S[i]!;
        // electrical input = shaft output + all losses (conservation of energy, common practice (no source))
        expect(Math.abs(r.dcPower[k]! - (ps + loss)) / Math.max(Math.abs(r.dcPower[k]!), Math.abs(ps), loss)).toBeLessThan(1e-9);
      }
    }
    expect(inside).toBeGreaterThan(20);
    // the default is least current, value for value (common practice (no source))
    const dflt = efficiencyMap(p.models.hot, p.peak, c, S, T);
    expect(Array.from(dflt.system)).toEqual(Array.from(plain.system));
    expect(() => efficiencyMap(p.models.hot, p.peak, c, S, T, { leastCurrent: lc })).toThrow(/min-loss control only/);
  });
});
