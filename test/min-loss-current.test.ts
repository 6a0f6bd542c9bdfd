import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { loadProjectText } from '../src/core/project/project';
import { solveLossPoint } from '../src/core/steady-state/loss-point';
import { locusIq, shaftTorque, type ShaftLocus } from '../src/core/steady-state/min-loss-current';
import type { LossConditions, LossSpec } from '../src/core/steady-state/point-losses';
import { LinearDqModel } from '../src/core/machine/linear-dq';

const demo = (name: string) => loadProjectText(readFileSync(join(__dirname, '..', 'resources', `${name}.json`), 'utf8'));
const rpm = (n: number) => (n * Math.PI) / 30;
// invented loss data
const INV = { Vce0: 0.8, rce: 0.002, Vf0: 0.9, rd: 0.0015, EonEoff_J: 0.022, Err_J: 0.006, Vref_V: 300, Iref_A: 200, fsw_Hz: 10000 };
const FULL: LossSpec = { iron: { kh: 100, beta: 2, ke: 0.5 }, windage: { kw: 5e-8 }, inverter: INV };
const POINTS: ReadonlyArray<[number, number]> = [[500, 150], [3000, 90], [4000, 90], [6000, -60], [8000, 30], [10000, 10], [-4000, -70], [1500, 0], [0, 120]];
const electrical = (r: ReturnType<typeof solveLossPoint>) => r.losses.copper_W + r.losses.iron_W + r.losses.inverter_W;

describe('loss-minimising current', () => {
  for (const name of ['demo-ipm-traction', 'demo-ipm-saturated']) {
    it(`${name}: never more total loss than the least current, same shaft torque, within both limits`, () => {
      const p = demo(name);
      const c: LossConditions = { Vdc: p.inverter.Vdc, friction: { B: p.mechanics.viscousFriction, Tc: p.mechanics.coulombFriction }, losses: FULL };
      let gained = 0;
      for (const [n, Ts] of POINTS) {
        const a = solveLossPoint(p.models.hot, p.peak, c, rpm(n), Ts);
        const b = solveLossPoint(p.models.hot, p.peak, c, rpm(n), Ts, { minLoss: true });
        expect(b.feasible).toBe(true);
        // the optimum of a search that keeps the least-current point as a candidate (common practice (no source))
        expect(electrical(b), `${n} rpm ${Ts} N·m`).toBeLessThanOrEqual(electrical(a) * (1 + 1e-12));
        expect(b.current).toBeLessThanOrEqual(p.peak.Imax);
        expect(b.voltage).toBeLessThanOrEqual(p.peak.Vmax * (1 + 1e-10));
        // same output: DC power = shaft power + all losses (conservation of energy, common practice (no source))
        const all = electrical(b) + b.losses.mechanical_W;
        expect(Math.abs(b.dcPower_W - (Ts * rpm(n) + all)) / Math.max(Math.abs(b.dcPower_W), all)).toBeLessThan(1e-9);
        if (electrical(b) < electrical(a) * (1 - 1e-4)) gained++;
      }
      // iron loss falls with more field weakening: a real gain somewhere (Morimoto et al. (1994), Loss minimization control of permanent magnet synchronous motor drives, IEEE Trans. Ind. Electron. 41(5))
      expect(gained).toBeGreaterThan(2);
    });

    it(`${name}: equals the least current when iron and inverter losses are zero`, () => {
      const p = demo(name);
      const c: LossConditions = { Vdc: p.inverter.Vdc, friction: { B: p.mechanics.viscousFriction, Tc: p.mechanics.coulombFriction }, losses: { windage: { kw: 5e-8 } } };
      for (const [n, Ts] of POINTS) {
        const a = solveLossPoint(p.models.hot, p.peak, c, rpm(n), Ts);
        const b = solveLossPoint(p.models.hot, p.peak, c, rpm(n), Ts, { minLoss: true });
        // copper loss alone is least at the least current (definition of the least-current rule, common practice (no source));
        // (on the voltage boundary the search may use its 1e-10 voltage slack)
        expect(Math.abs(b.losses.copper_W - a.losses.copper_W) / Math.max(a.losses.copper_W, 1e-9), `${n} rpm ${Ts} N·m`).toBeLessThan(1e-9);
        expect(Math.abs(b.current - a.current)).toBeLessThan(1e-6 * Math.max(1, a.current));
      }
    });
  }

  it('locus iq holds the shaft torque, iron and mechanical loss torques included', () => {
    const m = new LinearDqModel({ polePairs: 4, Rs: 0.02, Ld: 3e-4, Lq: 7.5e-4, psiM: 0.057 });
    const c: LossConditions = { Vdc: 350, friction: { B: 0.002, Tc: 0.3 }, losses: FULL };
    const w = rpm(5000);
    const L: ShaftLocus = { m, c, Imax: 450, w, Ts: 80, pMech: 0.002 * w * w + 0.3 * w, sign: 1, flux: new Float64Array(2) };
    for (const id of [-200, -120, -40, 0]) {
      const iq = locusIq(L, id);
      // T = 1.5 p iq (psiM + (Ld - Lq) id) (Krause, Wasynczuk and Sudhoff (2002), Analysis of Electric Machinery, ch. 5)
      const Tem = 1.5 * 4 * iq * (0.057 + (3e-4 - 7.5e-4) * id);
      const f = (4 * w) / (2 * Math.PI), psi = Math.hypot(3e-4 * id + 0.057, 7.5e-4 * iq);
      // Steinmetz (1892) and Bertotti (1988) iron loss, as a drag torque
      const Ts = Tem - (100 * f * psi * psi + 0.5 * f * f * psi * psi + L.pMech) / w;
      expect(Ts).toBeCloseTo(80, 10);
      expect(shaftTorque(L, id, iq)).toBeCloseTo(80, 10);
    }
    expect(locusIq(L, -449.9)).toBeNaN(); // no iq within Imax reaches 80 N·m there
  });
});
