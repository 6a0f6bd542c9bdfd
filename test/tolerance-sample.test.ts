// Monte Carlo samples of a tolerance study (src/core/project/tolerance-sample.ts). With zero bands
// every sample is the nominal file; with one parameter uniform over its band the fraction of samples
// meeting a point converges to the analytic fraction within the binomial sampling error (3 standard
// errors, sqrt(f (1 - f) / N): common practice, no source), the point's torque being 3/2 p psiM Imax
// (Krishnan (2010), "Permanent Magnet Synchronous and Brushless DC Motor Drives"; from memory).
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { parseProject } from '../src/core/project/schema';
import { toleranceParameters, tolerancesOf } from '../src/core/project/tolerance-apply';
import { joinChunks, runSampleChunk, sampleValues } from '../src/core/project/tolerance-sample';
import { resolveProject } from '../src/core/project/project';
import { sizeDrive } from '../src/core/steady-state/sizing';
import { linearSpm } from './tolerance-fixtures';

describe('Monte Carlo samples', () => {
  it('zero bands: every sample gives the nominal verdicts and margins (as the size command, hot and cold)', () => {
    const j = JSON.parse(readFileSync(join(__dirname, '..', 'resources', 'demo-servo-axis.json'), 'utf8'));
    for (const k of Object.keys(j.tolerances)) if (k !== 'monteCarlo') j.tolerances[k] = { minus_pct: 0, plus_pct: 0 };
    const f = parseProject(j);
    const ps = toleranceParameters(f);
    const mc = { ...tolerancesOf(f)!.monteCarlo, samples: 40, distribution: 'normal' as const };
    const c = runSampleChunk(f, ps, mc, 0, 40, { thermal: false });
    const p = resolveProject(f);
    const hot = sizeDrive(p.models.hot, p.inverter, p.requirements, p.currentLimits), cold = sizeDrive(p.models.cold, p.inverter, p.requirements, p.currentLimits);
    const met = hot.points.map((q, k) => (q.met && cold.points[k]!.met ? 1 : 0));
    const margin = hot.points.map((q, k) => Math.min(Math.abs(q.torqueAvailable_Nm), Math.abs(cold.points[k]!.torqueAvailable_Nm)) - Math.abs(q.torque_Nm));
    for (let s = 0; s < 40; s++) {
      expect(Array.from(c.met.subarray(s * c.nReq, (s + 1) * c.nReq))).toEqual(met);
      expect(Array.from(c.margins.subarray(s * c.nReq, (s + 1) * c.nReq))).toEqual(margin);
    }
  });

  it('one uniform band: the pass fraction converges to the analytic fraction within 3 standard errors', () => {
    // Imax uniform on [80, 120] A; the point needs 3/2 p psiM Imax >= 11 N·m: Imax >= 91.67 A, a fraction 0.7083
    const f = parseProject(linearSpm({ 'inverter.Imax': { minus_pct: 20, plus_pct: 20 }, monteCarlo: { seed: 5 } }, 11));
    const ps = toleranceParameters(f);
    const exact = (120 - 11 / (1.5 * 4 * 0.02)) / 40;
    for (const N of [250, 1000, 4000]) {
      const c = runSampleChunk(f, ps, { ...tolerancesOf(f)!.monteCarlo, samples: N }, 0, N, { thermal: false });
      const frac = c.met.reduce((a, b) => a + b, 0) / N;
      expect(Math.abs(frac - exact), `N ${N}`).toBeLessThan(3 * Math.sqrt((exact * (1 - exact)) / N));
      // each verdict agrees with the formula at the sample's own current limit
      for (let s = 0; s < N; s++) expect(c.met[s]).toBe(1.5 * 4 * 0.02 * c.values[s]! >= 11 ? 1 : 0);
    }
  });

  it('the samples do not depend on how they are split: chunks joined equal one run', () => {
    const f = parseProject(linearSpm({ 'inverter.Imax': { minus_pct: 20, plus_pct: 20 }, 'motor.psiM': { minus_pct: 5, plus_pct: 5 }, monteCarlo: { distribution: 'normal' } }, 11));
    const ps = toleranceParameters(f), mc = tolerancesOf(f)!.monteCarlo;
    const whole = runSampleChunk(f, ps, mc, 0, 60, { thermal: false });
    const parts = joinChunks([runSampleChunk(f, ps, mc, 37, 23, { thermal: false }), runSampleChunk(f, ps, mc, 0, 37, { thermal: false })]);
    expect(parts).toEqual(whole);
  });

  it('a normal draw stays inside its band, centred on the nominal value with sigma = sigmaOfBand x half band', () => {
    const f = parseProject(linearSpm({ 'motor.psiM': { minus_pct: 10, plus_pct: 10 }, monteCarlo: { distribution: 'normal', sigmaOfBand: 0.3 } }));
    const ps = toleranceParameters(f), mc = tolerancesOf(f)!.monteCarlo;
    const v = new Float64Array(1);
    let s = 0, s2 = 0;
    const N = 20_000;
    for (let i = 0; i < N; i++) {
      sampleValues(ps, mc, i, v);
      expect(v[0]! >= 0.018 - 1e-15 && v[0]! <= 0.022 + 1e-15).toBe(true);
      s += v[0]!; s2 += v[0]! ** 2;
    }
    expect(Math.abs(s / N - 0.02)).toBeLessThan(5 * 0.0006 / Math.sqrt(N));
    // truncation at 3.3 sigma changes the standard deviation by under 1 %
    expect(Math.sqrt(s2 / N - (s / N) ** 2) / 0.0006).toBeCloseTo(1, 1);
  });
});
