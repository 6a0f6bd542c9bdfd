/**
 * The datasheet's results in the parts the app shows one after the other: the curves (the eight
 * envelopes: peak and continuous current, hot and cold corner, motoring and generating; the speed
 * range and the derived constants), quick, redrawn on every edit; the verdicts (the sizing of every
 * requirement point hot and cold, the safety figures), slower searches, shown a frame later; and,
 * for a file with a `losses` section, the efficiency map (slower still: the app solves it in a worker
 * over the grid given here). computeDatasheetResults (the CLI's datasheet) is the parts together,
 * so the app and the CLI compute them one way.
 */
import type { ResolvedProject } from '../project/project';
import { computeEnvelope } from '../steady-state/envelope';
import { deriveConstants } from '../machine/nameplate';
import { sizeDrive } from '../steady-state/sizing';
import { safetyReport } from '../steady-state/safety';
import { projectSpeedRange } from './speed-range';
import type { DatasheetCurve, DatasheetResults, DatasheetResultsOptions } from './datasheet-results';
import type { EfficiencyGridSpec } from './efficiency-map-grid';
import { datasheetEfficiency, datasheetEfficiencyGrid, type DatasheetEfficiency } from './datasheet-efficiency';
import { lossConditionsFromProject } from '../project/loss-conditions-from-project';
import { temperatureModelFromProject } from '../project/temperature-model-from-project';
import { continuousTorqueCurve, type ContinuousPoint } from '../steady-state/continuous-torque';

export type DatasheetCurves = Pick<DatasheetResults, 'project' | 'speedMax' | 'curves' | 'constantsHot' | 'constantsCold'>;
export type DatasheetVerdicts = Pick<DatasheetResults, 'sizing' | 'sizingCold' | 'safety' | 'safetySpeed'>;

/** The eight envelopes (peak, then continuous; hot, then cold; motoring, then generating) over the speed range, and the constants. */
export function datasheetCurves(p: ResolvedProject, o: DatasheetResultsOptions): DatasheetCurves {
  // the project's range (one rule with the CLI) unless a top speed is given
  const speedMax = o.speedMax ?? projectSpeedRange(p).speedMax;
  const curves: DatasheetCurve[] = [];
  for (const current of ['peak', 'continuous'] as const) {
    const lim = current === 'peak' ? p.peak : p.continuous;
    for (const corner of ['hot', 'cold'] as const) {
      const m = corner === 'hot' ? p.models.hot : p.models.cold;
      for (const direction of ['motoring', 'generating'] as const) {
        curves.push({ corner, current, direction, env: computeEnvelope(m, lim, { points: o.points, speedMax, direction }) });
      }
    }
  }
  return { project: p, speedMax, curves, constantsHot: deriveConstants(p.hot), constantsCold: deriveConstants(p.cold) };
}

/**
 * The sizing verdicts, hot corner (least torque per ampere) and cold corner (most back-EMF), and the
 * safety figures at the motor's maximum speed when the file gives one, else at `speedMax` (rad/s,
 * the top of the plotted range).
 */
export function datasheetVerdicts(p: ResolvedProject, speedMax: number): DatasheetVerdicts {
  const safetySpeed = p.rated.maxSpeed_rad_s ?? speedMax;
  return {
    sizing: sizeDrive(p.models.hot, p.inverter, p.requirements, p.currentLimits),
    sizingCold: sizeDrive(p.models.cold, p.inverter, p.requirements, p.currentLimits),
    safety: safetyReport(p.models.cold, p.inverter, safetySpeed, p.rated.maxSpeed_rad_s !== undefined),
    safetySpeed,
  };
}

/** The grid of the datasheet's efficiency map (hot corner, least-current control), or null when the file has no `losses` section. */
export function datasheetEfficiencyGridOf(c: Pick<DatasheetCurves, 'project' | 'speedMax' | 'curves'>): EfficiencyGridSpec | null {
  const hotPeak = c.curves.filter((q) => q.corner === 'hot' && q.current === 'peak').map((q) => q.env);
  return datasheetEfficiencyGrid(c.project, c.speedMax, hotPeak);
}

/** The datasheet's efficiency map, or null when the file has no `losses` section. */
export function datasheetEfficiencyOf(c: Pick<DatasheetCurves, 'project' | 'speedMax' | 'curves'>): DatasheetEfficiency | null {
  const grid = datasheetEfficiencyGridOf(c);
  return grid === null ? null : datasheetEfficiency(c.project, grid);
}

/** The continuous (S1) torque curves from the thermal network, motoring and generating, over the speed range. */
export interface DatasheetContinuous {
  motoring: ContinuousPoint[];
  generating: ContinuousPoint[];
}

/**
 * The S1 curves of a file with a `thermal` section (null without one): at `points` speeds from 0 to
 * `speedMax` (rad/s), the largest continuous shaft torque within every temperature limit and the
 * continuous drive limits, each point naming the limit that binds it (continuous-torque.ts).
 */
export function datasheetContinuousOf(p: ResolvedProject, speedMax: number, points: number): DatasheetContinuous | null {
  if (p.thermal === undefined) return null;
  const n = Math.max(2, Math.floor(points));
  const speeds = Float64Array.from({ length: n }, (_, k) => (speedMax * k) / (n - 1));
  const c = lossConditionsFromProject(p);
  const curve = (d: 'motoring' | 'generating') => continuousTorqueCurve(temperatureModelFromProject(p), p.thermal!, p.continuous, c, speeds, d);
  return { motoring: curve('motoring'), generating: curve('generating') };
}
