/**
 * One set of parameter values of a tolerance study evaluated: the file perturbed (tolerance-apply.ts),
 * resolved, and sized hot and cold as the `size` command sizes it (steady-state/sizing.ts), with the
 * S1 thermal check of the continuous-duty points when asked and the file has a thermal section.
 * Per requirement: met (at both corners, and under the S1 torque when checked) and its margins,
 * each the worse of the hot and the cold corner.
 */
import { sizeDrive, type SizingResult } from '../steady-state/sizing';
import { continuousRequirementChecks } from '../steady-state/continuous-requirements';
import { resolveProject } from './project';
import { applyParameterValues, type ToleranceParameter } from './tolerance-apply';
import { lossConditionsFromProject } from './loss-conditions-from-project';
import { temperatureModelFromProject } from './temperature-model-from-project';
import type { ProjectFile } from './schema';

export interface RequirementMargins {
  /** |torque available| - |torque asked| at the point's speed, N·m: >= 0 when the torque is there */
  torque_Nm: number;
  /** current limit of its duty minus the current the point needs, A peak; null when not met */
  current_A: number | null;
  /** voltage limit minus the point's voltage, V peak phase (0 in field weakening); null when not met */
  voltage_V: number | null;
  /** continuous points with the thermal check: |S1 torque| - |torque asked|, N·m */
  s1Torque_Nm?: number;
}

export interface RequirementVerdict {
  label: string;
  met: boolean;
  margins: RequirementMargins;
}

export interface ParameterSetResult {
  /** least Imax at this set's bus, the worse of hot and cold, A peak (null: out of reach, or not computed) */
  minImax_A: number | null;
  /** least bus at this set's current limits, the worse of hot and cold, V (null as minImax_A) */
  minVdc_V: number | null;
  met: boolean;
  requirements: RequirementVerdict[];
}

export interface EvaluateOptions {
  /** compute the least Imax and least bus (the corners do; the Monte Carlo samples need only the verdicts) */
  bounds: boolean;
  /** check the continuous-duty points against the S1 torque when the file has a thermal section */
  thermal: boolean;
}

const worse = (a: number | null, b: number | null): number | null => (a === null || b === null ? null : Math.max(a, b));
const least = (a: number | null, b: number | null): number | null => (a === null || b === null ? null : Math.min(a, b));

/** The verdicts and margins of one set of values (one per parameter, in the order of `params`). */
export function evaluateParameterSet(file: ProjectFile, params: readonly ToleranceParameter[], values: ArrayLike<number>, opts: EvaluateOptions): ParameterSetResult {
  const p = resolveProject(params.length === 0 ? file : applyParameterValues(file, params, values), { findings: false });
  const so = { bounds: opts.bounds };
  const hot: SizingResult = sizeDrive(p.models.hot, p.inverter, p.requirements, p.currentLimits, so);
  const cold: SizingResult = sizeDrive(p.models.cold, p.inverter, p.requirements, p.currentLimits, so);
  const requirements: RequirementVerdict[] = hot.points.map((h, k) => {
    const c = cold.points[k]!;
    const margin = (q: typeof h): number => Math.abs(q.torqueAvailable_Nm) - Math.abs(q.torque_Nm);
    return {
      label: h.label,
      met: h.met && c.met,
      margins: { torque_Nm: Math.min(margin(h), margin(c)), current_A: least(h.currentHeadroom_A, c.currentHeadroom_A), voltage_V: least(h.voltageHeadroom_V, c.voltageHeadroom_V) },
    };
  });
  if (opts.thermal && p.thermal !== undefined) {
    const checks = continuousRequirementChecks(temperatureModelFromProject(p), p.thermal, p.continuous, lossConditionsFromProject(p), p.requirements);
    let j = 0;
    p.requirements.forEach((r, k) => {
      if (r.duty !== 'continuous') return;
      const q = checks[j++]!;
      const v = requirements[k]!;
      v.margins.s1Torque_Nm = Math.abs(q.s1Torque_Nm) - Math.abs(q.torque_Nm);
      v.met = v.met && q.underS1;
    });
  }
  return {
    minImax_A: worse(hot.minImax, cold.minImax),
    minVdc_V: worse(hot.minVdc, cold.minVdc),
    met: requirements.every((r) => r.met),
    requirements,
  };
}

/** A verdict's worst margin as a fraction of the torque asked (the torque margin, or the S1 margin when it is less), for ranking corners. */
export function relativeMargin(r: RequirementVerdict, torque_Nm: number): number {
  const m = Math.min(r.margins.torque_Nm, r.margins.s1Torque_Nm ?? Infinity);
  return torque_Nm === 0 ? m : m / Math.abs(torque_Nm);
}
