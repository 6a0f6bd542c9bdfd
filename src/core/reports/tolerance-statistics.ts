/**
 * What a Monte Carlo run of a tolerance study says: the fraction of samples meeting each requirement
 * and all of them (with the binomial standard error sqrt(f (1 - f) / N)), the distribution of each
 * requirement's worst torque margin as a histogram, and the sensitivity of each margin to each
 * parameter as Spearman's rank correlation (Pearson's correlation of the ranks, ties given their
 * mean rank; null where either column is constant).
 */
import type { SampleChunk } from '../project/tolerance-sample';
import type { ToleranceParameter } from '../project/tolerance-apply';

/** Ranks 1..n of `x`, ties given the mean of their ranks. */
export function ranks(x: ArrayLike<number>): Float64Array {
  const n = x.length;
  const idx = Array.from({ length: n }, (_, i) => i).sort((a, b) => x[a]! - x[b]!);
  const r = new Float64Array(n);
  for (let i = 0; i < n; ) {
    let j = i;
    while (j + 1 < n && x[idx[j + 1]!] === x[idx[i]!]) j++;
    const mean = (i + j) / 2 + 1;
    for (let t = i; t <= j; t++) r[idx[t]!] = mean;
    i = j + 1;
  }
  return r;
}

/** Pearson's correlation, null when either column is constant. */
export function pearson(x: ArrayLike<number>, y: ArrayLike<number>): number | null {
  const n = x.length;
  let mx = 0, my = 0;
  for (let i = 0; i < n; i++) { mx += x[i]!; my += y[i]!; }
  mx /= n; my /= n;
  let sxy = 0, sxx = 0, syy = 0;
  for (let i = 0; i < n; i++) {
    const a = x[i]! - mx, b = y[i]! - my;
    sxy += a * b; sxx += a * a; syy += b * b;
  }
  return sxx > 0 && syy > 0 ? sxy / Math.sqrt(sxx * syy) : null;
}

/** Spearman's rank correlation of x and y. */
export function rankCorrelation(x: ArrayLike<number>, y: ArrayLike<number>): number | null {
  return pearson(ranks(x), ranks(y));
}

export interface Histogram {
  /** bins + 1 edges, from the least to the greatest value */
  edges: number[];
  counts: number[];
}

/** `bins` equal bins from the least to the greatest value (the greatest in the last bin); one bin when every value is the same. */
export function histogram(x: ArrayLike<number>, bins = 20): Histogram {
  let lo = Infinity, hi = -Infinity;
  for (let i = 0; i < x.length; i++) { lo = Math.min(lo, x[i]!); hi = Math.max(hi, x[i]!); }
  if (x.length === 0) return { edges: [], counts: [] };
  if (!(hi > lo)) return { edges: [lo, hi], counts: [x.length] };
  const counts = new Array<number>(bins).fill(0);
  for (let i = 0; i < x.length; i++) counts[Math.min(bins - 1, Math.floor(((x[i]! - lo) / (hi - lo)) * bins))]!++;
  return { edges: Array.from({ length: bins + 1 }, (_, b) => lo + ((hi - lo) * b) / bins), counts };
}

export interface MonteCarloSummary {
  samples: number;
  /** fraction of the samples meeting every requirement, and its standard error */
  allMet: { fraction: number; standardError: number };
  requirements: Array<{
    label: string;
    fraction: number;
    standardError: number;
    margin: { min: number; mean: number; max: number; histogram: Histogram };
    /** Spearman's rank correlation of the margin with each parameter, by path */
    sensitivity: Record<string, number | null>;
  }>;
}

/** The summary of a run of samples (labels in requirement order). */
export function monteCarloSummary(c: SampleChunk, params: readonly ToleranceParameter[], labels: readonly string[], bins = 20): MonteCarloSummary {
  const N = c.count;
  const se = (f: number): number => Math.sqrt((f * (1 - f)) / N);
  let all = 0;
  for (let s = 0; s < N; s++) {
    let ok = true;
    for (let j = 0; j < c.nReq; j++) ok &&= c.met[s * c.nReq + j] === 1;
    if (ok) all++;
  }
  const column = (a: Float64Array | Uint8Array, width: number, j: number): Float64Array => {
    const out = new Float64Array(N);
    for (let s = 0; s < N; s++) out[s] = a[s * width + j]!;
    return out;
  };
  const cols = params.map((_, i) => column(c.values, c.k, i));
  const requirements = labels.map((label, j) => {
    const m = column(c.margins, c.nReq, j);
    const met = column(c.met, c.nReq, j).reduce((a, b) => a + b, 0);
    let lo = Infinity, hi = -Infinity, sum = 0;
    for (const x of m) { lo = Math.min(lo, x); hi = Math.max(hi, x); sum += x; }
    const sensitivity: Record<string, number | null> = {};
    params.forEach((p, i) => (sensitivity[p.path] = rankCorrelation(cols[i]!, m)));
    return { label, fraction: met / N, standardError: se(met / N), margin: { min: lo, mean: sum / N, max: hi, histogram: histogram(m, bins) }, sensitivity };
  });
  return { samples: N, allMet: { fraction: all / N, standardError: se(all / N) }, requirements };
}
