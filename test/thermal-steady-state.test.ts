import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { ThermalNetworkSpec } from '../src/core/machine/thermal-network-spec';
import { loadProjectText } from '../src/core/project/project';
import { lossConditionsFromProject } from '../src/core/project/loss-conditions-from-project';
import { linearTemperatureModel } from '../src/core/machine/temperature-model';
import { machineAt } from '../src/core/machine/thermal';
import { steadyTemperatures, junctionTemperature } from '../src/core/machine/thermal-network';
import { solveLossPoint } from '../src/core/steady-state/loss-point';
import { coupledSteadyState, THERMAL_TOL_K } from '../src/core/steady-state/thermal-steady-state';
import type { LossConditions } from '../src/core/steady-state/point-losses';
import { refusal } from './helpers';

const demo = (name: string) => loadProjectText(readFileSync(join(__dirname, '..', 'resources', `${name}.json`), 'utf8'));
const rpm = (n: number) => (n * Math.PI) / 30;
// the example network (invented numbers)
const NET: ThermalNetworkSpec = {
  coolantTemp_C: 40, windingCapacity_J_per_K: 900, windingToStator_K_per_W: 0.05, statorCapacity_J_per_K: 9000,
  statorToCoolant_K_per_W: 0.02, magnetAboveStator_K: 10, windingMax_C: 155, magnetMax_C: 140, junctionToCoolant_K_per_W: 0.15, junctionMax_C: 150,
};
const m20 = { polePairs: 4, Rs: 0.02, Ld: 3e-4, Lq: 3e-4, psiM: 0.06 };
const lossless: LossConditions = { Vdc: 600, friction: { B: 0, Tc: 0 }, losses: {} };
const wide = { Vmax: 300, Imax: 2000 };

