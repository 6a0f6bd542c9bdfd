// The Tolerances view's pure parts (src/renderer/src/views/tolerances/tolerance-figures.ts and
// src/renderer/src/state/sample-run.ts): the corner table ranked with the binding corner first, the
// pass-fraction rows, the margin histograms and the sensitivity heat table, and the chunking of a
// Monte Carlo run between workers (the joined run the same whatever the number of workers and the
// order the chunks come back in). On an invented surface-magnet motor whose low-speed torque is
// 3/2 p psiM Imax, linear in both toleranced parameters.
import { describe, expect, it } from 'vitest';
import { linearSpm, parsed } from './tolerance-fixtures';
import { toleranceCorners } from '../src/core/project/tolerance-corners';
import { toleranceParameters } from '../src/core/project/tolerance-apply';
import { joinChunks, runSampleChunk, type SampleChunk } from '../src/core/project/tolerance-sample';
import { monteCarloSummary } from '../src/core/reports/tolerance-statistics';
import type { MonteCarloSettings } from '../src/core/project/tolerance-schema';
import { CURVE, type PlotTheme } from '../src/renderer/src/components/plot-style';
import { bandsCaption, cornerRows, marginHistogramFigure, passRows, sensitivityFigure, sensitivityMatrix, shortPath } from '../src/renderer/src/views/tolerances/tolerance-figures';
import { chunkPlan, MAX_WORKERS, SAMPLES_PER_CHUNK, workerCount } from '../src/renderer/src/state/sample-run';

const theme: PlotTheme = { ink: '#111111', muted: '#666666', line: '#dddddd', panel: '#ffffff', bg: '#f5f5f5', ok: '#2e7d32', bad: '#b3261e', dark: false };
// p = 4, psiM 0.02 Wb, Imax 100 A: 3/2 p psiM Imax = 12 N·m at low speed (Ld = Lq: no reluctance torque;
// Krause, Wasynczuk, Sudhoff (2002), Analysis of Electric Machinery and Drive Systems, the PMSM torque)
const torque = (psiM: number, imax: number): number => 1.5 * 4 * psiM * imax;

describe('corner rows', () => {
  const file = parsed(linearSpm({ 'motor.psiM': { minus_pct: 10, plus_pct: 10 }, 'inverter.Imax': { minus_pct: 10, plus_pct: 10 } }));
  const r = toleranceCorners(file);
  const rows = cornerRows(r, [10]);
  it('the binding corner first: both parameters at their lower ends, the analytic worst case', () => {
    expect(rows).toHaveLength(4);
    expect(rows[0]!.binding).toBe(true);
    expect(rows[0]!.index).toBe(r.bindingCorner);
    expect(rows[0]!.values[0]).toBeCloseTo(0.018, 12);
    expect(rows[0]!.values[1]).toBeCloseTo(90, 9);
    // 3/2 p psiM Imax - 10 N·m at the lowest corner: 9.72 - 10 (source as above)
    expect(rows[0]!.requirements[0]!.margin_Nm).toBeCloseTo(torque(0.018, 90) - 10, 6);
    expect(rows[0]!.requirements[0]!.met).toBe(false);
    expect(rows[0]!.met).toBe(false);
  });
  it('the rest by their least relative margin, each margin the analytic one', () => {
    for (let i = 1; i < rows.length; i++) expect(rows[i]!.worstRelative).toBeGreaterThanOrEqual(rows[i - 1]!.worstRelative);
    for (const row of rows) {
      expect(row.requirements[0]!.margin_Nm).toBeCloseTo(torque(row.values[0]!, row.values[1]!) - 10, 6);
      expect(row.worstRelative).toBeCloseTo((torque(row.values[0]!, row.values[1]!) - 10) / 10, 6);
    }
    expect(rows[3]!.requirements[0]!.margin_Nm).toBeCloseTo(torque(0.022, 110) - 10, 6);
  });
});

