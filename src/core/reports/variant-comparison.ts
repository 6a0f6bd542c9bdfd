/**
 * Design variants side by side: for each variant (a project file, or a file's named variant) what an
 * engineer compares them by, all on one speed range: the peak-current motoring envelopes hot and
 * cold, the sizing hot and cold (least Imax at the bus, least Vdc at the current limits, each
 * requirement's verdict and headroom), the efficiency at each requirement point where the file has
 * losses (hot corner, least-current control, shaft torque), and the load-step metrics of its
 * scenario. The steady parts are quick (variantSteady); the simulation is the slow part
 * (variantLoadSteps), so the app runs it off the UI thread. variant-table.ts lays the columns out.
 */
import type { ResolvedProject } from '../project/project';
import { computeEnvelope, type Envelope } from '../steady-state/envelope';
import { sizeDrive, type SizingResult } from '../steady-state/sizing';
import { solveLossPoint } from '../steady-state/loss-point';
import { deriveConstants, type DerivedConstants } from '../machine/nameplate';
import { lossConditionsFromProject } from '../project/loss-conditions-from-project';
import { simulationFromProject } from '../project/simulation-from-project';
import { runSimulation, type LoadStepResult, type SimulationMetrics } from '../simulation/simulate';
import { projectSpeedRange } from './speed-range';
import { RPM_TO_RAD_S } from '../base/units';
import type { DqMachine } from '../machine/dq-machine';

/** A variant to compare: its name (a column's heading) and its project. */
export interface VariantInput {
  name: string;
  project: ResolvedProject;
}

/** Efficiency at one requirement point (hot corner, least current, shaft torque), null figures when out of reach. */
export interface PointEfficiency {
  label: string;
  speed_rpm: number;
  torque_Nm: number;
  feasible: boolean;
  /** fractions; null when the point is out of reach */
  motor: number | null;
  system: number | null;
  /** copper + iron + mechanical + inverter, W; null when out of reach */
  losses_W: number | null;
}

/** The steady results of one variant. */
export interface VariantSteady {
  name: string;
  /** the project's own name */
  projectName: string;
  /** apparent dq terms at 20 °C, hot and cold (a flux map's at zero current) */
  machine20: DqMachine;
  constantsHot: DerivedConstants;
  constantsCold: DerivedConstants;
  limits: { Vdc_V: number; Vmax_V: number; Imax_A: number; Icont_A: number };
  /** motoring envelopes under the effective peak current, over the comparison's speed range */
  envelopes: { hot: Envelope; cold: Envelope };
  sizing: { hot: SizingResult; cold: SizingResult };
  /** per requirement point, in the file's order; null when the file has no `losses` section */
  efficiency: PointEfficiency[] | null;
}

/** The load-step metrics of one variant's scenario (null metrics without a scenario). */
export interface VariantLoadSteps {
  name: string;
  /** false when the file has no scenario to simulate */
  simulated: boolean;
  metrics: Pick<SimulationMetrics, 'loadStepDip_rpm' | 'loadStepRecovery_s' | 'settlingTime_s' | 'peakCurrent_A' | 'speedOvershoot_pct'> | null;
  loadSteps: LoadStepResult[];
  /** wall time of the run, s */
  wall_s: number;
}

export interface VariantColumn extends VariantSteady {
  loadSteps: VariantLoadSteps;
}

/** The speed range every variant is drawn over: the widest of their own ranges (speed-range.ts), rad/s. */
export function comparisonSpeedMax(variants: readonly VariantInput[]): number {
  let top = 0;
  for (const v of variants) top = Math.max(top, projectSpeedRange(v.project).speedMax);
  return top;
}

/** The efficiency at each requirement point of a project with losses (the point's own duty limits), or null without a `losses` section. */
export function requirementEfficiencies(p: ResolvedProject): PointEfficiency[] | null {
  if (p.file.losses === undefined) return null;
  const c = lossConditionsFromProject(p);
  return p.requirements.map((q) => {
    const lim = q.duty === 'continuous' ? p.continuous : p.peak;
    const r = solveLossPoint(p.models.hot, lim, c, q.speed_rpm * RPM_TO_RAD_S, q.torque_Nm);
    const l = r.losses;
    return {
      label: q.label, speed_rpm: q.speed_rpm, torque_Nm: q.torque_Nm, feasible: r.feasible,
      motor: r.feasible ? r.efficiency.motor : null,
      system: r.feasible ? r.efficiency.system : null,
      losses_W: r.feasible ? l.copper_W + l.iron_W + l.mechanical_W + l.inverter_W : null,
    };
  });
}

/** One variant's steady results over `speedMax` (rad/s) with `points` envelope speeds. */
export function variantSteady(v: VariantInput, speedMax: number, points = 120): VariantSteady {
  const p = v.project;
  const env = (m: ResolvedProject['models']['hot']) => computeEnvelope(m, p.peak, { points, speedMax, direction: 'motoring' });
  return {
    name: v.name,
    projectName: p.name,
    machine20: { ...p.machine20 },
    constantsHot: deriveConstants(p.hot),
    constantsCold: deriveConstants(p.cold),
    limits: { Vdc_V: p.inverter.Vdc, Vmax_V: p.peak.Vmax, Imax_A: p.peak.Imax, Icont_A: p.continuous.Imax },
    envelopes: { hot: env(p.models.hot), cold: env(p.models.cold) },
    sizing: { hot: sizeDrive(p.models.hot, p.inverter, p.requirements, p.currentLimits), cold: sizeDrive(p.models.cold, p.inverter, p.requirements, p.currentLimits) },
    efficiency: requirementEfficiencies(p),
  };
}

/** One variant's scenario simulated (the project's own scenario and controller): its load-step metrics. */
export function variantLoadSteps(v: VariantInput): VariantLoadSteps {
  if (v.project.file.scenario === undefined) return { name: v.name, simulated: false, metrics: null, loadSteps: [], wall_s: 0 };
  const r = runSimulation(simulationFromProject(v.project), { maxPoints: 2 });
  const m = r.metrics;
  return {
    name: v.name,
    simulated: true,
    metrics: { loadStepDip_rpm: m.loadStepDip_rpm, loadStepRecovery_s: m.loadStepRecovery_s, settlingTime_s: m.settlingTime_s, peakCurrent_A: m.peakCurrent_A, speedOvershoot_pct: m.speedOvershoot_pct },
    loadSteps: r.loadSteps.map((s) => ({ ...s })),
    wall_s: r.stats.wall_s,
  };
}

/** Every variant compared: steady results and load steps, one column each, in the given order. */
export function compareVariants(variants: readonly VariantInput[], opts: { points?: number } = {}): VariantColumn[] {
  const speedMax = comparisonSpeedMax(variants);
  return variants.map((v) => ({ ...variantSteady(v, speedMax, opts.points), loadSteps: variantLoadSteps(v) }));
}
