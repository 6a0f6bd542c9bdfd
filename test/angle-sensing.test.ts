// The angle source in a run (src/core/simulation/angle-sensing.ts, wired in simulate.ts), on the
// servo demo (invented). Encoder quantisation error: uniform over one count, in (-p D, 0] electrical
// with D = 2 pi/(4 N) (common practice, no source); the tracking loop's lag under acceleration a/ki
// (the type II loop's steady error, see type2-pll.test.ts).
import { describe, expect, it } from 'vitest';
import { demoJson, messageOf } from './helpers';
import { loadProjectText } from '../src/core/project/project';
import { simulationFromProject } from '../src/core/project/simulation-from-project';
import { runSimulation, TRACE_NAMES, traceNamesOf } from '../src/core/simulation/simulate';
import { simulationCsv, simulationJson } from '../src/cli/commands/simulate';
import { MAX_TRACE_POINTS } from '../src/core/simulation/decimate';

function servo(angle?: unknown) {
  const o = demoJson('demo-servo-axis');
  // the demo carries an encoder: no argument = the section left out (the true angle)
  if (angle !== undefined) o.control.angle = angle; else delete o.control.angle;
  return simulationFromProject(loadProjectText(JSON.stringify(o)));
}

describe('angle source in the simulation', () => {
  it('ideal: the same run as without the section, no angle traces or metrics', () => {
    const a = runSimulation(servo());
    const b = runSimulation(servo({ source: 'ideal' }));
    expect(traceNamesOf(a.traces)).toEqual([...TRACE_NAMES]);
    expect('angleErrorRms_rad' in a.metrics).toBe(false);
    for (const k of TRACE_NAMES) expect(b.traces[k]).toEqual(a.traces[k]);
    expect(b.metrics).toEqual(a.metrics);
  });
  it('encoder: the angle error within one count (p D electrical), rms near p D/sqrt 3, the speed estimate follows the speed', () => {
    const N = 1024, p = 4, D = (2 * Math.PI) / (4 * N);
    const r = runSimulation(servo({ source: 'encoder', linesPerRev: N, speedWindowPeriods: 8 }));
    expect(r.diagnostic).toBeUndefined();
    expect(traceNamesOf(r.traces)).toEqual([...TRACE_NAMES, 'thetaError_rad', 'speedEstimate_rpm']);
    expect(r.metrics.angleErrorPeak_rad!).toBeLessThanOrEqual(p * D * (1 + 1e-9));
    expect(r.metrics.angleErrorPeak_rad!).toBeGreaterThan(0.9 * p * D);
    expect(r.metrics.angleErrorRms_rad! / ((p * D) / Math.sqrt(3))).toBeGreaterThan(0.8);
    expect(r.metrics.angleErrorRms_rad! / ((p * D) / Math.sqrt(3))).toBeLessThan(1.2);
    const n = r.traces.t_s.length;
    const last = r.traces.speed_rpm[n - 1]!;
    // a window of 8 periods at 16 kHz resolves 60/(4 N T) = 29.3 rpm; the speed loop holds the mean
    const res = 60 / ((4 * N * 8) / 16000);
    expect(Math.abs(r.traces.speedEstimate_rpm![n - 1]! - last)).toBeLessThan(res * 1.01);
    expect(Math.abs(r.metrics.finalSpeed_rpm! - 2000)).toBeLessThan(res);
  });
  it('encoder: the speed estimate\'s ripple at steady speed against the difference method\'s closed form, and the same figure from the full-rate traces', () => {
    // At a constant speed the count over a window of W periods is one of the two whole numbers about
    // the true count c (fraction f): the estimate is off by -f D with probability 1 - f and by
    // (1 - f) D with probability f, D = 60 / (4 N W Ts) rpm, so its rms is D sqrt(f (1 - f))
    // (derived here from the count's quantisation; common practice, no source). The closed speed loop
    // moves the speed by a few rpm about its mean, which moves f: within 15 %.
    for (const [N, W] of [[1024, 8], [1024, 16], [2048, 8]] as const) {
      const r = runSimulation(servo({ source: 'encoder', linesPerRev: N, speedWindowPeriods: W }), { maxPoints: MAX_TRACE_POINTS });
      expect(r.diagnostic).toBeUndefined();
      const Ts = 1 / 16000;
      const D = 60 / (4 * N * W * Ts);
      const c = (r.metrics.finalSpeed_rpm! / 60) * 4 * N * W * Ts;
      const f = c - Math.floor(c);
      const ripple = r.metrics.speedEstimateRipple_rpm!;
      expect(ripple / (D * Math.sqrt(f * (1 - f)))).toBeGreaterThan(0.85);
      expect(ripple / (D * Math.sqrt(f * (1 - f)))).toBeLessThan(1.15);
      // the same rms from the traces kept at every period start over the steady-state window (the run's last 5 %)
      const t = r.traces.t_s, n = t.length, t0 = t[n - 1]! - 0.05 * t[n - 1]!;
      let s2 = 0, k = 0;
      for (let i = 0; i < n; i++) if (t[i]! >= t0) { const e = r.traces.speedEstimate_rpm![i]! - r.traces.speed_rpm[i]!; s2 += e * e; k++; }
      expect(ripple).toBeCloseTo(Math.sqrt(s2 / k), 9);
    }
    // a tracking loop at a constant speed has no quantisation: its ripple is far below one count's
    const res = runSimulation(servo({ source: 'resolver', bandwidth_Hz: 1000, damping: 0.707 }));
    expect(res.metrics.speedEstimateRipple_rpm!).toBeLessThan(0.01);
  });
  it('encoder: a coarse count and a short window make the speed loop chatter until a watchdog stops it (a finding, not a crash)', () => {
    const r = runSimulation(servo({ source: 'encoder', linesPerRev: 512, speedWindowPeriods: 4 }));
    expect(r.diagnostic).toMatch(/current loop oscillates/);
    expect(r.traces.speedEstimate_rpm!.length).toBe(r.traces.t_s.length);
  });
  it('resolver: locked through the run; a tracking loop close to the 120 Hz speed loop slows it', () => {
    const fast = runSimulation(servo({ source: 'resolver', bandwidth_Hz: 1000, damping: 0.707 }));
    expect(fast.diagnostic).toBeUndefined();
    expect(fast.metrics.angleErrorPeak_rad!).toBeLessThan(0.05);
    expect(fast.metrics.angleErrorRms_rad!).toBeGreaterThan(0);
    expect(Math.abs(fast.metrics.finalSpeed_rpm! - 2000)).toBeLessThan(1);
    const slow = runSimulation(servo({ source: 'resolver', bandwidth_Hz: 300, damping: 0.707 }));
    expect(slow.metrics.angleErrorPeak_rad!).toBeGreaterThan(5 * fast.metrics.angleErrorPeak_rad!);
    expect(Math.abs(slow.metrics.finalSpeed_rpm! - 2000)).toBeGreaterThan(10);
  });
  it('the command line: angle columns and metrics only when the source is not ideal', () => {
    const o = { maxPoints: 50 };
    const ideal = runSimulation(servo(), o);
    const enc = runSimulation(servo({ source: 'encoder', linesPerRev: 1024, speedWindowPeriods: 8 }), o);
    expect(simulationCsv(ideal).split('\n')[0]).not.toMatch(/theta_error_rad/);
    expect(simulationCsv(enc).split('\n')[0]).toMatch(/,"theta_error_rad","speed_estimate_rpm"\r?$/);
    expect(Object.keys(simulationJson(ideal).metrics)).not.toContain('angleErrorRms_rad');
    const j = simulationJson(enc);
    expect(j.metrics.angleErrorPeak_rad).toBe(enc.metrics.angleErrorPeak_rad);
    expect(j.traces.thetaError_rad!.length).toBe(j.traces.t_s!.length);
  });
});
