/**
 * The corners of a tolerance study: every combination of the band ends (2^k sets for k parameters)
 * while k <= FULL_FACTORIAL_MAX; beyond, the one-at-a-time set (the nominal values, and each parameter
 * at each of its ends with the others nominal: 2k + 1 sets) with the all-lower and all-upper pairs
 * (2k + 3 in all). Each corner is evaluated as the `size` command sizes a file (tolerance-evaluate.ts:
 * hot and cold, and the continuous points against the S1 torque when the file has a thermal section);
 * the least Imax and least bus over all corners are the worst of the corners' (each meets every point
 * at its own values). The binding corner of a requirement is the corner of its least torque margin
 * (S1 margin where checked), and the binding corner overall is the least of those relative to the
 * torque asked.
 */
import { checkBandEnds, toleranceParameters, type ToleranceParameter } from './tolerance-apply';
import { evaluateParameterSet, relativeMargin, type RequirementVerdict } from './tolerance-evaluate';
import type { ProjectFile } from './schema';

/** Most parameters whose every combination of band ends is evaluated (2^10 = 1024 corners). */
export const FULL_FACTORIAL_MAX = 10;

export type CornerPlan = 'every-combination' | 'one-at-a-time-and-extremes';

/** The corners' values, one array per corner (in the order of `params`). */
export function cornerValueSets(params: readonly ToleranceParameter[]): { plan: CornerPlan; sets: number[][] } {
  const k = params.length;
  if (k <= FULL_FACTORIAL_MAX) {
    const sets: number[][] = [];
    for (let mask = 0; mask < 1 << k; mask++) sets.push(params.map((p, j) => ((mask >> j) & 1 ? p.max : p.min)));
    return { plan: 'every-combination', sets };
  }
  const nominal = params.map((p) => p.nominal);
  const sets: number[][] = [nominal];
  params.forEach((p, j) => {
    for (const v of [p.min, p.max]) {
      const s = [...nominal];
      s[j] = v;
      sets.push(s);
    }
  });
  sets.push(params.map((p) => p.min), params.map((p) => p.max));
  return { plan: 'one-at-a-time-and-extremes', sets };
}

export interface Corner {
  /** the parameters' values at this corner, by path */
  parameters: Record<string, number>;
  met: boolean;
  minImax_A: number | null;
  minVdc_V: number | null;
  requirements: RequirementVerdict[];
}

export interface CornersResult {
  plan: CornerPlan;
  parameters: ToleranceParameter[];
  /** the least peak current that meets every point at every corner, A peak (null: some corner cannot be met at any current) */
  minImax_A: number | null;
  /** the least bus that meets every point at every corner, V (null as minImax_A) */
  minVdc_V: number | null;
  /** every point met at every corner */
  allMet: boolean;
  corners: Corner[];
  /** per requirement: met at every corner, its least torque margin and the corner that gives it */
  requirements: Array<{ label: string; metAtEveryCorner: boolean; worstMargin_Nm: number; bindingCorner: number }>;
  /** the corner of the least relative margin over every requirement */
  bindingCorner: number;
}

/** A run stopped by its caller's signal (between two corners). */
export class CornersAborted extends Error {
  constructor(done: number, total: number) {
    super(`the corners were stopped after ${done} of ${total}`);
    this.name = 'AbortError';
  }
}

export interface CornersOptions {
  /** the S1 check of continuous points where the file has a thermal section (default true) */
  thermal?: boolean;
  /** called after each corner is evaluated: corners done, corners in all */
  onCorner?: (done: number, total: number) => void;
  /** checked before each corner (an AbortSignal fits): once aborted, the run throws CornersAborted */
  signal?: { readonly aborted: boolean };
}

/** Every corner of the file's bands evaluated (one corner, the nominal file, without bands). Throws InputError for a band end the file cannot take. */
export function toleranceCorners(file: ProjectFile, opts: CornersOptions = {}): CornersResult {
  const params = toleranceParameters(file);
  checkBandEnds(file, params);
  const { plan, sets } = cornerValueSets(params);
  const corners: Corner[] = [];
  for (const values of sets) {
    if (opts.signal?.aborted) throw new CornersAborted(corners.length, sets.length);
    const r = evaluateParameterSet(file, params, values, { bounds: true, thermal: opts.thermal !== false });
    const parameters: Record<string, number> = {};
    params.forEach((p, j) => (parameters[p.path] = values[j]!));
    corners.push({ parameters, met: r.met, minImax_A: r.minImax_A, minVdc_V: r.minVdc_V, requirements: r.requirements });
    opts.onCorner?.(corners.length, sets.length);
  }
  let minImax: number | null = 0, minVdc: number | null = 0;
  for (const c of corners) {
    minImax = minImax === null || c.minImax_A === null ? null : Math.max(minImax, c.minImax_A);
    minVdc = minVdc === null || c.minVdc_V === null ? null : Math.max(minVdc, c.minVdc_V);
  }
  const torques = file.requirements.map((r) => r.torque_Nm);
  let bindingCorner = 0, bindingRel = Infinity;
  const requirements = file.requirements.map((r, k) => {
    let worst = Infinity, at = 0, every = true;
    corners.forEach((c, i) => {
      const v = c.requirements[k]!;
      every &&= v.met;
      const m = Math.min(v.margins.torque_Nm, v.margins.s1Torque_Nm ?? Infinity);
      if (m < worst) { worst = m; at = i; }
      const rel = relativeMargin(v, torques[k]!);
      if (rel < bindingRel) { bindingRel = rel; bindingCorner = i; }
    });
    return { label: r.label, metAtEveryCorner: every, worstMargin_Nm: worst, bindingCorner: at };
  });
  return { plan, parameters: params, minImax_A: minImax, minVdc_V: minVdc, allMet: corners.every((c) => c.met), corners, requirements, bindingCorner };
}
