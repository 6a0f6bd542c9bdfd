import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { ThermalNetworkSpec } from '../src/core/machine/thermal-network-spec';
import type { TemperatureModel } from '../src/core/machine/temperature-model';
import { LinearDqModel } from '../src/core/machine/linear-dq';
import { linearTemperatureModel } from '../src/core/machine/temperature-model';
import { machineAt } from '../src/core/machine/thermal';
import { junctionTemperature, stepTemperatures } from '../src/core/machine/thermal-network';
import { loadProjectText } from '../src/core/project/project';
import { lossConditionsFromProject } from '../src/core/project/loss-conditions-from-project';
import { continuousTorqueCurve } from '../src/core/steady-state/continuous-torque';
import { solveLossPoint } from '../src/core/steady-state/loss-point';
import { peakDuration, peakDurationCurve } from '../src/core/steady-state/peak-duration';
import type { LossConditions } from '../src/core/steady-state/point-losses';
import { refusal } from './helpers';

const demo = (name: string) => loadProjectText(readFileSync(join(__dirname, '..', 'resources', `${name}.json`), 'utf8'));
const rpm = (n: number) => (n * Math.PI) / 30;
// the example network (invented numbers)
const NET: ThermalNetworkSpec = {
  coolantTemp_C: 40, windingCapacity_J_per_K: 900, windingToStator_K_per_W: 0.05, statorCapacity_J_per_K: 9000,
  statorToCoolant_K_per_W: 0.02, magnetAboveStator_K: 10, windingMax_C: 155, magnetMax_C: 140, junctionToCoolant_K_per_W: 0.15, junctionMax_C: 150,
};
const p = demo('demo-ipm-traction');
const c = lossConditionsFromProject(p);
const tmOf = () => linearTemperatureModel(p.machine20, p.conditions.magnetTempCoeff);

