// Numeric guarantees of the simulator: absurd gains, runaway loads and non-finite states end the run
// early with a diagnostic naming the time and the state; nothing non-finite reaches the results.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { resolveProject } from '../src/core/project/project';
import { parseProject } from '../src/core/project/schema';
import { runSimulation, type SimulationResult, type SimulationSetup } from '../src/core/simulation/simulate';
import { simulationFromProject } from '../src/core/project/simulation-from-project';
import { DEMOS, DEMO_NAMES, nonFinite } from '../trust/fuzz-cases';

type Json = Record<string, any>;
const demo = (n: string): Json => structuredClone(DEMOS[n]) as Json;
const setupOf = (j: Json): SimulationSetup => simulationFromProject(resolveProject(parseProject(j)));
const DIAG = /^diverged at t = ([0-9.e+-]+) s: .*state id = (-?[0-9.e+-]+|not finite) A, iq = (-?[0-9.e+-]+|not finite) A, speed = (-?[0-9.e+-]+|not finite) rpm/;

function clean(r: SimulationResult): void {
  expect(nonFinite(r.traces)).toBeNull();
  expect(nonFinite(r.metrics)).toBeNull();
  for (const e of r.events) expect(e.message).not.toMatch(/\bNaN\b|Infinity/);
  if (r.diagnostic) expect(r.diagnostic).not.toMatch(/\bNaN\b|Infinity/);
}
const periods = (s: SimulationSetup): number => Math.round(s.duration_s * (1 / s.controller.Ts));

describe('simulator: divergence is detected, named and stopped', () => {
  for (const n of DEMO_NAMES) {
    it(`${n}: absurd current gains stop the run early with the time and the state`, () => {
      const j = demo(n);
      j.control = { ...j.control, currentBandwidth_Hz: undefined, currentKp: 1e6, currentKi: 1e10 };
      const s = setupOf(j);
      const r = runSimulation(s);
      const m = DIAG.exec(r.diagnostic ?? '');
      expect(m, r.diagnostic).not.toBeNull();
      const t = Number(m![1]);
      expect(t).toBeGreaterThan(0);
      expect(t).toBeLessThan(s.duration_s);
      expect(r.stats.controlSteps).toBeLessThan(periods(s) / 10);
      const ev = r.events.find((e) => e.kind === 'divergence')!;
      expect(ev.t_s).toBeCloseTo(t, 6);
      clean(r);
    });

    it(`${n}: a runaway load (1e6 N·m driving) stops at the divergence speed`, () => {
      const j = demo(n);
      j.scenario.loadSteps = [{ t_s: 0.02, torque_Nm: -1e6 }];
      const s = setupOf(j);
      const r = runSimulation(s);
      expect(r.diagnostic).toMatch(DIAG);
      expect(r.diagnostic).toMatch(/\|speed\| exceeded/);
      // it ends within a few periods of the load step
      expect(Number(DIAG.exec(r.diagnostic!)![1])).toBeLessThan(0.021);
      clean(r);
    });

    it(`${n}: a non-finite state ends the run at once, the diagnostic says which states and the last finite ones`, () => {
      const s = setupOf(demo(n));
      s.initialSpeed_rad_s = 1e308; // the first derivative overflows
      const r = runSimulation(s);
      expect(r.stats.controlSteps).toBe(1);
      expect(r.diagnostic).toMatch(/non-finite/);
      expect(r.diagnostic).toMatch(DIAG);
      expect(r.diagnostic).toMatch(/speed = not finite/);
      clean(r);
    });
  }

  it('60 random gain sets (fixed seed) on the servo demo: every run ends, finite results, diagnostics well formed', () => {
    const gains = fc.record({
      cKp: fc.double({ min: 1e-3, max: 1e6, noNaN: true }),
      cKi: fc.double({ min: 1e-3, max: 1e10, noNaN: true }),
      sKp: fc.double({ min: 1e-6, max: 1e6, noNaN: true }),
      sKi: fc.double({ min: 1e-6, max: 1e9, noNaN: true }),
      delay: fc.integer({ min: 0, max: 10 }),
    });
    let diverged = 0;
    for (const g of fc.sample(gains, { seed: 77, numRuns: 60 })) {
      const j = demo('demo-servo-axis');
      j.control = { ...j.control, currentBandwidth_Hz: undefined, speedBandwidth_Hz: undefined, speedTuning: undefined, currentKp: g.cKp, currentKi: g.cKi, speedKp: g.sKp, speedKi: g.sKi, delaySamples: g.delay };
      j.scenario = { ...j.scenario, duration_s: 0.02, speedSteps: [{ t_s: 0.002, speed_rpm: 1000 }], loadSteps: [{ t_s: 0.01, torque_Nm: 0.5 }] };
      const r = runSimulation(setupOf(j));
      clean(r);
      if (r.diagnostic) {
        diverged++;
        expect(r.diagnostic).toMatch(DIAG);
      }
    }
    // the sweep reaches both stable and unstable gains
    expect(diverged).toBeGreaterThan(5);
    expect(diverged).toBeLessThan(60);
  });
});
