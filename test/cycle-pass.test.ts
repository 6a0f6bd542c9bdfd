import { describe, expect, it } from 'vitest';
import { stepTemperatures } from '../src/core/machine/thermal-network';
import { kinksOf, newCyclePass, runPass } from '../src/core/simulation/cycle-pass';
import { cycleInstants } from '../src/core/simulation/duty-cycle-spec';
import { IL, instantLosses, newInstantLossScratch } from '../src/core/simulation/instant-losses';
import { conditions, project, sampledCycle, temperatureModel, THERMAL } from './duty-cycle-fixtures';

const rpm = (n: number) => (n * Math.PI) / 30;
const CYCLE = sampledCycle([[0, 0, 0], [4, 2000, 160], [12, 2000, 160], [16, 5000, 70], [25, 5000, -50], [30, 0, 0]], 0.05);

describe('one repeat of a duty cycle', () => {
  it('every instant: the loss point at the predicted temperatures, the network fed the trapezoid mean (the scheme as stated; common practice (no source))', () => {
    const x = cycleInstants(CYCLE);
    const cp = newCyclePass(x, project.peak, { adaptive: false, maxSpan: 1, tolerance: 1e-3, transition: false });
    const T = new Float64Array([70, 55]);
    const tm = temperatureModel();
    const o = runPass(cp, tm, THERMAL, conditions, T, new Float64Array(4), () => true);
    const a = cp.a, N = x.t_s.length;
    expect(o.completed).toBe(true);
    expect(o.solves).toBe(N);
    expect(a.solved.every((s) => s === 1)).toBe(true);
    expect(T[0]).toBe(a.winding_C[N - 1]);
    const tm2 = temperatureModel(), sc = newInstantLossScratch(tm2, THERMAL, conditions, project.peak);
    for (const k of [0, 40, 100, 250, 400, 550]) {
      const dt = x.t_s[k + 1]! - x.t_s[k]!;
      const P = new Float64Array([a.winding_C[k]!, a.stator_C[k]!]);
      stepTemperatures(THERMAL, P, a.copper_W[k]!, a.iron_W[k]!, x.speed_rpm[k]!, dt);
      const r = instantLosses(sc, rpm(x.speed_rpm[k + 1]!), x.torque_Nm[k + 1]!, P[0]!, P[1]!, a.lossTorque_Nm[k]!);
      expect(Math.abs(r[IL.copper]! / a.copper_W[k + 1]! - 1)).toBeLessThan(1e-8);
      const U = new Float64Array([a.winding_C[k]!, a.stator_C[k]!]);
      stepTemperatures(THERMAL, U, 0.5 * (a.copper_W[k]! + a.copper_W[k + 1]!), 0.5 * (a.iron_W[k]! + a.iron_W[k + 1]!), 0.5 * (x.speed_rpm[k]! + x.speed_rpm[k + 1]!), dt);
      expect(U[0]).toBe(a.winding_C[k + 1]);
      expect(U[1]).toBe(a.stator_C[k + 1]);
      // the predictor's stated bound per node: |dP| dt / (2 C)
      const dPw = Math.abs(a.copper_W[k + 1]! - a.copper_W[k]!), dPs = Math.abs(a.iron_W[k + 1]! - a.iron_W[k]!);
      expect(Math.abs(P[0]! - U[0]!)).toBeLessThanOrEqual(((dPw + dPs) * dt) / (2 * THERMAL.windingCapacity_J_per_K) + 1e-12);
    }
  });

  it('adaptive: far fewer solves, interpolated instants on the chord between knots, and DC power = shaft + losses there', () => {
    const x = cycleInstants(CYCLE);
    const cp = newCyclePass(x, project.peak, { adaptive: true, maxSpan: 40, tolerance: 1e-3, transition: false });
    const o = runPass(cp, temperatureModel(), THERMAL, conditions, new Float64Array([40, 40]), new Float64Array(4), () => true);
    const a = cp.a, N = x.t_s.length;
    expect(o.solves).toBeLessThan(N / 2);
    let knot = 0, checked = 0;
    for (let k = 1; k < N; k++) {
      if (a.solved[k] !== 1) continue;
      for (let j = knot + 1; j < k; j++) {
        const f = (x.t_s[j]! - x.t_s[knot]!) / (x.t_s[k]! - x.t_s[knot]!);
        expect(a.copper_W[j]).toBeCloseTo(a.copper_W[knot]! + f * (a.copper_W[k]! - a.copper_W[knot]!), 9);
        const sum = a.copper_W[j]! + a.iron_W[j]! + a.mechanical_W[j]! + a.inverter_W[j]!;
        expect(a.dcPower_W[j]).toBeCloseTo(x.torque_Nm[j]! * rpm(x.speed_rpm[j]!) + sum, 6);
        checked++;
      }
      knot = k;
    }
    expect(checked).toBeGreaterThan(N / 2);
  });

  it("carries the network's own transition over the repeat (constant resistances: exp(A t_cycle); matrix exponential composes, common practice (no source))", () => {
    const x = cycleInstants(CYCLE);
    const cp = newCyclePass(x, project.peak, { adaptive: true, maxSpan: 40, tolerance: 1e-3, transition: true });
    const phi = new Float64Array(4);
    runPass(cp, temperatureModel(), THERMAL, conditions, new Float64Array([40, 40]), phi, () => true);
    const Tc = THERMAL.coolantTemp_C, e1 = new Float64Array([Tc + 1, Tc]), e2 = new Float64Array([Tc, Tc + 1]);
    stepTemperatures(THERMAL, e1, 0, 0, 0, 30);
    stepTemperatures(THERMAL, e2, 0, 0, 0, 30);
    expect(phi[0]).toBeCloseTo(e1[0]! - Tc, 12);
    expect(phi[2]).toBeCloseTo(e1[1]! - Tc, 12);
    expect(phi[1]).toBeCloseTo(e2[0]! - Tc, 12);
    expect(phi[3]).toBeCloseTo(e2[1]! - Tc, 12);
  });

  it('stops when tick says so', () => {
    const x = cycleInstants(sampledCycle([[0, 0, 20], [50, 0, 20]], 0.01));
    const cp = newCyclePass(x, project.peak, { adaptive: true, maxSpan: 100, tolerance: 1e-3, transition: false });
    const ks: number[] = [];
    const o = runPass(cp, temperatureModel(), THERMAL, conditions, new Float64Array([40, 40]), new Float64Array(4), (k) => { ks.push(k); return false; });
    expect(o.completed).toBe(false);
    expect(ks.length).toBe(1);
    expect(ks[0]).toBeGreaterThanOrEqual(4096);
  });

  it('kinks: where the speed or torque changes slope (on a sample, or on both sides of a breakpoint between samples); none for noisy data', () => {
    // breakpoints at 4 s and 12 s fall on samples of 0.05 s; the one at 16.02 s between two
    const x = cycleInstants(sampledCycle([[0, 0, 0], [4, 2000, 160], [12, 2000, 160], [16.02, 5000, 70], [30, 5000, 70]], 0.05));
    const { kink, nextKink } = kinksOf(x);
    const at = [...kink].flatMap((v, k) => (v === 1 ? [x.t_s[k]!] : []));
    expect(at.map((v) => Math.round(v * 100) / 100)).toEqual([4, 12, 16, 16.05]);
    expect(nextKink[0]).toBe(80);
    expect(nextKink[80]).toBe(240);
    expect(nextKink[x.t_s.length - 2]).toBe(x.t_s.length - 1);
    const noisy = cycleInstants(sampledCycle([[0, 1000, 50], [10, 1000, 50]], 0.01));
    for (let k = 0; k < noisy.torque_Nm.length; k++) noisy.torque_Nm[k]! += Math.sin(k * 1.7) * 0.5;
    expect(kinksOf(noisy).kink.every((v) => v === 0)).toBe(true);
  });

  it('adaptive with a knot at each kink: the knots of a cycle of straight pieces include every kink', () => {
    const x = cycleInstants(CYCLE);
    const cp = newCyclePass(x, project.peak, { adaptive: true, maxSpan: 100, tolerance: 1e-3, transition: false });
    runPass(cp, temperatureModel(), THERMAL, conditions, new Float64Array([40, 40]), new Float64Array(4), () => true);
    for (let k = 0; k < x.t_s.length; k++) if (cp.kink[k] === 1) expect(cp.a.solved[k], `${x.t_s[k]} s`).toBe(1);
    expect([...cp.kink].filter((v) => v === 1).length).toBe(4);
  });
});
