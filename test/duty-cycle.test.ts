import { describe, expect, it } from 'vitest';
import { machineAt } from '../src/core/machine/thermal';
import { steadyTemperatures } from '../src/core/machine/thermal-network';
import { solveLossPoint } from '../src/core/steady-state/loss-point';
import { evaluateDutyCycle, type DutyCycleOptions } from '../src/core/simulation/duty-cycle';
import { rmsTorque } from '../src/core/simulation/duty-cycle-spec';
import type { DutyCycleSpec } from '../src/core/simulation/duty-cycle-spec';
import { alphaBr, conditions, project, sampledCycle, temperatureModel, THERMAL } from './duty-cycle-fixtures';

const rpm = (n: number) => (n * Math.PI) / 30;
const run = (s: DutyCycleSpec, o: DutyCycleOptions = {}) => evaluateDutyCycle(s, THERMAL, temperatureModel(), conditions, project.peak, o)!;

// motoring, field weakening and braking, inside the envelope
const MIXED = sampledCycle([[0, 0, 0], [5, 3000, 150], [20, 3000, 150], [25, 6000, 60], [40, 6000, -60], [45, 1000, -100], [55, 0, 0], [60, 0, 0]], 0.05);

/** trapezoid of per-instant values */
function trapz(t: Float64Array, f: (k: number) => number): number {
  let s = 0;
  for (let k = 0; k + 1 < t.length; k++) s += 0.5 * (t[k + 1]! - t[k]!) * (f(k) + f(k + 1));
  return s;
}

