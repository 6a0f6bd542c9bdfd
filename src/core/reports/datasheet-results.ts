/**
 * What a datasheet shows, computed from one resolved project: the eight envelopes (peak and
 * continuous current, hot and cold corner, motoring and generating), the derived constants, the
 * sizing verdicts hot and cold and the safety figures. The app's views compute the same set
 * (src/renderer/src/compute.ts, whose Results satisfy DatasheetResults); the CLI computes it here.
 */
import type { ResolvedProject } from '../project/project';
import { computeEnvelope, type Direction, type Envelope } from '../steady-state/envelope';
import { deriveConstants, type DerivedConstants } from '../machine/nameplate';
import { sizeDrive, type SizingResult } from '../steady-state/sizing';
import { safetyReport, type SafetyReport } from '../steady-state/safety';
import { projectSpeedRange } from './speed-range';

export interface DatasheetCurve {
  corner: 'hot' | 'cold';
  current: 'peak' | 'continuous';
  direction: Direction;
  env: Envelope;
}

export interface DatasheetResults {
  project: ResolvedProject;
  /** top of the computed speed range, rad/s */
  speedMax: number;
  curves: DatasheetCurve[];
  constantsHot: DerivedConstants;
  constantsCold: DerivedConstants;
  /** hot corner */
  sizing: SizingResult;
  /** cold corner */
  sizingCold: SizingResult;
  safety: SafetyReport;
  /** the speed the safety figures are for, rad/s */
  safetySpeed: number;
}

export interface DatasheetResultsOptions {
  /** speed points per envelope */
  points: number;
  /** rad/s; undefined: the project's range (speed-range.ts) */
  speedMax: number | undefined;
}

export const DEFAULT_DATASHEET_RESULTS_OPTIONS: Readonly<DatasheetResultsOptions> = { points: 200, speedMax: undefined };

export function computeDatasheetResults(p: ResolvedProject, opts: Partial<DatasheetResultsOptions> = {}): DatasheetResults {
  const o = { ...DEFAULT_DATASHEET_RESULTS_OPTIONS, ...opts };
  const speedMax = o.speedMax ?? projectSpeedRange(p).speedMax;
  const curves: DatasheetCurve[] = [];
  for (const current of ['peak', 'continuous'] as const) {
    const lim = current === 'peak' ? p.peak : p.continuous;
    for (const corner of ['hot', 'cold'] as const) {
      const m = corner === 'hot' ? p.hot : p.cold;
      for (const direction of ['motoring', 'generating'] as const) {
        curves.push({ corner, current, direction, env: computeEnvelope(m, lim, { points: o.points, speedMax, direction }) });
      }
    }
  }
  const safetySpeed = p.rated.maxSpeed_rad_s ?? speedMax;
  return {
    project: p,
    speedMax,
    curves,
    constantsHot: deriveConstants(p.hot),
    constantsCold: deriveConstants(p.cold),
    sizing: sizeDrive(p.hot, p.inverter, p.requirements, p.currentLimits),
    sizingCold: sizeDrive(p.cold, p.inverter, p.requirements, p.currentLimits),
    safety: safetyReport(p.cold, p.inverter, safetySpeed, p.rated.maxSpeed_rad_s !== undefined),
    safetySpeed,
  };
}