describe('peak duration', () => {
  it('constant losses: the time the two-exponential closed form takes to the winding limit, solved by bisection here (Boyce and DiPrima (2012), Elementary Differential Equations and Boundary Value Problems, 10th ed., section 7.5)', () => {
    // a machine whose parameters do not follow temperature, at standstill, no iron or inverter loss: every loss is constant
    const m20 = { polePairs: 4, Rs: 0.02, Ld: 3e-4, Lq: 3e-4, psiM: 0.06 };
    const fixed: TemperatureModel = { model: new LinearDqModel(m20), setTemperatures: () => undefined };
    const lossless: LossConditions = { Vdc: 600, friction: { B: 0, Tc: 0 }, losses: {} };
    const net: ThermalNetworkSpec = { ...NET, junctionToCoolant_K_per_W: undefined, junctionMax_C: undefined, magnetMax_C: 400 };
    const lim = { Vmax: 300, Imax: 2000 };
    const T0 = 40, T1 = 120;
    const d = peakDuration(fixed, net, lim, lim, lossless, { speed_rad_s: 0, torque_Nm: T0 }, { speed_rad_s: 0, torque_Nm: T1 });
    // closed form: P = 1.5 Rs i^2, i = T / (1.5 p psiM)
    const P = (T: number) => 1.5 * 0.02 * (T / 0.36) ** 2;
    const Rws = 0.05, Rsc = 0.02, Cw = 900, Cs = 9000;
    const P0 = P(T0), P1 = P(T1);
    const x0 = [P0 * (Rws + Rsc), P0 * Rsc], xi = [P1 * (Rws + Rsc), P1 * Rsc]; // rises above the coolant
    const a = -1 / (Cw * Rws), b = 1 / (Cw * Rws), cc = 1 / (Cs * Rws), dd = -(1 / Rws + 1 / Rsc) / Cs;
    const tr = a + dd, det = a * dd - b * cc, disc = Math.sqrt(tr * tr / 4 - det);
    const l1 = tr / 2 + disc, l2 = tr / 2 - disc;
    // eigenvectors (b, l - a); coefficients from x(0) - x_inf = k1 v1 + k2 v2
    const y0 = x0[0]! - xi[0]!, y1 = x0[1]! - xi[1]!;
    const v1 = [b, l1 - a], v2 = [b, l2 - a];
    const D = v1[0]! * v2[1]! - v2[0]! * v1[1]!;
    const k1 = (y0 * v2[1]! - v2[0]! * y1) / D, k2 = (v1[0]! * y1 - y0 * v1[1]!) / D;
    const Tw = (t: number) => 40 + xi[0]! + k1 * v1[0]! * Math.exp(l1 * t) + k2 * v2[0]! * Math.exp(l2 * t);
    expect(Tw(0)).toBeCloseTo(40 + x0[0]!, 9);
    let lo = 0, hi = 1;
    while (Tw(hi) < 155) hi *= 2;
    for (let i = 0; i < 200; i++) { const mid = 0.5 * (lo + hi); if (Tw(mid) < 155) lo = mid; else hi = mid; }
    expect(d.limitedBy).toBe('winding');
    expect(Math.abs(d.duration_s - lo) / lo).toBeLessThan(1e-8);
    expect(d.end.windingTemp_C).toBeCloseTo(155, 6);
    expect(d.start.windingTemp_C).toBeCloseTo(40 + x0[0]!, 6);
  });

  it('coupled losses: agrees with classical Runge-Kutta (RK4) on the ODE with the loss point re-solved at every stage, to 1e-4 (Butcher (2016), Numerical Methods for Ordinary Differential Equations, 3rd ed., section 32)', () => {
    const w = rpm(1000);
    const s1 = continuousTorqueCurve(tmOf(), NET, p.continuous, c, [w])[0]!;
    const from = { speed_rad_s: w, torque_Nm: 0.5 * s1.torque_Nm }, to = { speed_rad_s: w, torque_Nm: 200 };
    const d = peakDuration(tmOf(), NET, p.peak, p.continuous, c, from, to);
    expect(d.limitedBy).toBe('winding');
    // the reference: the network's ODE with the losses of a model built afresh at each stage's temperatures
    const f = (x: number[]): number[] => {
      const lp = solveLossPoint(machineAt(p.machine20, x[0]!, x[1]! + 10, p.conditions.magnetTempCoeff), p.peak, c, w, 200);
      const q = (x[0]! - x[1]!) / 0.05;
      return [(lp.losses.copper_W - q) / 900, (lp.losses.iron_W + q - (x[1]! - 40) / 0.02) / 9000];
    };
    let x = [d.start.windingTemp_C, d.start.statorTemp_C], t = 0;
    const h = 0.1;
    while (x[0]! < 155) {
      const k1 = f(x), k2 = f(x.map((v, i) => v + 0.5 * h * k1[i]!)), k3 = f(x.map((v, i) => v + 0.5 * h * k2[i]!)), k4 = f(x.map((v, i) => v + h * k3[i]!));
      const xn = x.map((v, i) => v + (h / 6) * (k1[i]! + 2 * k2[i]! + 2 * k3[i]! + k4[i]!));
      if (xn[0]! >= 155) { t += (h * (155 - x[0]!)) / (xn[0]! - x[0]!); break; }
      x = xn; t += h;
    }
    expect(Math.abs(d.duration_s - t) / t).toBeLessThan(1e-4);
    // and a finer step changes it by less than that (second order in the step)
    const fine = peakDuration(tmOf(), NET, p.peak, p.continuous, c, from, to, { stepK: 0.25 });
    expect(Math.abs(fine.duration_s - d.duration_s) / t).toBeLessThan(1e-4);
  });

  it('Infinity below the S1 torque, 0 when the junction is beyond at once, NaN outside the envelope', () => {
    const w = rpm(3000);
    const s1 = continuousTorqueCurve(tmOf(), NET, p.continuous, c, [w])[0]!;
    const from = { speed_rad_s: w, torque_Nm: 0.5 * s1.torque_Nm };
    const under = peakDuration(tmOf(), NET, p.peak, p.continuous, c, from, { speed_rad_s: w, torque_Nm: 0.98 * s1.torque_Nm });
    expect(under.duration_s).toBe(Infinity);
    expect(under.limitedBy).toBe('none');
    expect(under.end.windingTemp_C).toBeLessThan(155);
    // a weak heat sink (invented): the continuous point's junction fits, the overload's not
    const sink: ThermalNetworkSpec = { ...NET, junctionToCoolant_K_per_W: 0.6 };
    const at = peakDuration(tmOf(), sink, p.peak, p.continuous, c, { speed_rad_s: w, torque_Nm: 40 }, { speed_rad_s: w, torque_Nm: 200 });
    expect(at.duration_s).toBe(0);
    expect(at.limitedBy).toBe('junction');
    expect(at.start.junctionTemp_C).toBeLessThan(150);
    expect(at.end.junctionTemp_C).toBeGreaterThanOrEqual(150);
    const lp = solveLossPoint(machineAt(p.machine20, at.start.windingTemp_C, at.start.magnetTemp_C, p.conditions.magnetTempCoeff), p.peak, c, w, 200);
    expect(junctionTemperature(sink, lp.losses.inverter_W)).toBeCloseTo(at.end.junctionTemp_C, 6);
    const out = peakDuration(tmOf(), NET, p.peak, p.continuous, c, from, { speed_rad_s: w, torque_Nm: 500 });
    expect(out.outsideEnvelope).toBe(true);
    expect(out.duration_s).toBeNaN();
  });

  it('the curve: durations fall with torque, Infinity below the S1 torque, up to the envelope', () => {
    const w = rpm(1000);
    const s1 = continuousTorqueCurve(tmOf(), NET, p.continuous, c, [w])[0]!;
    const cv = peakDurationCurve(tmOf(), NET, p.peak, p.continuous, c, { speed_rad_s: w, torque_Nm: 0.5 * s1.torque_Nm }, w, 8);
    expect(cv.torque_Nm).toHaveLength(8);
    for (let k = 0; k < 8; k++) {
      if (cv.torque_Nm[k]! < 0.99 * s1.torque_Nm) expect(cv.duration_s[k]).toBe(Infinity);
      if (cv.torque_Nm[k]! > 1.01 * s1.torque_Nm) expect(cv.duration_s[k]).toBeLessThan(Infinity);
      if (k > 0) expect(cv.duration_s[k]!).toBeLessThanOrEqual(cv.duration_s[k - 1]!);
    }
    // the last torque is the hot peak envelope's shaft torque: a little more cannot be made at the start
    const beyond = peakDuration(tmOf(), NET, p.peak, p.continuous, c, { speed_rad_s: w, torque_Nm: 0.5 * s1.torque_Nm }, { speed_rad_s: w, torque_Nm: cv.torque_Nm[7]! * 1.001 });
    expect(beyond.outsideEnvelope).toBe(true);
  });

  it('the curve in field weakening (4000 rpm) runs through every torque up to the envelope', () => {
    const w = rpm(4000);
    const s1 = continuousTorqueCurve(tmOf(), NET, p.continuous, c, [w])[0]!;
    const cv = peakDurationCurve(tmOf(), NET, p.peak, p.continuous, c, { speed_rad_s: w, torque_Nm: 0.5 * s1.torque_Nm }, w, 10);
    for (let k = 0; k < 10; k++) {
      // below the S1 torque forever, above it a finite time (IEC 60034-1 duty type S1: the S1 torque is the largest held forever)
      expect(cv.duration_s[k]! === Infinity, `${cv.torque_Nm[k]} N·m`).toBe(cv.torque_Nm[k]! < s1.torque_Nm);
    }
  });

  it('a winding heating while the stator cools can pass its limit before settling below it: the overload from a point of large iron loss to one of large copper loss ends at the limit, against a fine explicit integration', () => {
    // invented: the demo's iron loss times 25, a magnet limit out of the way; from 9000 rpm at 5 N·m
    // (the stator hot from the iron loss) to 300 rpm at 97 % of the S1 torque there (its own steady
    // winding below the limit)
    const net: ThermalNetworkSpec = { ...NET, magnetMax_C: 400, junctionToCoolant_K_per_W: undefined, junctionMax_C: undefined };
    const ci: LossConditions = { ...c, losses: { ...c.losses, iron: { kh: 45 * 25, beta: 2, ke: 0.094 * 25 } } };
    const from = { speed_rad_s: rpm(9000), torque_Nm: 5 };
    const to = { speed_rad_s: rpm(300), torque_Nm: 0.97 * continuousTorqueCurve(tmOf(), net, p.continuous, ci, [rpm(300)])[0]!.torque_Nm };
    const d = peakDuration(tmOf(), net, p.peak, p.continuous, ci, from, to);
    expect(d.limitedBy).toBe('winding');
    // reference: 10 ms steps of the exact network under the losses at each step's start
    // (first order in the step; common practice (no source))
    const T = new Float64Array([d.start.windingTemp_C, d.start.statorTemp_C]);
    let t = 0;
    while (T[0]! < 155 && t < 600) {
      const lp = solveLossPoint(machineAt(p.machine20, T[0]!, T[1]! + 10, p.conditions.magnetTempCoeff), p.peak, ci, to.speed_rad_s, to.torque_Nm);
      stepTemperatures(net, T, lp.losses.copper_W, lp.losses.iron_W, 300, 0.01);
      t += 0.01;
    }
    expect(t).toBeLessThan(600);
    expect(Math.abs(d.duration_s - t)).toBeLessThan(0.05);
  });

  it('refuses a continuous point without a steady state, naming it', () => {
    const w = rpm(2000);
    expect(refusal(() => peakDuration(tmOf(), NET, p.peak, p.continuous, c, { speed_rad_s: w, torque_Nm: 400 }, { speed_rad_s: w, torque_Nm: 100 })).field).toBe('from');
    expect(refusal(() => peakDurationCurve(tmOf(), NET, p.peak, p.continuous, c, { speed_rad_s: w, torque_Nm: 40 }, w, 0)).field).toBe('torques');
  });
});
