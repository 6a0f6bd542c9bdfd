// What a Monte Carlo run says (src/core/reports/tolerance-statistics.ts): Spearman's rank correlation
// against the worked example of Spearman's rho (IQ against hours of television, ten people, rho =
// -29/165; Wikipedia, "Spearman's rank correlation coefficient"; from memory), mean ranks for ties
// (common practice, no source), histograms and pass fractions.
import { describe, expect, it } from 'vitest';
import { histogram, monteCarloSummary, rankCorrelation, ranks } from '../src/core/reports/tolerance-statistics';
import type { SampleChunk } from '../src/core/project/tolerance-sample';
import type { ToleranceParameter } from '../src/core/project/tolerance-apply';

describe('tolerance statistics', () => {
  it("Spearman's rho of the worked example: -29/165", () => {
    const iq = [106, 100, 86, 101, 99, 103, 97, 113, 112, 110];
    const tv = [7, 27, 2, 50, 28, 29, 20, 12, 6, 17];
    expect(rankCorrelation(iq, tv)).toBeCloseTo(-29 / 165, 12);
  });

  it('monotone relations give +1 and -1; a constant column gives null; ties take their mean rank', () => {
    const x = [1, 2, 3, 4, 5, 6];
    expect(rankCorrelation(x, x.map((v) => v ** 3))).toBeCloseTo(1, 15);
    expect(rankCorrelation(x, x.map((v) => Math.exp(-v)))).toBeCloseTo(-1, 15);
    expect(rankCorrelation(x, x.map(() => 2))).toBeNull();
    expect(Array.from(ranks([10, 20, 20, 30]))).toEqual([1, 2.5, 2.5, 4]);
  });

  it('histogram: equal bins from the least to the greatest value, every value counted once', () => {
    const h = histogram([0, 1, 2, 3, 4, 5, 6, 7, 8, 10], 5);
    expect(h.edges).toEqual([0, 2, 4, 6, 8, 10]);
    expect(h.counts).toEqual([2, 2, 2, 2, 2]);
    expect(histogram([3, 3, 3])).toEqual({ edges: [3, 3], counts: [3] });
  });

  it('pass fractions per requirement and for all, with the binomial standard error, and sensitivities', () => {
    const c: SampleChunk = { from: 0, count: 4, k: 1, nReq: 2, values: Float64Array.from([1, 2, 3, 4]), margins: Float64Array.from([-1, 5, 0, 5, 1, 5, 2, 5]), met: Uint8Array.from([0, 1, 1, 1, 1, 0, 1, 1]) };
    const ps = [{ path: 'motor.psiM', nominal: 2.5, min: 1, max: 4, unit: 'Wb' }] as ToleranceParameter[];
    const s = monteCarloSummary(c, ps, ['a', 'b'], 4);
    expect(s.samples).toBe(4);
    expect(s.requirements[0]!.fraction).toBe(0.75);
    expect(s.requirements[1]!.fraction).toBe(0.75);
    expect(s.allMet.fraction).toBe(0.5);
    expect(s.allMet.standardError).toBeCloseTo(0.25, 15);
    expect(s.requirements[0]!.sensitivity['motor.psiM']).toBeCloseTo(1, 15);
    expect(s.requirements[1]!.sensitivity['motor.psiM']).toBeNull();
    expect(s.requirements[0]!.margin).toMatchObject({ min: -1, mean: 0.5, max: 2 });
    expect(s.requirements[0]!.margin.histogram.counts).toEqual([1, 1, 1, 1]);
  });
});