describe('duty cycle', () => {
  for (const solve of ['every-instant', 'adaptive'] as const) {
    it(`${solve}: energy balance over the cycle, DC link = shaft + losses, and heat stored = copper + iron - heat removed, to 1e-6 (conservation of energy, common practice (no source))`, () => {
      const r = run(MIXED, { solve });
      expect(r.converged).toBe(true);
      expect(r.verdict.status).toBe('within-limits');
      const a = r.traces, t = r.t_s;
      const dc = trapz(t, (k) => a.dcPower_W[k]!), shaft = trapz(t, (k) => r.torque_Nm[k]! * rpm(r.speed_rpm[k]!));
      const cu = trapz(t, (k) => a.copper_W[k]!), fe = trapz(t, (k) => a.iron_W[k]!);
      const losses = cu + fe + trapz(t, (k) => a.mechanical_W[k]! + a.inverter_W[k]!);
      expect(Math.abs(dc - shaft - losses) / Math.abs(dc)).toBeLessThan(1e-6);
      expect(Math.abs(r.energies.balanceResidual)).toBeLessThan(1e-6);
      const N = t.length;
      const stored = THERMAL.windingCapacity_J_per_K * (a.winding_C[N - 1]! - r.start_C[0]) + THERMAL.statorCapacity_J_per_K * (a.stator_C[N - 1]! - r.start_C[1]);
      expect(Math.abs(stored - (cu + fe - r.energies.heatRemoved_J)) / (cu + fe)).toBeLessThan(1e-6);
      expect(Math.abs(r.energies.heatResidual)).toBeLessThan(1e-6);
      expect(r.energies.dcLink_J / dc).toBeCloseTo(1, 12);
      // braking returns energy: the shaft energy is below the motoring part
      expect(r.energies.shaft_J).toBeLessThan(trapz(t, (k) => Math.max(0, r.torque_Nm[k]! * rpm(r.speed_rpm[k]!))));
      expect(r.rmsTorque_Nm).toBe(rmsTorque(MIXED));
    });
  }

  it('adaptive knots agree with solving every instant: losses interpolated to 1e-3 relative move the temperature rises by at most 1e-3 of themselves, energies and RMS current by 1e-3 (a network linear in its losses, common practice (no source))', () => {
    const ex = run(MIXED, { solve: 'every-instant', tolerance_K: 1e-4 }), ad = run(MIXED, { tolerance_K: 1e-4 });
    expect(ad.solves.last).toBeLessThan(ex.solves.last / 3);
    const bound = 1e-3 * (ex.peaks.winding.value - THERMAL.coolantTemp_C);
    let worst = 0;
    for (const k of ['winding_C', 'stator_C'] as const) {
      for (let i = 0; i < ex.t_s.length; i++) worst = Math.max(worst, Math.abs(ad.traces[k][i]! - ex.traces[k][i]!));
    }
    expect(worst).toBeLessThan(bound);
    expect(worst).toBeGreaterThan(0); // the knots do interpolate
    for (const k of ['dcLink_J', 'copper_J', 'iron_J', 'inverter_J'] as const) expect(Math.abs(ad.energies[k] / ex.energies[k] - 1), k).toBeLessThan(1e-3);
    expect(Math.abs(ad.rmsCurrent_A / ex.rmsCurrent_A - 1)).toBeLessThan(1e-3);
    expect(Math.abs(ad.peakCurrent.value / ex.peakCurrent.value - 1)).toBeLessThan(1e-3);
  });

  it('a constant cycle ends at the coupled steady state (steadyTemperatures iterated with the loss point at its temperatures; fixed-point iteration, common practice (no source))', () => {
    const n = 3000, Ts = 100;
    const T = new Float64Array([40, 40]);
    for (let it = 0; it < 200; it++) {
      const lp = solveLossPoint(machineAt(project.machine20, T[0]!, T[1]! + THERMAL.magnetAboveStator_K, alphaBr), project.peak, conditions, rpm(n), Ts);
      const w0 = T[0]!;
      steadyTemperatures(THERMAL, lp.losses.copper_W, lp.losses.iron_W, n, T);
      if (Math.abs(T[0]! - w0) < 1e-10) break;
    }
    const s = sampledCycle([[0, n, Ts], [300, n, Ts]], 1);
    const tight = run(s, { tolerance_K: 1e-6 });
    const N = tight.t_s.length;
    expect(tight.converged).toBe(true);
    expect(Math.abs(tight.traces.winding_C[N - 1]! - T[0]!)).toBeLessThan(1e-4);
    expect(Math.abs(tight.traces.stator_C[N - 1]! - T[1]!)).toBeLessThan(1e-4);
    expect(Math.abs(tight.peaks.magnet.value - (T[1]! + 10))).toBeLessThan(1e-4);
    const dflt = run(s);
    expect(Math.abs(dflt.traces.winding_C[N - 1]! - T[0]!)).toBeLessThan(0.1);
    expect(dflt.repeats).toBeLessThanOrEqual(4);
  });

  it('the extrapolated periodic state equals plain repetition within the 0.1 K rule, in fewer repeats (common practice (no source))', () => {
    const s = sampledCycle([[0, 0, 0], [5, 4000, 120], [60, 4000, 120], [65, 0, 0], [300, 0, 0]], 0.1);
    const plain = run(s, { periodic: 'repeat' }), fast = run(s);
    expect(run(s, { periodic: 'repeat', maxRepeats: 2 }).converged).toBe(false);
    expect(plain.converged && fast.converged).toBe(true);
    expect(plain.lastChange_K).toBeLessThan(0.1);
    expect(fast.repeats).toBeLessThan(plain.repeats);
    const N = s.t_s.length;
    for (let k = 0; k < N; k += 50) {
      expect(Math.abs(fast.traces.winding_C[k]! - plain.traces.winding_C[k]!)).toBeLessThan(0.1);
      expect(Math.abs(fast.traces.stator_C[k]! - plain.traces.stator_C[k]!)).toBeLessThan(0.1);
    }
    expect(Math.abs(fast.peaks.winding.value - plain.peaks.winding.value)).toBeLessThan(0.1);
    // and it is nearer the periodic state (plain repetition to 1e-3 K) than plain repetition to 0.1 K is
    const periodic = run(s, { periodic: 'repeat', tolerance_K: 1e-3 });
    const off = (r: typeof fast) => Math.abs(r.traces.winding_C[N - 1]! - periodic.traces.winding_C[N - 1]!);
    expect(off(fast)).toBeLessThan(0.01);
    expect(off(fast)).toBeLessThan(off(plain) + 2e-3);
  });

  it('outside the envelope: the interval and the limit, and the verdict', () => {
    // 450 N·m is beyond the peak current at 500 rpm
    const s = sampledCycle([[0, 500, 0], [4, 500, 400], [6, 500, 400], [10, 500, 0], [30, 500, 0]], 0.02);
    const r = run(s, { solve: 'every-instant' });
    expect(r.verdict.status).toBe('outside-envelope');
    expect(r.outside.length).toBe(1);
    const o = r.outside[0]!;
    expect(o.limitedBy).toBe('current');
    expect(o.from_s).toBeGreaterThan(0.5);
    expect(o.from_s).toBeLessThan(4);
    expect(o.to_s).toBeGreaterThan(6);
    expect(o.peakCurrent_A).toBeGreaterThan(project.peak.Imax);
    // the edge: just before it the peak-limited solver holds the torque, at it not
    const k0 = Math.round(o.from_s / 0.02);
    const at = (k: number) => solveLossPoint(machineAt(project.machine20, r.traces.winding_C[k]!, r.traces.stator_C[k]! + 10, alphaBr), project.peak, conditions, rpm(500), s.torque_Nm[k]!).feasible;
    expect(at(k0 - 1)).toBe(true);
    expect(at(k0 + 1)).toBe(false);
    expect(r.verdict.text).toMatch(/outside the envelope in 1 interval, first .* \(current limit\)/);
    const ad = run(s);
    expect(Math.abs(ad.outside[0]!.from_s - o.from_s)).toBeLessThan(0.021);
    expect(Math.abs(ad.outside[0]!.to_s - o.to_s)).toBeLessThan(0.021);
  });

  it('a winding limit exceeded: when first and the peak', () => {
    const s = sampledCycle([[0, 1000, 60], [100, 1000, 60], [110, 1000, 240], [130, 1000, 240], [140, 1000, 60], [400, 1000, 60]], 0.1);
    const r = run(s);
    expect(r.verdict.status).toBe('limit-exceeded');
    const w = r.exceeded.find((e) => e.limit === 'winding')!;
    expect(w.max_C).toBe(155);
    expect(w.first_s).toBeGreaterThan(100);
    expect(w.first_s).toBeLessThan(w.peak.t_s);
    expect(w.peak.t_s).toBeGreaterThanOrEqual(130);
    expect(w.peak.value).toBe(r.peaks.winding.value);
    expect(r.verdict.text).toMatch(/^winding above its 155\.0 °C limit from/);
  });

  it('progress, and cancel by the signal or by the callback (every 4096 instants)', () => {
    const s = sampledCycle([[0, 0, 50], [60, 0, 50]], 0.01);
    const seen: number[] = [];
    const r = run(s, { onProgress: (f) => { seen.push(f); } });
    expect(r).not.toBeNull();
    expect(seen.some((f) => f > 0 && f < 1)).toBe(true);
    expect(seen[seen.length - 1]).toBe(1);
    expect(evaluateDutyCycle(s, THERMAL, temperatureModel(), conditions, project.peak, { signal: { aborted: true } })).toBeNull();
    expect(evaluateDutyCycle(s, THERMAL, temperatureModel(), conditions, project.peak, { onProgress: () => false })).toBeNull();
  });
});
