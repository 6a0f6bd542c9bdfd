/**
 * The current that minimises the electrical losses (copper + iron + inverter) for one
 * electromagnetic torque at one speed, within |i_dq| <= Imax and |v_dq| <= Vmax, through the
 * machine model: what a firmware table indexed by electromagnetic torque holds under
 * loss-minimising control (min-loss-current.ts holds the shaft torque instead).
 *
 * Method: min-loss-current.ts's search (minLossOnLocus), on the locus of constant electromagnetic torque: the locus is
 * parametrised by id (its iq bisected by locusIq on a locus at standstill, where the shaft torque is
 * the electromagnetic torque); from the least-current point the feasible stretch (current, and the
 * voltage at the real speed within VOLTAGE_SLACK of Vmax) is bracketed on both sides by bisection and
 * the loss at the real speed is minimised over it by golden section (Kiefer (1953), assumed unimodal
 * along the stretch). Kept only when its loss is below the least-current point's, so never worse;
 * with no iron or inverter losses the least copper loss is the least current.
 */
import type { DriveLimits } from '../drive/inverter-spec';
import type { MachineModel } from '../machine/machine-model';
import type { OperatingPoint } from './operating-point-types';
import type { LossConditions, PointLossScratch } from './point-losses';
import { minLossOnLocus, type ShaftLocus } from './min-loss-current';

/**
 * The loss-minimising point of electromagnetic torque T at mechanical speed w, or p0 (the
 * least-current point of that torque) when nothing along the locus has less loss, or p0 is
 * infeasible or makes no torque. On the voltage boundary the point says 'field-weakening'.
 */
export function minLossAtEmTorque(m: MachineModel, lim: DriveLimits, c: LossConditions, w: number, T: number, p0: OperatingPoint, sc: PointLossScratch): OperatingPoint {
  if (!p0.feasible || p0.iq === 0 || T === 0) return p0;
  // w = 0 on the locus: its "shaft" torque is the electromagnetic torque, whatever the losses
  const L: ShaftLocus = { m, c, Imax: lim.Imax, w: 0, Ts: T, pMech: 0, sign: p0.iq < 0 ? -1 : 1, flux: new Float64Array(2) };
  return minLossOnLocus(L, lim, w, p0, sc);
}
