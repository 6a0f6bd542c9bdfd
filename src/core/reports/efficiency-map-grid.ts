/**
 * The efficiency map of a project as the app computes it, one speed (row) at a time so a worker can
 * say how far it got: the grid (speeds 0..top, shaft torques -T..+T), the empty map, one row solved by
 * the engine's efficiencyMap on the project's hot or cold machine at the peak limits, the best point of
 * a quantity, and the map as CSV (one record per grid point). Arranging only: every loss and
 * efficiency comes from src/core/steady-state/efficiency-map.ts.
 */
import type { ResolvedProject } from '../project/project';
import { lossConditionsFromProject } from '../project/loss-conditions-from-project';
import { efficiencyMap, mapAxis, type EfficiencyMap, type MapControl, newEfficiencyMap } from '../steady-state/efficiency-map';
import { InputError } from '../base/errors';

export type MapCorner = 'hot' | 'cold';
export type EfficiencyQuantity = 'motor' | 'inverter' | 'system';

/** Smallest and largest points per axis the app offers. */
export const GRID_POINTS_MIN = 20;
export const GRID_POINTS_MAX = 150;

export interface EfficiencyGridSpec {
  corner: MapCorner;
  /** points per axis, GRID_POINTS_MIN..GRID_POINTS_MAX */
  points: number;
  /** top speed, rad/s mechanical (> 0) */
  speedMax: number;
  /** largest |shaft torque|, N·m (> 0): the torque axis spans -torqueMax..+torqueMax */
  torqueMax: number;
}

/** The grid's axes: speeds 0..speedMax and torques -torqueMax..torqueMax, `points` each. */
export function efficiencyGridAxes(s: EfficiencyGridSpec): { speeds: Float64Array; torques: Float64Array } {
  if (!Number.isInteger(s.points) || s.points < GRID_POINTS_MIN || s.points > GRID_POINTS_MAX)
    throw new InputError('points', `must be a whole number from ${GRID_POINTS_MIN} to ${GRID_POINTS_MAX} (got ${s.points})`);
  if (!(s.speedMax > 0) || !Number.isFinite(s.speedMax)) throw new InputError('speedMax', `must be a finite speed > 0 rad/s (got ${s.speedMax})`);
  if (!(s.torqueMax > 0) || !Number.isFinite(s.torqueMax)) throw new InputError('torqueMax', `must be a finite torque > 0 N·m (got ${s.torqueMax})`);
  return { speeds: mapAxis(0, s.speedMax, s.points), torques: mapAxis(-s.torqueMax, s.torqueMax, s.points) };
}

/** A map over the axes with no point solved yet (feasible 0, NaN elsewhere). */
export function emptyEfficiencyMap(speeds: Float64Array, torques: Float64Array): EfficiencyMap {
  return newEfficiencyMap(speeds, torques);
}

const FIELDS = ['motor', 'inverter', 'system', 'copper', 'iron', 'mechanical', 'inverterLoss', 'dcPower', 'torqueEm'] as const;

const copyRow = (from: EfficiencyMap, to: EfficiencyMap, i: number): void => {
  const at = i * to.torques.length;
  to.feasible.set(from.feasible, at);
  for (const f of FIELDS) to[f].set(from[f], at);
};

/**
 * Row i (speed i) of the project's map solved into `map`, on the corner's machine at the peak limits,
 * with least-current control (default) or the loss-minimising current; with 'min-loss', `leastCurrent`
 * (same axes) receives the row's least-current start points (efficiencyMap's option of that name).
 */
export function solveEfficiencyRow(p: ResolvedProject, corner: MapCorner, map: EfficiencyMap, i: number, control: MapControl = 'least-current', leastCurrent?: EfficiencyMap): void {
  const speeds = map.speeds.subarray(i, i + 1);
  const lcRow = leastCurrent === undefined ? undefined : newEfficiencyMap(speeds, map.torques);
  const row = efficiencyMap(p.models[corner], p.peak, lossConditionsFromProject(p), speeds, map.torques, { control, ...(lcRow ? { leastCurrent: lcRow } : {}) });
  copyRow(row, map, i);
  if (lcRow && leastCurrent) copyRow(lcRow, leastCurrent, i);
}

/** The best value of a quantity over the feasible points, and where it is (null when no point is feasible). */
export function bestPoint(map: EfficiencyMap, q: EfficiencyQuantity): { value: number; speed: number; torque: number } | null {
  const nT = map.torques.length;
  let best: { value: number; speed: number; torque: number } | null = null;
  for (let k = 0; k < map.feasible.length; k++) {
    const v = map[q][k]!;
    if (map.feasible[k] && Number.isFinite(v) && (best === null || v > best.value)) best = { value: v, speed: map.speeds[Math.floor(k / nT)]!, torque: map.torques[k % nT]! };
  }
  return best;
}
