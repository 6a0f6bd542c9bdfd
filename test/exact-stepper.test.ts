import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { loadProjectText } from '../src/core/project/project';
import { runSimulation, type SimulationResult, type AnySetup } from '../src/core/simulation/simulate';
import { simulationFromProject } from '../src/core/project/simulation-from-project';
import { MAX_TRACE_POINTS } from '../src/core/simulation/decimate';
import { Plant } from '../src/core/simulation/plant';
import { ExactStepper, makePeriodStepper } from '../src/core/simulation/exact-stepper';

// the demos with the true rotor angle (control.angle ideal): these checks are about the stepper, not the angle source
const demo = (f: string): any => {
  const o = JSON.parse(readFileSync(resolve(__dirname, '..', 'resources', `${f}.json`), 'utf8'));
  if (o.control) o.control.angle = { source: 'ideal' };
  return o;
};
const FULL = { maxPoints: MAX_TRACE_POINTS, wallBudget_s: 600 };

/**
 * Largest deviation of a run from a reference run, relative: the speed to the reference's largest
 * |speed|, the currents to the setup's Imax, the energy drawn to its final |value|.
 */
function deviation(a: SimulationResult, ref: SimulationResult, Imax: number): number {
  const n = ref.traces.t_s.length;
  expect(a.traces.t_s.length).toBe(n);
  let wMax = 0;
  for (let i = 0; i < n; i++) wMax = Math.max(wMax, Math.abs(ref.traces.speed_rpm[i]!));
  let e = 0;
  for (let i = 0; i < n; i++) {
    e = Math.max(e, Math.abs(a.traces.speed_rpm[i]! - ref.traces.speed_rpm[i]!) / wMax);
    e = Math.max(e, Math.abs(a.traces.id_A[i]! - ref.traces.id_A[i]!) / Imax, Math.abs(a.traces.iq_A[i]! - ref.traces.iq_A[i]!) / Imax);
  }
  const E = ref.metrics.energyFromBus_J!;
  return Math.max(e, Math.abs(a.metrics.energyFromBus_J! - E) / Math.abs(E));
}

/** the exact periods against ode45-cash-karp throughout (Cash and Karp (1990), ACM TOMS 16(3)), both at tol 1e-12 */
function compare(s: AnySetup): { dev: number; exact: SimulationResult } {
  const tight = { ...s, solver: { ...s.solver, tol: 1e-12, exactPeriods: true } };
  const exact = runSimulation(tight, FULL);
  const ref = runSimulation({ ...tight, solver: { ...tight.solver, exactPeriods: false } }, FULL);
  expect(exact.diagnostic).toBeUndefined();
  return { dev: deviation(exact, ref, s.Imax), exact };
}

describe('exact periods against ode45-cash-karp (the same trajectory to 1e-7)', () => {
  it('the constant-parameter demos: speed, currents and energy within 1e-7 of the Cash-Karp run', () => {
    for (const name of ['demo-ipm-traction', 'demo-spm-48v', 'demo-servo-axis']) {
      const s = simulationFromProject(loadProjectText(JSON.stringify(demo(name))));
      const plant = new Plant(s.plant);
      expect(makePeriodStepper(s, plant, new Float64Array(5))).toBeInstanceOf(ExactStepper); // on by default
      expect(makePeriodStepper({ ...s, solver: { ...s.solver, exactPeriods: true } }, plant, new Float64Array(5))).toBeInstanceOf(ExactStepper);
      const { dev, exact } = compare(s);
      expect(dev, name).toBeLessThan(1e-7);
      // most periods are exact: 1 derivative evaluation at the start and 2 at the nodes
      expect(exact.stats.evaluationsPerPeriod, name).toBe(3);
    }
  });

  it('a flux-map machine takes the Cash-Karp stepper throughout', () => {
    const s0 = simulationFromProject(loadProjectText(JSON.stringify(demo('demo-ipm-saturated'))));
    const s = { ...s0, solver: { ...s0.solver, exactPeriods: true } };
    expect((s.plant.machine as { linear?: unknown }).linear).toBeNull();
    expect(makePeriodStepper(s, new Plant(s.plant), new Float64Array(5))).not.toBeInstanceOf(ExactStepper);
    // and so does a constant-parameter machine with exactPeriods false or RK4
    const c = simulationFromProject(loadProjectText(JSON.stringify(demo('demo-spm-48v'))));
    expect(makePeriodStepper({ ...c, solver: { ...c.solver, exactPeriods: false } }, new Plant(c.plant), new Float64Array(5))).not.toBeInstanceOf(ExactStepper);
    expect(makePeriodStepper({ ...c, solver: { ...c.solver, method: 'rk4', exactPeriods: true } }, new Plant(c.plant), new Float64Array(5))).not.toBeInstanceOf(ExactStepper);
  });

  it('random machines (resistance, inductances, saliency, magnet flux, inertia) on the servo scenario', () => {
    let seed = 7;
    const r = (): number => ((seed = (seed * 16807) % 2147483647) / 2147483647);
    for (let k = 0; k < 4; k++) {
      const o = demo('demo-servo-axis');
      const Ld = 0.002 + 0.006 * r();
      o.motor = { ...o.motor, Rs: 0.2 + 2 * r(), Ld, Lq: Ld * (1 + 1.5 * r()), psiM: 0.06 + 0.08 * r(), inertia: 0.00005 + 0.0005 * r() };
      o.scenario = { ...o.scenario, duration_s: 0.06 };
      const { dev } = compare(simulationFromProject(loadProjectText(JSON.stringify(o))));
      expect(dev, JSON.stringify(o.motor)).toBeLessThan(1e-7);
    }
  });

  it('the run is deterministic: the same setup twice gives the same numbers', () => {
    const s0 = simulationFromProject(loadProjectText(JSON.stringify(demo('demo-spm-48v'))));
    const s = { ...s0, solver: { ...s0.solver, exactPeriods: true } };
    const a = runSimulation(s, FULL), b = runSimulation(s, FULL);
    expect(a.traces.speed_rpm).toEqual(b.traces.speed_rpm);
    expect(a.metrics).toEqual(b.metrics);
  });
});
