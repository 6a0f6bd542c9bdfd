/**
 * Monte Carlo samples of a tolerance study. Sample n draws its values from its own generator, seeded
 * by (seed, n) alone (mathematics/seeded-random.ts), one number per parameter in the order of
 * TOLERANCE_PATHS: uniform over the band, or normal about the nominal value (held inside the band)
 * with sigma = sigmaOfBand x half the band, truncated to the band. A run of samples from..from+count
 * gives the same numbers however the samples are split. Each sample is evaluated for the verdicts
 * only (tolerance-evaluate.ts, no least Imax or bus), hot and cold, with the S1 check when asked.
 */
import { randomFor, truncatedNormal } from '../mathematics/seeded-random';
import { evaluateParameterSet } from './tolerance-evaluate';
import type { ToleranceParameter } from './tolerance-apply';
import type { MonteCarloSettings } from './tolerance-schema';
import type { ProjectFile } from './schema';

/** The values of sample `index`, written into `out` (one per parameter). */
export function sampleValues(params: readonly ToleranceParameter[], mc: MonteCarloSettings, index: number, out: number[] | Float64Array): void {
  const r = randomFor(mc.seed, index);
  params.forEach((p, j) => {
    if (mc.distribution === 'uniform') out[j] = p.min + (p.max - p.min) * r.next();
    else out[j] = truncatedNormal(r, Math.min(p.max, Math.max(p.min, p.nominal)), mc.sigmaOfBand * 0.5 * (p.max - p.min), p.min, p.max);
  });
}

/** Samples from..from+count-1: their values, each requirement's worst margin (N·m) and verdict, row by row. */
export interface SampleChunk {
  from: number;
  count: number;
  /** parameters per sample */
  k: number;
  /** requirements per sample */
  nReq: number;
  /** count x k values */
  values: Float64Array;
  /** count x nReq least torque margins (the S1 margin when checked and less), N·m */
  margins: Float64Array;
  /** count x nReq verdicts, 1 met */
  met: Uint8Array;
}

/**
 * An empty record of samples from..from+count-1 (k parameters, nReq requirements); `memory(bytes)`
 * gives each array's memory (a plain ArrayBuffer by default; a run shared between threads passes shared memory).
 */
export function emptySampleChunk(from: number, count: number, k: number, nReq: number, memory: (bytes: number) => ArrayBufferLike = (n) => new ArrayBuffer(n)): SampleChunk {
  return { from, count, k, nReq, values: new Float64Array(memory(8 * count * k)), margins: new Float64Array(memory(8 * count * nReq)), met: new Uint8Array(memory(count * nReq)) };
}

/** Samples from..from+count-1 evaluated and written into `out` at their places (out must hold them: out.from <= from, from + count <= out.from + out.count). */
export function writeSamples(file: ProjectFile, params: readonly ToleranceParameter[], mc: MonteCarloSettings, from: number, count: number, opts: { thermal: boolean }, out: SampleChunk): void {
  const k = params.length, nReq = out.nReq;
  if (!(from >= out.from && from + count <= out.from + out.count) || out.k !== k || nReq !== file.requirements.length) throw new RangeError(`samples ${from}..${from + count - 1} do not fit the record of ${out.from}..${out.from + out.count - 1}`);
  const v = new Float64Array(k);
  for (let s = 0; s < count; s++) {
    const row = from - out.from + s;
    sampleValues(params, mc, from + s, v);
    out.values.set(v, row * k);
    const r = evaluateParameterSet(file, params, v, { bounds: false, thermal: opts.thermal });
    r.requirements.forEach((q, j) => {
      out.margins[row * nReq + j] = Math.min(q.margins.torque_Nm, q.margins.s1Torque_Nm ?? Infinity);
      out.met[row * nReq + j] = q.met ? 1 : 0;
    });
  }
}

/** Samples from..from+count-1 evaluated. */
export function runSampleChunk(file: ProjectFile, params: readonly ToleranceParameter[], mc: MonteCarloSettings, from: number, count: number, opts: { thermal: boolean }): SampleChunk {
  const out = emptySampleChunk(from, count, params.length, file.requirements.length);
  writeSamples(file, params, mc, from, count, opts, out);
  return out;
}

/** Consecutive chunks joined into one (in order of `from`). */
export function joinChunks(chunks: readonly SampleChunk[]): SampleChunk {
  const sorted = [...chunks].sort((a, b) => a.from - b.from);
  const first = sorted[0]!;
  const count = sorted.reduce((n, c) => n + c.count, 0);
  const out: SampleChunk = { from: first.from, count, k: first.k, nReq: first.nReq, values: new Float64Array(count * first.k), margins: new Float64Array(count * first.nReq), met: new Uint8Array(count * first.nReq) };
  let at = 0;
  for (const c of sorted) {
    if (c.from !== first.from + at) throw new Error(`sample chunks are not consecutive: ${c.from} after ${first.from + at}`);
    out.values.set(c.values, at * first.k);
    out.margins.set(c.margins, at * first.nReq);
    out.met.set(c.met, at * first.nReq);
    at += c.count;
  }
  return out;
}
