/**
 * What a datasheet shows, computed from one resolved project: the eight envelopes (peak and
 * continuous current, hot and cold corner, motoring and generating), the derived constants, the
 * sizing verdicts hot and cold, the safety figures and, for a file with losses, the efficiency map. The app's views compute the same set
 * (src/renderer/src/state/compute.ts, from the two parts in datasheet-parts.ts; its Results satisfy
 * DatasheetResults); the CLI computes it here.
 */
import type { ResolvedProject } from '../project/project';
import type { Direction, Envelope } from '../steady-state/envelope';
import type { DerivedConstants } from '../machine/nameplate';
import type { SizingResult } from '../steady-state/sizing';
import type { SafetyReport } from '../steady-state/safety';
import type { DatasheetEfficiency } from './datasheet-efficiency';
import { datasheetCurves, datasheetEfficiencyOf, datasheetVerdicts, type DatasheetContinuous } from './datasheet-parts';

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
  /** the system-efficiency map (datasheet-efficiency.ts) of a file with a `losses` section; absent or null: no map */
  efficiency?: DatasheetEfficiency | null;
  /** the continuous (S1) torque curves (datasheet-parts.ts) of a file with a `thermal` section, drawn on the torque and power charts; absent or null: none */
  continuous?: DatasheetContinuous | null;
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
  // the curves, then the verdicts, as the app computes them (datasheet-parts.ts)
  const curves = datasheetCurves(p, o);
  const efficiency = datasheetEfficiencyOf(curves);
  return { ...curves, ...datasheetVerdicts(p, curves.speedMax), ...(efficiency ? { efficiency } : {}) };
}
