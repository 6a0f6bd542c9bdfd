// The loss point at given winding and magnet temperatures (src/core/steady-state/loss-at-temperatures.ts):
// checked against the solvers run on a machine built afresh at those temperatures (machineAt for the
// constant-parameter traction demo, fluxMapAt for the saturated demo's flux map), which is what
// re-tempering in place must reproduce. Invented motors and the example network.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { fluxMapAt } from '../src/core/machine/flux-map';
import { machineModel } from '../src/core/machine/linear-dq';
import { resistanceAt, machineAt } from '../src/core/machine/thermal';
import { loadProjectText } from '../src/core/project/project';
import { lossConditionsFromProject } from '../src/core/project/loss-conditions-from-project';
import { temperatureModelFromProject } from '../src/core/project/temperature-model-from-project';
import { maxTorquePoint } from '../src/core/steady-state/envelope';
import { LossAtTemperatures, MODEL_CEILING_K, modelCeiling_C } from '../src/core/steady-state/loss-at-temperatures';
import { solveLossPoint } from '../src/core/steady-state/loss-point';
import { solveOperatingPoint } from '../src/core/steady-state/operating-point';
import { newPointLossScratch, PL, pointLosses } from '../src/core/steady-state/point-losses';
import { alphaBr, conditions, project, temperatureModel, THERMAL } from './duty-cycle-fixtures';
import { refusal } from './helpers';

const rpm = (n: number) => (n * Math.PI) / 30;
const rel = (a: number, b: number) => Math.abs(a - b) / Math.max(1, Math.abs(b));

