// The sensorless estimator in a run (angle-estimator-for.ts, angle-sensing.ts `steer`, watchdogs.ts
// AngleLockWatch, simulation-findings.ts) on the 48 V demo (invented numbers). The bounds are stated
// here from the run (common practice, no source): a matched observer holds the angle within 0.05 rad
// peak over the whole run (start-up blend, hand-over at 700 rpm, acceleration, load step) and 0.002 rad
// at the end.
import { describe, expect, it } from 'vitest';
import { demoJson } from './helpers';
import { loadProjectText } from '../src/core/project/project';
import { simulationFromProject } from '../src/core/project/simulation-from-project';
import { runSimulation, simulationFindings } from '../src/core/simulation/simulate';

function spm(angle: Record<string, unknown>) {
  const o = demoJson('demo-spm-48v');
  o.control.angle = { ...o.control.angle, ...angle }; // the demo's: 1000 Hz PLL, hand-over at 700 rpm
  return simulationFromProject(loadProjectText(JSON.stringify(o)));
}

describe('sensorless run (48 V demo, from standstill to 3000 rpm, 6 N·m load step at 0.2 s)', () => {
  it('matched parameters: start-up, hand-over and load step within 0.05 rad; reaches the reference; the validity finding', () => {
    const s = spm({});
    const r = runSimulation(s);
    expect(r.diagnostic).toBeUndefined();
    expect(r.metrics.angleErrorPeak_rad!).toBeLessThan(0.05);
    expect(r.metrics.angleErrorRms_rad!).toBeLessThan(0.01);
    const T = r.traces, n = T.t_s.length;
    let end = 0;
    for (let j = 0; j < n; j++) if (T.t_s[j]! > 0.35) end = Math.max(end, Math.abs(T.thetaError_rad![j]!));
    expect(end).toBeLessThan(0.002);
    expect(Math.abs(r.metrics.finalSpeed_rpm! - 3000)).toBeLessThan(30);
    // no limit cycle at the end (the speed loop keeps a margin through the estimator, see estimator-loop.ts)
    let lo = Infinity, hi = -Infinity;
    for (let j = 0; j < n; j++) if (T.t_s[j]! > 0.33) { lo = Math.min(lo, T.speed_rpm[j]!); hi = Math.max(hi, T.speed_rpm[j]!); }
    expect(hi - lo).toBeLessThan(1);
    // the start-up: open loop at first (the rotor is at standstill, the estimate ramps), then the observer
    expect(r.metrics.loadStepDip_rpm!).toBeGreaterThan(0);
    const f = simulationFindings(r, s).find((x) => x.code === 'sensorless-low-speed');
    expect(f?.severity).toBe('info');
    expect(f?.message).toMatch(/hands over above it/);
  });
  it('a 60 % flux-linkage error loses the lock: the run stops with the diagnostic', () => {
    const r = runSimulation(spm({ fluxError_pct: 60 }));
    expect(r.diagnostic).toMatch(/loss of lock: the estimated rotor angle was more than 45\.0° electrical off the true angle for 10\.0 ms/);
    expect(r.events.some((e) => e.kind === 'divergence' && /loss of lock/.test(e.message))).toBe(true);
  });
  it('a run starting above the hand-over speed starts locked (no start-up)', () => {
    const o = spm({});
    const r = runSimulation({ ...o, initialSpeed_rad_s: (1000 * 2 * Math.PI) / 60, duration_s: 0.02 });
    expect(r.diagnostic).toBeUndefined();
    expect(r.metrics.angleErrorPeak_rad!).toBeLessThan(0.01);
  });
});
