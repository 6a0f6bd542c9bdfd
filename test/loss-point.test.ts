import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { loadProjectText } from '../src/core/project/project';
import { solveLossPoint } from '../src/core/steady-state/loss-point';
import { solveOperatingPoint } from '../src/core/steady-state/operating-point';
import type { LossConditions, LossSpec } from '../src/core/steady-state/point-losses';
import { isInputError } from '../src/core/base/errors';

const demo = (name: string) => loadProjectText(readFileSync(join(__dirname, '..', 'resources', `${name}.json`), 'utf8'));
const rpm = (n: number) => (n * Math.PI) / 30;
// invented loss data (order of magnitude of a 100 kW traction drive)
const LOSSES: LossSpec = {
  iron: { kh: 100, beta: 2, ke: 0.5 },
  windage: { kw: 5e-8 },
  inverter: { Vce0: 0.8, rce: 0.002, Vf0: 0.9, rd: 0.0015, EonEoff_J: 0.022, Err_J: 0.006, Vref_V: 300, Iref_A: 200, fsw_Hz: 10000 },
};
const conditions = (p: ReturnType<typeof demo>, losses: LossSpec = LOSSES): LossConditions => ({
  Vdc: p.inverter.Vdc, friction: { B: p.mechanics.viscousFriction, Tc: p.mechanics.coulombFriction }, losses,
});
const POINTS: ReadonlyArray<[number, number]> = [[500, 150], [3000, 90], [4000, 60], [6000, -60], [8000, 30], [-3000, -80], [-2000, 50], [10000, -20], [1500, 0]];

describe('operating point with losses', () => {
  for (const name of ['demo-ipm-traction', 'demo-ipm-saturated']) {
    for (const minLoss of [false, true]) {
      it(`${name}${minLoss ? ' (min-loss)' : ''}: energy balance and the torque fixed point at every point`, () => {
        const p = demo(name);
        const c = conditions(p);
        for (const [n, Ts] of POINTS) {
          const r = solveLossPoint(p.models.hot, p.peak, c, rpm(n), Ts, { minLoss });
          expect(r.feasible, `${n} rpm ${Ts} N·m`).toBe(true);
          // the fixed point converges in a few steps (loss torque small against T_em: contraction, common practice (no source))
          expect(r.iterations, `${n} rpm ${Ts} N·m`).toBeLessThan(15);
          if (n !== 0) expect(Math.abs(r.torqueEm_Nm - (Ts + (r.losses.iron_W + r.losses.mechanical_W) / rpm(n)))).toBeLessThan(1e-9 * Math.max(1, Math.abs(r.torqueEm_Nm)));
          const L = r.losses;
          const sumLoss = L.copper_W + L.iron_W + L.mechanical_W + L.inverter_W;
          const scale = Math.max(Math.abs(r.dcPower_W), Math.abs(r.shaftPower_W), sumLoss);
          // energy balance: electrical input = shaft output + all losses (conservation of energy, common practice (no source))
          expect(Math.abs(r.dcPower_W - (Ts * rpm(n) + sumLoss)) / scale, `${n} rpm ${Ts} N·m`).toBeLessThan(1e-9);
          // dq power: P_ac = 1.5 (vd id + vq iq) = P_cu + T_em w (Krause, Wasynczuk and Sudhoff (2002), Analysis of Electric Machinery, ch. 5)
          expect(Math.abs(r.acPower_W - (L.copper_W + r.torqueEm_Nm * rpm(n))) / scale).toBeLessThan(1e-9);
          // DC link: I_dc = P_dc / Vdc (common practice (no source))
          expect(r.dcCurrent_A).toBeCloseTo(r.dcPower_W / p.inverter.Vdc, 9);
          expect(r.losses.iron_W).toBeGreaterThanOrEqual(0);
          expect(r.losses.inverter_W).toBeGreaterThan(n === 1500 && Ts === 0 ? -1 : 0);
        }
      });
    }
  }

  it('motoring and generating efficiencies are output over input', () => {
    const p = demo('demo-ipm-traction');
    const c = conditions(p);
    const mo = solveLossPoint(p.models.hot, p.peak, c, rpm(4000), 90);
    // motoring: shaft / AC, AC / DC, shaft / DC (IEC 60034-2-1 (2014), efficiency = output power / input power)
    expect(mo.efficiency.motor).toBeCloseTo(mo.shaftPower_W / mo.acPower_W, 12);
    expect(mo.efficiency.inverter).toBeCloseTo(mo.acPower_W / mo.dcPower_W, 12);
    expect(mo.efficiency.system).toBeCloseTo(mo.efficiency.motor * mo.efficiency.inverter, 12);
    expect(mo.efficiency.system).toBeGreaterThan(0.8);
    expect(mo.efficiency.system).toBeLessThan(1);
    expect(mo.torqueEm_Nm).toBeGreaterThan(90);
    expect(mo.powerFactor).toBeGreaterThan(0);
    const ge = solveLossPoint(p.models.hot, p.peak, c, rpm(6000), -60);
    // generating: electrical out / mechanical in (IEC 60034-2-1 (2014), output / input)
    expect(ge.efficiency.motor).toBeCloseTo(ge.acPower_W / ge.shaftPower_W, 12);
    expect(ge.efficiency.system).toBeCloseTo(ge.dcPower_W / ge.shaftPower_W, 12);
    expect(ge.efficiency.system).toBeLessThan(ge.efficiency.motor);
    expect(ge.torqueEm_Nm).toBeGreaterThan(-60); // the losses are covered by the mechanical input
    expect(ge.powerFactor).toBeLessThan(0);
  });

  it('with no losses beyond Rs it is the lossless least-current point', () => {
    const p = demo('demo-ipm-traction');
    const c: LossConditions = { Vdc: p.inverter.Vdc, friction: { B: 0, Tc: 0 }, losses: {} };
    for (const [n, Ts] of POINTS) {
      const r = solveLossPoint(p.models.hot, p.peak, c, rpm(n), Ts);
      const q = solveOperatingPoint(p.models.hot, p.peak, rpm(n), Ts);
      // common practice (no source): zero iron, mechanical and inverter loss leave T_em = T_shaft
      expect(r.id).toBe(q.id);
      expect(r.iq).toBe(q.iq);
      expect(r.iterations).toBe(1);
      expect(r.losses.copper_W).toBeCloseTo(1.5 * p.hot.Rs * q.current ** 2, 9);
    }
  });

  it('reports infeasibility and its limit; rejects a bad DC voltage', () => {
    const p = demo('demo-ipm-traction');
    const c = conditions(p);
    // the demo's peak current reaches about 200+ N·m at low speed, not 1000 (common practice (no source))
    const r = solveLossPoint(p.models.hot, p.peak, c, rpm(500), 1000);
    expect(r.feasible).toBe(false);
    expect(r.limitedBy).toBe('current');
    const s = solveLossPoint(p.models.hot, p.peak, c, rpm(12000), 150);
    expect(s.feasible).toBe(false);
    expect(['beyond-mtpv', 'current-and-voltage']).toContain(s.limitedBy);
    let e: unknown;
    try { solveLossPoint(p.models.hot, p.peak, { ...c, Vdc: 0 }, 100, 10); } catch (x) { e = x; }
    expect(isInputError(e) && e.field).toBe('inverter.Vdc');
  });
});
