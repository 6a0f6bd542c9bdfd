// The efficiency map's rows for the CLI: the map at some speeds of the grid, least-current
// or loss-minimising (steady-state/efficiency-map.ts, either control), at the hot or cold
// corner. Each speed row depends on that row alone, so rows computed on several threads and put
// together are identical to the whole map computed on one.
import type { ResolvedProject } from '../core/project/project';
import { lossConditionsFromProject } from '../core/project/loss-conditions-from-project';
import { efficiencyMap, type EfficiencyMap } from '../core/steady-state/efficiency-map';

export type Corner = 'hot' | 'cold';

export interface GridSpec {
  corner: Corner;
  minLoss: boolean;
  /** shaft torques, N·m */
  torques: Float64Array;
}

/** The arrays of an EfficiencyMap a grid keeps (all but the axes). */
export const MAP_ARRAYS = ['feasible', 'motor', 'inverter', 'system', 'copper', 'iron', 'mechanical', 'inverterLoss', 'dcPower', 'torqueEm'] as const;

/** The map at mechanical speeds `speeds` (rad/s) over the grid's torques. */
export function efficiencyRows(p: ResolvedProject, g: GridSpec, speeds: Float64Array): EfficiencyMap {
  const model = g.corner === 'hot' ? p.models.hot : p.models.cold;
  const c = lossConditionsFromProject(p);
  if (!g.minLoss) return efficiencyMap(model, p.peak, c, speeds, g.torques);
  return efficiencyMap(model, p.peak, c, speeds, g.torques, { control: 'min-loss' });
}

/** The whole map from its row blocks, in speed order (each block's speeds follow the last's). */
export function joinRows(speeds: Float64Array, torques: Float64Array, blocks: readonly EfficiencyMap[]): EfficiencyMap {
  const N = speeds.length * torques.length;
  const r = {
    speeds, torques, feasible: new Uint8Array(N), motor: new Float64Array(N), inverter: new Float64Array(N), system: new Float64Array(N),
    copper: new Float64Array(N), iron: new Float64Array(N), mechanical: new Float64Array(N), inverterLoss: new Float64Array(N), dcPower: new Float64Array(N), torqueEm: new Float64Array(N),
  } satisfies EfficiencyMap;
  let at = 0;
  for (const b of blocks) {
    for (const key of MAP_ARRAYS) (r[key] as Float64Array | Uint8Array).set(b[key], at);
    at += b.speeds.length * torques.length;
  }
  if (at !== N) throw new Error(`the row blocks hold ${at} points, the grid ${N}`);
  return r;
}

/** An empty map over speeds x torques whose arrays live in shared memory (written by several threads). */
export function sharedMap(speeds: Float64Array, torques: Float64Array): EfficiencyMap {
  const N = speeds.length * torques.length;
  const f64 = (): Float64Array => new Float64Array(new SharedArrayBuffer(8 * N));
  return {
    speeds, torques, feasible: new Uint8Array(new SharedArrayBuffer(N)), motor: f64(), inverter: f64(), system: f64(),
    copper: f64(), iron: f64(), mechanical: f64(), inverterLoss: f64(), dcPower: f64(), torqueEm: f64(),
  };
}

/** Speed row `i` of the map over `out`'s axes, computed on its own (efficiencyRows) and written into `out`. */
export function writeRow(p: ResolvedProject, g: GridSpec, out: EfficiencyMap, i: number): void {
  const row = efficiencyRows(p, g, out.speeds.subarray(i, i + 1));
  const at = i * out.torques.length;
  for (const key of MAP_ARRAYS) (out[key] as Float64Array | Uint8Array).set(row[key], at);
}

/** A copy of `m` in ordinary (unshared) arrays. */
export function ownMap(m: EfficiencyMap): EfficiencyMap {
  return joinRows(m.speeds, m.torques, [m]);
}
