// No text of a library reaches a message: when the integrator library throws (its own words are
// "ode45-cash-karp::step() NaN encountered while integrating."), the run stops with our diagnostic
// naming the time and the state, like every other divergence. The library is wrapped here so that
// its step throws exactly that error in the middle of a run.
import { describe, expect, it, vi } from 'vitest';

const trip = { afterCalls: Infinity, calls: 0 };
vi.mock('ode45-cash-karp', async (importOriginal) => {
  const real = (await importOriginal<{ default: (...a: unknown[]) => { step(t?: number): boolean } }>()).default;
  return {
    default: (...a: unknown[]) => {
      const integ = real(...a);
      const step = integ.step.bind(integ);
      integ.step = (t?: number) => {
        if (++trip.calls > trip.afterCalls) throw new Error('ode45-cash-karp::step() NaN encountered while integrating.');
        return step(t);
      };
      return integ;
    },
  };
});

const { resolveProject } = await import('../src/core/project/project');
const { parseProject } = await import('../src/core/project/schema');
const { runSimulation } = await import('../src/core/simulation/simulate');
const { simulationFromProject } = await import('../src/core/project/simulation-from-project');
const { simulationReport } = await import('../src/cli/commands/simulate');
const { DEMOS } = await import('../trust/fuzz-cases');

describe('a library error inside the run', () => {
  it('gives our diagnostic with time and state, never the library\'s words, in the result, the events and the CLI text', () => {
    const p = resolveProject(parseProject(structuredClone(DEMOS['demo-servo-axis'])));
    // every period through the integrator library (the exact periods, on by default, call it only where they decline)
    const s0 = simulationFromProject(p);
    const setup = { ...s0, solver: { ...s0.solver, exactPeriods: false } };
    trip.calls = 0;
    trip.afterCalls = 500;
    const r = runSimulation(setup);
    trip.afterCalls = Infinity;
    expect(r.diagnostic).toMatch(/^diverged at t = [0-9.e+-]+ s: the integrator could not take a step \(its error estimate was not finite: a derivative grew without bound\); state id = -?[0-9.e+-]+ A, iq = -?[0-9.e+-]+ A, speed = -?[0-9.e+-]+ rpm \(check the gains, the delay and the scenario\)$/);
    const t = Number(/t = ([0-9.e+-]+) s/.exec(r.diagnostic!)![1]);
    expect(t).toBeGreaterThan(0);
    expect(t).toBeLessThan(setup.duration_s);
    const all = [r.diagnostic!, ...r.events.map((e) => e.message), ...simulationReport(p, setup, r).lines].join('\n');
    expect(all).not.toMatch(/ode45|cash-karp|NaN|encountered/);
  });
});
