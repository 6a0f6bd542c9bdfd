import { describe, expect, it } from 'vitest';
import { machineAt } from '../src/core/machine/thermal';
import { solveLossPoint } from '../src/core/steady-state/loss-point';
import { IL, instantLosses, newInstantLossScratch, OUTSIDE } from '../src/core/simulation/instant-losses';
import { MODEL_CEILING_K as RUNAWAY_K } from '../src/core/steady-state/loss-at-temperatures';
import { alphaBr, conditions, project, temperatureModel, THERMAL } from './duty-cycle-fixtures';

const rpm = (n: number) => (n * Math.PI) / 30;

describe('loss point of an instant at the temperatures reached', () => {
  it('equals the loss point of the machine built at those temperatures (loss-point.ts; magnet at the stator plus its offset)', () => {
    const tm = temperatureModel();
    const sc = newInstantLossScratch(tm, THERMAL, conditions, project.peak);
    for (const [n, Ts, Tw, Tst] of [[1000, 120, 110, 80], [6000, 50, 140, 100], [4000, -60, 60, 55], [0, 80, 40, 40], [9000, 25, 90, 70]] as const) {
      const o = instantLosses(sc, rpm(n), Ts, Tw, Tst, 0);
      const ref = solveLossPoint(machineAt(project.machine20, Tw, Tst + THERMAL.magnetAboveStator_K, alphaBr), project.peak, conditions, rpm(n), Ts);
      expect(ref.feasible).toBe(true);
      const at = `${n} rpm ${Ts} N·m`;
      expect(o[IL.outside], at).toBe(0);
      const rel = (a: number, b: number) => Math.abs(a - b) / Math.max(1, Math.abs(b));
      expect(rel(o[IL.copper]!, ref.losses.copper_W), at).toBeLessThan(1e-7);
      expect(rel(o[IL.iron]!, ref.losses.iron_W), at).toBeLessThan(1e-7);
      expect(rel(o[IL.inverter]!, ref.losses.inverter_W), at).toBeLessThan(1e-7);
      expect(o[IL.mechanical]).toBe(ref.losses.mechanical_W);
      expect(rel(o[IL.dcPower]!, ref.dcPower_W), at).toBeLessThan(1e-7);
      expect(rel(o[IL.current]!, ref.current), at).toBeLessThan(1e-7);
      // energy balance of the instant: DC power = shaft + losses (conservation of energy, common practice (no source))
      const sum = o[IL.copper]! + o[IL.iron]! + o[IL.mechanical]! + o[IL.inverter]!;
      expect(Math.abs(o[IL.dcPower]! - (Ts * rpm(n) + sum)) / Math.max(Math.abs(o[IL.dcPower]!), 1)).toBeLessThan(1e-8);
    }
  });

  it('beyond the peak current: outside (current), with the losses of the current it needs; beyond the voltage: outside (beyond-mtpv)', () => {
    const tm = temperatureModel();
    const sc = newInstantLossScratch(tm, THERMAL, conditions, project.peak);
    const o = instantLosses(sc, rpm(500), 400, 100, 80, 0);
    expect(OUTSIDE[o[IL.outside]!]).toBe('current');
    expect(o[IL.current]).toBeGreaterThan(project.peak.Imax);
    const ref = solveLossPoint(machineAt(project.machine20, 100, 90, alphaBr), { Vmax: project.peak.Vmax, Imax: 1e9 }, conditions, rpm(500), 400);
    expect(o[IL.copper]! / ref.losses.copper_W).toBeCloseTo(1, 9);
    // the peak-limited solver agrees that the point is outside
    expect(solveLossPoint(machineAt(project.machine20, 100, 90, alphaBr), project.peak, conditions, rpm(500), 400).feasible).toBe(false);
    const v = instantLosses(sc, rpm(12000), 200, 100, 80, 0);
    expect(OUTSIDE[v[IL.outside]!]).toBe('beyond-mtpv');
  });

  it('temperatures far beyond the limits are clamped for the model (a magnet at 900 °C would have no flux), not refused', () => {
    const tm = temperatureModel();
    const sc = newInstantLossScratch(tm, THERMAL, conditions, project.peak);
    const cap = Math.max(THERMAL.windingMax_C, THERMAL.magnetMax_C) + RUNAWAY_K;
    const hot = instantLosses(sc, rpm(500), 400, 5000, 5000, 0)[IL.copper]!;
    const atCap = instantLosses(sc, rpm(500), 400, cap, cap - THERMAL.magnetAboveStator_K, 0)[IL.copper]!;
    expect(hot).toBe(atCap);
    expect(Number.isFinite(hot)).toBe(true);
  });
});
