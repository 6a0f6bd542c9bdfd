/**
 * The gain of loss-minimising control over least-current control, as a map: at every (speed, shaft
 * torque) of a grid the total loss (copper + iron + inverter + mechanical) with the least current and
 * with the loss-minimising current, the loss saved (least-current less min-loss, W) and the system
 * efficiency gained (percentage points). Both maps come from efficiencyMap (efficiency-map.ts): the
 * min-loss map with its least-current start points, so that each cell compares the two currents of one
 * shaft torque from the same fixed point. The search keeps a current only when its electrical loss is
 * below the start's, and the mechanical loss is the same for both, so the loss saved is never negative
 * and is exactly 0 where the search kept the start (always with no iron and no inverter loss). Cells
 * outside the envelope (either map's feasible 0) have feasible 0 and NaN in every other array.
 */
import type { DriveLimits } from '../drive/inverter-spec';
import type { MachineInput } from '../machine/machine-model';
import type { LossConditions } from './point-losses';
import { efficiencyMap, type EfficiencyMap, newEfficiencyMap } from './efficiency-map';

export interface MinLossGainMap {
  /** mechanical speeds, rad/s */
  speeds: Float64Array;
  /** shaft torques, N·m */
  torques: Float64Array;
  /** 1 inside the envelope, else 0 */
  feasible: Uint8Array;
  /** total loss with the least current, W */
  lossLeastCurrent: Float64Array;
  /** total loss with the loss-minimising current, W */
  lossMinLoss: Float64Array;
  /** lossLeastCurrent - lossMinLoss, W (>= 0) */
  lossSaved: Float64Array;
  /** system efficiency with min-loss less that with the least current, percentage points */
  systemGain_pts: Float64Array;
}

/** Total loss of map point k, W: the electrical losses summed as pointLosses sums them, then the mechanical. */
const totalLoss = (m: EfficiencyMap, k: number): number => m.copper[k]! + m.iron[k]! + m.inverterLoss[k]! + m.mechanical[k]!;

/** The gain of the min-loss map `minLoss` over the least-current map `leastCurrent` (same axes). */
export function minLossGain(leastCurrent: EfficiencyMap, minLoss: EfficiencyMap): MinLossGainMap {
  const N = leastCurrent.feasible.length;
  if (minLoss.feasible.length !== N || minLoss.torques.length !== leastCurrent.torques.length) throw new Error('minLossGain: the two maps must share their axes');
  const nan = () => new Float64Array(N).fill(Number.NaN);
  const g: MinLossGainMap = {
    speeds: leastCurrent.speeds, torques: leastCurrent.torques, feasible: new Uint8Array(N),
    lossLeastCurrent: nan(), lossMinLoss: nan(), lossSaved: nan(), systemGain_pts: nan(),
  };
  for (let k = 0; k < N; k++) {
    if (leastCurrent.feasible[k] !== 1 || minLoss.feasible[k] !== 1) continue;
    const a = totalLoss(leastCurrent, k), b = totalLoss(minLoss, k);
    g.feasible[k] = 1;
    g.lossLeastCurrent[k] = a;
    g.lossMinLoss[k] = b;
    g.lossSaved[k] = a - b;
    g.systemGain_pts[k] = 100 * (minLoss.system[k]! - leastCurrent.system[k]!);
  }
  return g;
}

/**
 * Least-current map, min-loss map and the gain over speeds x shaft torques (the min-loss map's cost:
 * about ten times the least-current map's).
 */
export function minLossGainMap(input: MachineInput, lim: DriveLimits, c: LossConditions, speeds: Float64Array, torques: Float64Array): { leastCurrent: EfficiencyMap; minLoss: EfficiencyMap; gain: MinLossGainMap } {
  const leastCurrent = newEfficiencyMap(speeds, torques);
  const minLoss = efficiencyMap(input, lim, c, speeds, torques, { control: 'min-loss', leastCurrent });
  return { leastCurrent, minLoss, gain: minLossGain(leastCurrent, minLoss) };
}
