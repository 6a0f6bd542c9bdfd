// The gain of loss-minimising control over least-current control as a map
// (src/core/steady-state/min-loss-gain-map.ts), on the traction and saturated demos (invented loss data).
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { loadProjectText } from '../src/core/project/project';
import { lossConditionsFromProject } from '../src/core/project/loss-conditions-from-project';
import { efficiencyMap, mapAxis, newEfficiencyMap } from '../src/core/steady-state/efficiency-map';
import { solveLossPoint } from '../src/core/steady-state/loss-point';
import { minLossGain, minLossGainMap } from '../src/core/steady-state/min-loss-gain-map';
import type { LossConditions } from '../src/core/steady-state/point-losses';

const demo = (name: string) => loadProjectText(readFileSync(join(__dirname, '..', 'resources', `${name}.json`), 'utf8'));
const total = (q: ReturnType<typeof solveLossPoint>) => q.losses.copper_W + q.losses.iron_W + q.losses.inverter_W + q.losses.mechanical_W;

describe('gain of loss-minimising control', () => {
  for (const [name, n] of [['demo-ipm-traction', 12], ['demo-ipm-saturated', 7]] as const) {
    it(`${name}: loss saved never negative, a real saving somewhere, NaN outside the envelope`, () => {
      const p = demo(name);
      const S = mapAxis(-3000 * Math.PI / 30, 12000 * Math.PI / 30, n), T = mapAxis(-240, 240, n);
      const { leastCurrent, minLoss, gain } = minLossGainMap(p.models.hot, p.peak, lossConditionsFromProject(p), S, T);
      const plain = efficiencyMap(p.models.hot, p.peak, lossConditionsFromProject(p), S, T);
      let inside = 0, saving = 0;
      for (let k = 0; k < n * n; k++) {
        // the envelope is that of the least-current map (both rules hold the same shaft torques: common practice (no source))
        expect(gain.feasible[k]).toBe(plain.feasible[k]);
        expect(leastCurrent.feasible[k]).toBe(plain.feasible[k]);
        if (gain.feasible[k] === 0) {
          for (const a of [gain.lossSaved, gain.lossLeastCurrent, gain.lossMinLoss, gain.systemGain_pts]) expect(a[k]).toBeNaN();
          continue;
        }
        inside++;
        // the search keeps a current only when its loss is lower (Morimoto et al. (1994), Loss minimization control of PMSM drives, IEEE Trans. Ind. Electron. 41(5))
        expect(gain.lossSaved[k]).toBeGreaterThanOrEqual(0);
        expect(gain.lossSaved[k]).toBe(gain.lossLeastCurrent[k]! - gain.lossMinLoss[k]!);
        // the least-current start is the least-current map's point, to the fixed point's tolerance (common practice (no source))
        const plainLoss = plain.copper[k]! + plain.iron[k]! + plain.inverterLoss[k]! + plain.mechanical[k]!;
        expect(Math.abs(gain.lossLeastCurrent[k]! - plainLoss)).toBeLessThan(1e-7 * Math.max(1, plainLoss));
        // less loss at the same shaft power: no less system efficiency (energy balance to 1e-9, common practice (no source))
        expect(gain.systemGain_pts[k]).toBeGreaterThan(-1e-6);
        expect(gain.systemGain_pts[k]).toBe(100 * (minLoss.system[k]! - leastCurrent.system[k]!));
        if (gain.lossSaved[k]! > 1) saving++;
      }
      expect(inside).toBeGreaterThan(n);
      // iron and inverter losses make the least current not the least loss somewhere (Morimoto et al. (1994))
      expect(saving).toBeGreaterThan(0);
    });
  }

  it('each cell is the difference of the two operating points solved on their own', () => {
    const p = demo('demo-ipm-traction');
    const c = lossConditionsFromProject(p);
    const S = Float64Array.from([4000, 8000, 11000].map((n) => n * Math.PI / 30)), T = Float64Array.from([-60, 20, 60]);
    const { gain } = minLossGainMap(p.models.hot, p.peak, c, S, T);
    for (let i = 0; i < 3; i++) {
      for (let j = 0; j < 3; j++) {
        const a = solveLossPoint(p.models.hot, p.peak, c, S[i]!, T[j]!);
        const b = solveLossPoint(p.models.hot, p.peak, c, S[i]!, T[j]!, { minLoss: true });
        const k = i * 3 + j;
        expect(gain.feasible[k]).toBe(a.feasible ? 1 : 0);
        if (!a.feasible) continue;
        // same solver, same start: the same numbers (common practice (no source))
        expect(gain.lossMinLoss[k]).toBe(total(b));
        expect(Math.abs(gain.lossSaved[k]! - (total(a) - total(b)))).toBeLessThan(1e-9 * total(a));
        expect(gain.systemGain_pts[k]).toBeCloseTo(100 * (b.efficiency.system - a.efficiency.system), 9);
      }
    }
  });

  for (const [what, iron] of [['absent', undefined], ['zero coefficients', { kh: 0, beta: 2, ke: 0 }]] as const) {
    it(`loss saved exactly 0 with no iron (${what}) and no inverter loss`, () => {
      const p = demo('demo-ipm-traction');
      const c: LossConditions = { Vdc: p.inverter.Vdc, friction: { B: p.mechanics.viscousFriction, Tc: p.mechanics.coulombFriction }, losses: { windage: { kw: 5e-8 }, ...(iron ? { iron } : {}) } };
      const S = mapAxis(0, 12000 * Math.PI / 30, 8), T = mapAxis(-240, 240, 8);
      const { gain } = minLossGainMap(p.models.hot, p.peak, c, S, T);
      let inside = 0;
      for (let k = 0; k < 64; k++) {
        if (gain.feasible[k] === 0) continue;
        inside++;
        // copper loss alone is least at the least current (definition of the least-current rule, common practice (no source))
        expect(gain.lossSaved[k]).toBe(0);
        expect(gain.systemGain_pts[k]).toBe(0);
      }
      expect(inside).toBeGreaterThan(20);
    });
  }

  it('maps over different axes are refused', () => {
    const a = newEfficiencyMap(mapAxis(0, 1, 2), mapAxis(0, 1, 3)), b = newEfficiencyMap(mapAxis(0, 1, 3), mapAxis(0, 1, 3));
    // common practice (no source)
    expect(() => minLossGain(a, b)).toThrow(/share their axes/);
  });
});
