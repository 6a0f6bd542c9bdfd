// The efficiency map as the command line writes it: the JSON arrays (row-major, speed-major, null
// outside the envelope), the CSV (one row per grid point) and the summary (the best system efficiency
// and where, the grid's size, the points inside the envelope).
import type { EfficiencyMap } from '../steady-state/efficiency-map';
import type { MinLossGainMap } from '../steady-state/min-loss-gain-map';
import { radSToRpm } from '../base/units';
import { csvDocument, type CsvCell } from './csv';

export interface EfficiencyMapSummary {
  speedPoints: number;
  torquePoints: number;
  pointsInside: number;
  /** the highest system efficiency inside the envelope and where (null when no point is inside) */
  peakSystem: { efficiency: number; speed_rpm: number; torque_Nm: number } | null;
}

export function efficiencyMapSummary(m: EfficiencyMap): EfficiencyMapSummary {
  const nT = m.torques.length;
  let inside = 0, best = -Infinity, at = -1;
  for (let k = 0; k < m.feasible.length; k++) {
    if (m.feasible[k] !== 1) continue;
    inside++;
    if (m.system[k]! > best) { best = m.system[k]!; at = k; }
  }
  return {
    speedPoints: m.speeds.length, torquePoints: nT, pointsInside: inside,
    peakSystem: at < 0 ? null : { efficiency: best, speed_rpm: radSToRpm(m.speeds[Math.floor(at / nT)]!), torque_Nm: m.torques[at % nT]! },
  };
}

const orNull = (m: EfficiencyMap, a: Float64Array): Array<number | null> => Array.from(a, (x, k) => (m.feasible[k] === 1 && Number.isFinite(x) ? x : null));

/** The JSON arrays: axes, then one value per point (index speed * torques + torque), null outside. */
export function efficiencyMapJson(m: EfficiencyMap) {
  return {
    speeds_rpm: Array.from(m.speeds, radSToRpm),
    torques_Nm: Array.from(m.torques),
    feasible: Array.from(m.feasible, (f) => f === 1),
    motor: orNull(m, m.motor),
    inverter: orNull(m, m.inverter),
    system: orNull(m, m.system),
    copper_W: orNull(m, m.copper),
    iron_W: orNull(m, m.iron),
    mechanical_W: orNull(m, m.mechanical),
    inverter_W: orNull(m, m.inverterLoss),
    dcPower_W: orNull(m, m.dcPower),
  };
}

/** The CSV columns of the map (the command line writes them all). */
export const EFFICIENCY_MAP_CSV_HEADER = ['speed_rpm', 'torque_Nm', 'feasible', 'motor', 'inverter', 'system', 'copper_W', 'iron_W', 'mechanical_W', 'inverter_W', 'dcPower_W', 'torqueEm_Nm'] as const;
export type EfficiencyCsvColumn = (typeof EFFICIENCY_MAP_CSV_HEADER)[number];
/** The columns of the app's export (all but the electromagnetic torque). */
export const EFFICIENCY_APP_CSV_COLUMNS: readonly EfficiencyCsvColumn[] = EFFICIENCY_MAP_CSV_HEADER.filter((c) => c !== 'torqueEm_Nm');

/** The columns of the gain of loss-minimising control (steady-state/min-loss-gain-map.ts): W, and points of system efficiency. */
export const EFFICIENCY_GAIN_CSV_COLUMNS = ['lossLeastCurrent_W', 'lossMinLoss_W', 'lossSaved_W', 'systemGain_pts'] as const;
export type EfficiencyGainCsvColumn = (typeof EFFICIENCY_GAIN_CSV_COLUMNS)[number];
const GAIN_ARRAY_OF: Record<EfficiencyGainCsvColumn, keyof MinLossGainMap> = {
  lossLeastCurrent_W: 'lossLeastCurrent', lossMinLoss_W: 'lossMinLoss', lossSaved_W: 'lossSaved', systemGain_pts: 'systemGain_pts',
};
const isGainColumn = (c: string): c is EfficiencyGainCsvColumn => (EFFICIENCY_GAIN_CSV_COLUMNS as readonly string[]).includes(c);

const ARRAY_OF: Record<Exclude<EfficiencyCsvColumn, 'speed_rpm' | 'torque_Nm' | 'feasible'>, keyof EfficiencyMap> = {
  motor: 'motor', inverter: 'inverter', system: 'system', copper_W: 'copper', iron_W: 'iron', mechanical_W: 'mechanical',
  inverter_W: 'inverterLoss', dcPower_W: 'dcPower', torqueEm_Nm: 'torqueEm',
};

/**
 * The map as CSV, '#' comment rows first, then the header and one row per grid point (speed-major;
 * efficiencies as fractions, empty cells outside the envelope), with the columns asked (default all).
 * Gain columns (EFFICIENCY_GAIN_CSV_COLUMNS) take their values from `gain` (same axes as the map),
 * empty where the gain map has no point.
 */
export function efficiencyMapCsv(m: EfficiencyMap, comments: readonly string[] = [], columns: readonly (EfficiencyCsvColumn | EfficiencyGainCsvColumn)[] = EFFICIENCY_MAP_CSV_HEADER, gain?: MinLossGainMap): string {
  if (columns.some(isGainColumn) && gain === undefined) throw new Error('efficiencyMapCsv: gain columns asked without the gain map');
  if (gain !== undefined && gain.feasible.length !== m.feasible.length) throw new Error('efficiencyMapCsv: the gain map must share the map\'s axes');
  const rows: CsvCell[][] = comments.map((c) => [c]);
  rows.push([...columns]);
  const nT = m.torques.length;
  for (let k = 0; k < m.feasible.length; k++) {
    const ok = m.feasible[k] === 1;
    rows.push(columns.map((c): CsvCell => {
      if (c === 'speed_rpm') return radSToRpm(m.speeds[Math.floor(k / nT)]!);
      if (c === 'torque_Nm') return m.torques[k % nT]!;
      if (c === 'feasible') return ok ? 1 : 0;
      if (isGainColumn(c)) return gain!.feasible[k] === 1 ? (gain![GAIN_ARRAY_OF[c]] as Float64Array)[k]! : null;
      return ok ? (m[ARRAY_OF[c]] as Float64Array)[k]! : null;
    }));
  }
  return csvDocument(rows);
}