describe('thermally coupled steady state', () => {
  it('copper loss only, constant flux: the closed-form heat balance with Rs(T) (linear steady-state balance, common practice (no source); IEC 60028 copper coefficient)', () => {
    const tm = linearTemperatureModel(m20, 0);
    const T = 60; // at standstill: MTPA of a surface-magnet machine, i = T / (1.5 p psiM)
    const I = T / (1.5 * 4 * 0.06);
    const k = 1.5 * 0.02 * I * I, a = 0.00393, R = 0.07;
    const Tw = (40 + k * (1 - 20 * a) * R) / (1 - k * a * R);
    const r = coupledSteadyState(tm, NET, wide, lossless, 0, T);
    expect(r.status).toBe('converged');
    expect(Math.abs(r.windingTemp_C - Tw)).toBeLessThan(1e-5);
    expect(Math.abs(r.statorTemp_C - (40 + 0.02 * k * (1 + a * (Tw - 20))))).toBeLessThan(1e-5);
    expect(r.magnetTemp_C).toBeCloseTo(r.statorTemp_C + 10, 12);
    expect(r.current).toBeCloseTo(I, 9);
    // the resistance coupling is solved exactly: no more than two evaluations
    expect(r.iterations).toBeLessThanOrEqual(2);
  });

  it('runaway exactly where k a R >= 1 (the same closed form has no positive denominator; common practice (no source))', () => {
    const tm = linearTemperatureModel(m20, 0);
    const T = 60, I = T / (1.5 * 4 * 0.06), k = 1.5 * 0.02 * I * I, a = 0.00393;
    const Rcrit = 1 / (k * a); // winding-to-coolant resistance at which no steady state exists
    const hot = (f: number): ThermalNetworkSpec => ({ ...NET, windingToStator_K_per_W: f * Rcrit - 0.02, windingMax_C: 2000, magnetMax_C: 2000 });
    expect(coupledSteadyState(tm, hot(1.02), wide, lossless, 0, T).status).toBe('runaway');
    const ok = coupledSteadyState(tm, hot(0.5), wide, lossless, 0, T);
    expect(ok.status).toBe('converged');
    const R = 0.5 * Rcrit;
    expect(Math.abs(ok.windingTemp_C - (40 + k * (1 - 20 * a) * R) / (1 - k * a * R))).toBeLessThan(1e-5);
  });

  for (const name of ['demo-ipm-traction', 'demo-ipm-saturated']) {
    it(`${name}: a fixed point of the loss point and the network's steady state (the definition of the coupled state; Walker and Ni (2011) for the iteration)`, () => {
      const p = demo(name);
      const c = lossConditionsFromProject(p);
      const tm = linearTemperatureModel(p.machine20, p.conditions.magnetTempCoeff);
      const out = new Float64Array(2);
      for (const [n, Ts] of [[0, 80], [1000, 100], [4000, 60], [8000, 30], [6000, -60]] as const) {
        const r = coupledSteadyState(tm, NET, p.peak, c, rpm(n), Ts);
        expect(r.status, `${n} rpm`).toBe('converged');
        expect(r.iterations).toBeLessThan(15);
        // the loss point of a model built afresh at the reported temperatures heats the network to them
        const lp = solveLossPoint(machineAt(p.machine20, r.windingTemp_C, r.magnetTemp_C, p.conditions.magnetTempCoeff), p.peak, c, rpm(n), Ts);
        steadyTemperatures(NET, lp.losses.copper_W, lp.losses.iron_W, n, out);
        expect(Math.abs(out[0]! - r.windingTemp_C), `${n} rpm`).toBeLessThan(10 * THERMAL_TOL_K);
        expect(Math.abs(out[1]! - r.statorTemp_C), `${n} rpm`).toBeLessThan(10 * THERMAL_TOL_K);
        expect(r.junctionTemp_C).toBeCloseTo(junctionTemperature(NET, lp.losses.inverter_W), 4);
        expect(r.current).toBeCloseTo(lp.current, 5);
        // hotter than the coolant, and the winding above the stator (heat flows to the coolant)
        expect(r.windingTemp_C).toBeGreaterThan(r.statorTemp_C);
        expect(r.statorTemp_C).toBeGreaterThan(40);
      }
    });
  }

  it('any (speed, torque) of the traction demo up to twice its peak torque: one of the four statuses, never a throw, converged ones within the network\'s bounds', () => {
    const p = demo('demo-ipm-traction');
    const c = lossConditionsFromProject(p);
    const tm = linearTemperatureModel(p.machine20, p.conditions.magnetTempCoeff);
    const seen = new Set<string>();
    for (const n of [0, 2000, 4000, 8000, 12000, 16000]) {
      for (const Ts of [-500, -250, -100, 0, 100, 250, 500]) {
        const r = coupledSteadyState(tm, NET, p.peak, c, rpm(n), Ts);
        seen.add(r.status);
        expect(['converged', 'runaway', 'outside-envelope']).toContain(r.status);
        // steady temperatures lie between the coolant and the runaway bound (losses >= 0; common practice (no source))
        if (r.status === 'converged') expect(r.statorTemp_C).toBeGreaterThanOrEqual(40);
      }
    }
    expect(seen.has('converged') && seen.has('outside-envelope')).toBe(true);
  });

  it('outside the envelope: more torque than the hot machine makes', () => {
    const p = demo('demo-ipm-traction');
    const tm = linearTemperatureModel(p.machine20, p.conditions.magnetTempCoeff);
    const r = coupledSteadyState(tm, NET, p.continuous, lossConditionsFromProject(p), rpm(3000), 400);
    expect(r.status).toBe('outside-envelope');
  });

  it('refuses a bad network, naming the field', () => {
    const tm = linearTemperatureModel(m20, 0);
    expect(refusal(() => coupledSteadyState(tm, { ...NET, windingMax_C: 30 }, wide, lossless, 0, 10)).field).toBe('thermal.windingMax_C');
    expect(refusal(() => coupledSteadyState(tm, { ...NET, statorCapacity_J_per_K: 0 }, wide, lossless, 0, 10)).field).toBe('thermal.statorCapacity_J_per_K');
    expect(refusal(() => coupledSteadyState(tm, { ...NET, junctionMax_C: undefined }, wide, lossless, 0, 10)).field).toBe('thermal.junctionMax_C');
    expect(refusal(() => coupledSteadyState(tm, NET, wide, lossless, Number.NaN, 10)).field).toBe('speed');
  });
});