describe('Monte Carlo: chunks between workers, pass rows and figures', () => {
  // psiM uniform over +-20 %: met where 6 psiM 100 >= 10, psiM >= 1/60 Wb, a fraction (0.024 - 1/60) / 0.008 of the band
  const file = parsed(linearSpm({ 'motor.psiM': { minus_pct: 20, plus_pct: 20 }, 'inverter.Imax': { minus_pct: 0.001, plus_pct: 0.001 }, monteCarlo: { samples: 400, seed: 7, distribution: 'uniform' } }));
  const params = toleranceParameters(file);
  const mc = (file.tolerances as { monteCarlo: MonteCarloSettings }).monteCarlo;
  const whole = runSampleChunk(file, params, mc, 0, mc.samples, { thermal: false });

  it('chunkPlan covers the run once, in order; workerCount caps the workers by the chunks', () => {
    const plan = chunkPlan(60);
    expect(plan).toEqual([{ from: 0, count: 25 }, { from: 25, count: 25 }, { from: 50, count: 10 }]);
    expect(chunkPlan(400).reduce((n, c) => n + c.count, 0)).toBe(400);
    expect(SAMPLES_PER_CHUNK).toBe(25);
    expect(workerCount(8, 3)).toBe(3);
    expect(workerCount(0, 3)).toBe(1);
    expect(workerCount(99, 1000)).toBe(MAX_WORKERS);
  });

  it('the same joined run with 1, 2 and 3 workers, whatever order the chunks come back in (seeded per sample)', () => {
    const plan = chunkPlan(mc.samples);
    for (const workers of [1, 2, 3]) {
      // worker w takes chunks w, w + workers, ...; they arrive worker by worker, the last worker first
      const arrived: SampleChunk[] = [];
      for (let w = workers - 1; w >= 0; w--) for (let j = w; j < plan.length; j += workers) arrived.push(runSampleChunk(file, params, mc, plan[j]!.from, plan[j]!.count, { thermal: false }));
      const joined = joinChunks(arrived);
      // issue 16 (common practice (no source)): identical bit for bit, not merely close
      expect(Array.from(joined.values)).toEqual(Array.from(whole.values));
      expect(Array.from(joined.margins)).toEqual(Array.from(whole.margins));
      expect(Array.from(joined.met)).toEqual(Array.from(whole.met));
    }
  });

  const s = monteCarloSummary(whole, params, ['low-speed thrust']);
  it('pass rows: each point and every point, in %, within 3 standard errors of the analytic fraction', () => {
    const rows = passRows(s);
    expect(rows.map((r) => r.label)).toEqual(['low-speed thrust', 'every point']);
    const exact = (0.024 - 1 / 60) / 0.008;
    const se = Math.sqrt((exact * (1 - exact)) / 400);
    // binomial sampling error, 3 sigma (common practice (no source))
    expect(Math.abs(rows[0]!.pct / 100 - exact)).toBeLessThan(3 * se);
    expect(rows[1]!.pct).toBe(rows[0]!.pct);
    expect(rows[0]!.sePct).toBeCloseTo(100 * Math.sqrt((rows[0]!.pct / 100) * (1 - rows[0]!.pct / 100) / 400), 12);
    expect(rows[0]!.leastMargin_Nm).toBeCloseTo(s.requirements[0]!.margin.min, 12);
    expect(Number.isNaN(rows[1]!.meanMargin_Nm)).toBe(true);
  });

  it('margin histograms: one per point, every sample counted, red bars below zero margin and a line at zero', () => {
    const f = marginHistogramFigure(s, theme, CURVE.light);
    expect(f.data).toHaveLength(1);
    const bar = f.data[0] as { x: number[]; y: number[]; marker: { color: string[] } };
    expect(bar.y.reduce((a, b) => a + b, 0)).toBe(400);
    bar.x.forEach((x, i) => expect(bar.marker.color[i]).toBe(x < 0 ? CURVE.light.hot : CURVE.light.cold));
    // margins from 6 x 0.016 x 100 - 10 = -0.4 to 6 x 0.024 x 100 - 10 = 4.4 N·m: zero lies inside, its line drawn
    expect(s.requirements[0]!.margin.min).toBeLessThan(0);
    expect((f.layout as { shapes: Array<{ x0: number }> }).shapes).toHaveLength(1);
    expect((f.layout as { shapes: Array<{ x0: number }> }).shapes[0]!.x0).toBe(0);
    // the bands as the figure's caption, kept in its exported image
    const cap = bandsCaption(params, (x) => String(Number(x.toPrecision(8))));
    expect(cap).toBe('bands: psiM 0.016–0.024 Wb, Imax 99.999–100.001 A');
    const g = marginHistogramFigure(s, theme, CURVE.light, cap);
    expect((g.layout as { annotations: Array<{ text: string }> }).annotations.map((a) => a.text)).toContain(cap);
  });

  it('sensitivity heat table: the margin rises with psiM in every sample, rank correlation 1', () => {
    const m = sensitivityMatrix(s, params.map((p) => p.path));
    expect(m.columns).toEqual(['motor.psiM', 'inverter.Imax']);
    // a strictly increasing relation has Spearman's rank correlation 1 (Spearman (1904), The proof and measurement of association between two things)
    expect(m.z[0]![0]).toBeCloseTo(1, 12);
    expect(Math.abs(m.z[0]![1]!)).toBeLessThan(0.3);
    const f = sensitivityFigure(s, m.columns, theme);
    const h = f.data[0] as { x: string[]; text: string[][]; zmin: number; zmax: number };
    expect(h.x).toEqual(['psiM', 'Imax']);
    expect(h.text[0]![0]).toBe('1.00');
    expect([h.zmin, h.zmax]).toEqual([-1, 1]);
    expect(shortPath('nameplate.Ke')).toBe('Ke');
  });
});
