/**
 * The datasheet's efficiency map, for a project whose file has a `losses` section: the core map
 * (steady-state/efficiency-map.ts: least-current control at the peak limits, motoring and generating)
 * of the hot corner over the grid of the app's efficiency view (efficiency-map-grid.ts: speeds 0 to the
 * datasheet's top speed, shaft torques -T..+T), T a little above the largest torque of the hot
 * peak-current envelopes. A grid that keeps the datasheet quick: 60 points per axis for a machine of
 * constant parameters (about 0.3 s), 30 for a flux map, whose points cost some milliseconds each
 * (about 1.7 s). The summary names the best system efficiency, motoring and generating, and where.
 */
import type { ResolvedProject } from '../project/project';
import type { Envelope } from '../steady-state/envelope';
import { efficiencyMap, type EfficiencyMap } from '../steady-state/efficiency-map';
import { lossConditionsFromProject } from '../project/loss-conditions-from-project';
import { efficiencyGridAxes, type EfficiencyGridSpec, type MapCorner } from './efficiency-map-grid';
import { radSToRpm } from '../base/units';

/** Points per axis of the datasheet's map: constant-parameter machine, flux map. */
export const DATASHEET_MAP_POINTS = { linear: 60, fluxMap: 30 } as const;

/** The torque axis spans this much beyond the envelope (a generating shaft torque exceeds the electromagnetic one by the losses). */
const TORQUE_MARGIN = 1.05;

/** The iso-efficiency levels drawn, fractions. */
export const EFFICIENCY_LEVELS: readonly number[] = [0.7, 0.8, 0.85, 0.9, 0.92, 0.94, 0.95, 0.96, 0.97];

export interface DatasheetEfficiency {
  /** the grid: hot corner, points per axis, top speed (rad/s), largest |shaft torque| (N·m) */
  grid: EfficiencyGridSpec;
  map: EfficiencyMap;
}

/** A best point of the map: system efficiency (fraction) and where. */
export interface EfficiencyPeak {
  efficiency: number;
  speed_rpm: number;
  torque_Nm: number;
}

export interface DatasheetEfficiencySummary {
  quantity: 'system';
  corner: MapCorner;
  control: 'least-current';
  speedPoints: number;
  torquePoints: number;
  pointsInside: number;
  /** over the whole map, motoring (shaft torque > 0), generating (< 0); null when no such point is inside */
  peakSystem: EfficiencyPeak | null;
  peakMotoring: EfficiencyPeak | null;
  peakGenerating: EfficiencyPeak | null;
}

/**
 * The datasheet map's grid, or null when the file has no `losses` section (the datasheet then has no
 * map) or the hot peak envelopes give no torque. `envelopes`: the hot corner's peak-current envelopes.
 */
export function datasheetEfficiencyGrid(p: ResolvedProject, speedMax: number, envelopes: readonly Envelope[]): EfficiencyGridSpec | null {
  if (p.file.losses === undefined) return null;
  let tmax = 0;
  for (const env of envelopes) for (let k = 0; k < env.torque.length; k++) if (env.feasible[k]) tmax = Math.max(tmax, Math.abs(env.torque[k]!));
  if (!(tmax > 0 && Number.isFinite(tmax)) || !(speedMax > 0 && Number.isFinite(speedMax))) return null;
  const points = p.models.hot.linear === null ? DATASHEET_MAP_POINTS.fluxMap : DATASHEET_MAP_POINTS.linear;
  return { corner: 'hot', points, speedMax, torqueMax: TORQUE_MARGIN * tmax };
}

/** The map over the grid: the project's machine of the grid's corner at the peak limits, least-current control. */
export function datasheetEfficiency(p: ResolvedProject, grid: EfficiencyGridSpec): DatasheetEfficiency {
  const { speeds, torques } = efficiencyGridAxes(grid);
  return { grid, map: efficiencyMap(p.models[grid.corner], p.peak, lossConditionsFromProject(p), speeds, torques) };
}

export function datasheetEfficiencySummary(e: DatasheetEfficiency): DatasheetEfficiencySummary {
  const m = e.map;
  const nT = m.torques.length;
  let inside = 0;
  const best = { all: -1, mot: -1, gen: -1 };
  for (let k = 0; k < m.feasible.length; k++) {
    if (m.feasible[k] !== 1 || !Number.isFinite(m.system[k]!)) continue;
    inside++;
    const v = m.system[k]!, T = m.torques[k % nT]!;
    if (best.all < 0 || v > m.system[best.all]!) best.all = k;
    if (T > 0 && (best.mot < 0 || v > m.system[best.mot]!)) best.mot = k;
    if (T < 0 && (best.gen < 0 || v > m.system[best.gen]!)) best.gen = k;
  }
  const peak = (k: number): EfficiencyPeak | null =>
    k < 0 ? null : { efficiency: m.system[k]!, speed_rpm: radSToRpm(m.speeds[Math.floor(k / nT)]!), torque_Nm: m.torques[k % nT]! };
  return {
    quantity: 'system', corner: e.grid.corner, control: 'least-current',
    speedPoints: m.speeds.length, torquePoints: nT, pointsInside: inside,
    peakSystem: peak(best.all), peakMotoring: peak(best.mot), peakGenerating: peak(best.gen),
  };
}