describe('the loss point at given winding and magnet temperatures', () => {
  it('at a shaft torque within the limits: the point and losses of solveLossPoint on the machine built at those temperatures (loss-point.ts, the definition)', () => {
    const lp = new LossAtTemperatures(temperatureModel(), THERMAL, project.peak, conditions);
    for (const [n, Ts, Tw, Tm] of [[0, 80, 60, 50], [1000, 120, 110, 90], [4000, -60, 60, 65], [6000, 50, 140, 110], [9000, 25, 90, 80]] as const) {
      const ref = solveLossPoint(machineAt(project.machine20, Tw, Tm, alphaBr), project.peak, conditions, rpm(n), Ts);
      const at = `${n} rpm ${Ts} N·m`;
      expect(lp.atTorque(rpm(n), Ts, Tw, Tm), at).toBe(true);
      expect(ref.feasible).toBe(true);
      expect(lp.limitedBy, at).toBe(ref.limitedBy);
      expect(lp.region, at).toBe(ref.region);
      expect(rel(lp.current, ref.current), at).toBeLessThan(1e-9);
      expect(rel(lp.copper_W, ref.losses.copper_W), at).toBeLessThan(1e-9);
      expect(rel(lp.iron_W, ref.losses.iron_W), at).toBeLessThan(1e-9);
      expect(rel(lp.inverter_W, ref.losses.inverter_W), at).toBeLessThan(1e-9);
      expect(lp.mechanical_W).toBe(ref.losses.mechanical_W);
      expect(rel(lp.dcPower_W, ref.dcPower_W), at).toBeLessThan(1e-9);
      expect(rel(lp.torqueEm_Nm, ref.torqueEm_Nm), at).toBeLessThan(1e-9);
      // the shaft torque's balance: T_em = T_shaft + loss torque (power flow, common practice (no source))
      expect(Math.abs(lp.torqueEm_Nm - Ts - lp.lossTorque_Nm)).toBeLessThan(1e-9 * Math.max(1, Math.abs(Ts)));
      expect(lp.winding_C).toBe(Tw);
      expect(lp.magnet_C).toBe(Tm);
    }
  });

  it('beyond the current limit: infeasible and named as solveOperatingPoint names it, with the converged losses of the current it needs', () => {
    const lp = new LossAtTemperatures(temperatureModel(), THERMAL, project.peak, conditions);
    const m = machineAt(project.machine20, 100, 90, alphaBr);
    const seen = new Set<string>();
    // at low speed (MTPA: the current alone binds); in field weakening 2 % above the envelope (both
    // bind); in field weakening 8 % above it at 2000 rpm, where even the MTPA current for the torque
    // exceeds Imax (the current alone binds, though the point lies in field weakening)
    const env = (n: number) => maxTorquePoint(m, project.peak, rpm(n), 'motoring').torque;
    for (const [n, Ts] of [[500, 400], [2500, 1.02 * env(2500)], [2000, 1.08 * env(2000)]] as const) {
      expect(lp.atTorque(rpm(n), Ts, 100, 90)).toBe(false);
      const unlimited = solveLossPoint(m, { Vmax: project.peak.Vmax, Imax: 1e9 }, conditions, rpm(n), Ts);
      expect(unlimited.feasible).toBe(true);
      expect(unlimited.current).toBeGreaterThan(project.peak.Imax);
      expect(rel(lp.current, unlimited.current)).toBeLessThan(1e-9);
      expect(rel(lp.copper_W, unlimited.losses.copper_W)).toBeLessThan(1e-9);
      if (n === 2000) expect(lp.region).toBe('field-weakening');
      expect(lp.limitedBy).toBe(solveOperatingPoint(m, project.peak, rpm(n), unlimited.torqueEm_Nm).limitedBy);
      seen.add(lp.limitedBy);
    }
    expect([...seen].sort()).toEqual(['current', 'current-and-voltage']);
    // beyond the voltage at any current
    expect(lp.atTorque(rpm(12000), 200, 100, 90)).toBe(false);
    expect(lp.limitedBy).toBe('beyond-mtpv');
  });

  it('at a current: the largest torque within it at those temperatures, as the envelope solver gives it on the machine built there, with its losses', () => {
    const lp = new LossAtTemperatures(temperatureModel(), THERMAL, project.continuous, conditions);
    const sc = newPointLossScratch();
    for (const [n, I, Tw, Tm] of [[1000, 150, 120, 100], [6000, 200, 150, 130], [10000, 120, 80, 70]] as const) {
      const m = machineAt(project.machine20, Tw, Tm, alphaBr);
      const ref = maxTorquePoint(m, { Vmax: project.continuous.Vmax, Imax: I }, rpm(n), 'motoring');
      expect(lp.atCurrent(rpm(n), I, 1, Tw, Tm)).toBe(true);
      expect(rel(lp.torqueEm_Nm, ref.torque)).toBeLessThan(1e-9);
      expect(lp.region).toBe(ref.region);
      pointLosses(machineModel(m), conditions, rpm(n), ref.id, ref.iq, sc);
      expect(rel(lp.copper_W, sc.r[PL.copper]!)).toBeLessThan(1e-6);
      expect(rel(lp.iron_W, sc.r[PL.iron]!)).toBeLessThan(1e-6);
    }
  });

  it('a flux map re-tempered in place: each evaluation at a current answers as a map tempered afresh, whatever was evaluated before (the saturated demo)', () => {
    const p = loadProjectText(readFileSync(join(__dirname, '..', 'resources', 'demo-ipm-saturated.json'), 'utf8'));
    const c = lossConditionsFromProject(p), map = p.file.motor!.fluxMap!, Rs20 = p.file.motor!.Rs!;
    const alpha = p.conditions.magnetTempCoeff;
    const lp = new LossAtTemperatures(temperatureModelFromProject(p), p.thermal!, p.continuous, c);
    const I = p.continuous.Imax, w = rpm(3000);
    for (const [Tw, Tm] of [[65, 90], [166, 126], [120, 150], [166, 126]] as const) {
      expect(lp.atCurrent(w, I, 1, Tw, Tm)).toBe(true);
      const fresh = fluxMapAt(map, p.machine20.polePairs, resistanceAt(Rs20, Tw), Tm, alpha);
      const ref = maxTorquePoint(fresh, { Vmax: p.continuous.Vmax, Imax: I }, w, 'motoring');
      expect(rel(lp.torqueEm_Nm, ref.torque), `${Tw} °C, ${Tm} °C`).toBeLessThan(1e-9);
    }
  });

  it('temperatures beyond the ceiling (300 K above the highest limit) are clamped for the model, not refused, and the ones used are reported', () => {
    const lp = new LossAtTemperatures(temperatureModel(), THERMAL, project.peak, conditions);
    const top = modelCeiling_C(THERMAL);
    expect(top).toBe(Math.max(THERMAL.windingMax_C, THERMAL.magnetMax_C) + MODEL_CEILING_K);
    lp.atTorque(rpm(500), 100, 5000, 5000);
    const hot = lp.copper_W;
    expect(lp.winding_C).toBe(top);
    expect(lp.magnet_C).toBe(top);
    lp.atTorque(rpm(500), 100, top, top);
    expect(lp.copper_W).toBe(hot);
    expect(Number.isFinite(hot)).toBe(true);
  });

  it('refuses bad limits and loss conditions, naming the field', () => {
    expect(refusal(() => new LossAtTemperatures(temperatureModel(), THERMAL, { Vmax: 0, Imax: 100 }, conditions)).field).toBe('inverter.Vdc');
    expect(refusal(() => new LossAtTemperatures(temperatureModel(), THERMAL, project.peak, { ...conditions, Vdc: -1 })).field).toBe('inverter.Vdc');
  });
});
