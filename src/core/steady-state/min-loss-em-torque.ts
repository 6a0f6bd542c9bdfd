/**
 * The current that minimises the electrical losses (copper + iron + inverter) for one
 * electromagnetic torque at one speed, within |i_dq| <= Imax and |v_dq| <= Vmax, through the
 * machine model: what a firmware table indexed by electromagnetic torque holds under
 * loss-minimising control (min-loss-current.ts holds the shaft torque instead).
 *
 * Method as in min-loss-current.ts, on the locus of constant electromagnetic torque: the locus is
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
import { type LossConditions, type PointLossScratch, pointLosses } from './point-losses';
import { locusIq, type ShaftLocus, VOLTAGE_SLACK } from './min-loss-current';
import { goldenSectionMax } from '../mathematics/root-finding';
import { point } from './point-of-current';

/**
 * The loss-minimising point of electromagnetic torque T at mechanical speed w, or p0 (the
 * least-current point of that torque) when nothing along the locus has less loss, or p0 is
 * infeasible or makes no torque. On the voltage boundary the point says 'field-weakening'.
 */
export function minLossAtEmTorque(m: MachineModel, lim: DriveLimits, c: LossConditions, w: number, T: number, p0: OperatingPoint, sc: PointLossScratch): OperatingPoint {
  if (!p0.feasible || p0.iq === 0 || T === 0) return p0;
  // w = 0 on the locus: its "shaft" torque is the electromagnetic torque, whatever the losses
  const L: ShaftLocus = { m, c, Imax: lim.Imax, w: 0, Ts: T, pMech: 0, sign: p0.iq < 0 ? -1 : 1, flux: new Float64Array(2) };
  const vmax = lim.Vmax * (1 + VOLTAGE_SLACK);
  const v = sc.v;
  const we = m.polePairs * w;
  const feasible = (id: number): boolean => {
    const iq = locusIq(L, id);
    if (Number.isNaN(iq)) return false;
    m.steadyVoltage(id, iq, we, v);
    return Math.hypot(v[0]!, v[1]!) <= vmax;
  };
  const id0 = p0.id;
  if (!feasible(id0)) return p0;
  const edge = (end: number): number => {
    let a = id0, b = end;
    for (let it = 0; it < 64; it++) {
      const mid = 0.5 * (a + b);
      if (feasible(mid)) a = mid;
      else b = mid;
    }
    return a;
  };
  const lo = edge(-lim.Imax), hi = edge(lim.Imax);
  if (!(hi > lo)) return p0;
  const negLoss = (id: number): number => {
    const iq = locusIq(L, id);
    if (Number.isNaN(iq)) return -Infinity;
    const loss = pointLosses(m, c, w, id, iq, sc);
    m.steadyVoltage(id, iq, we, v);
    return Math.hypot(v[0]!, v[1]!) <= vmax ? -loss : -Infinity;
  };
  const L0 = pointLosses(m, c, w, p0.id, p0.iq, sc);
  const out = new Float64Array(2);
  goldenSectionMax(negLoss, lo, hi, 64, out);
  const id = out[0]!;
  const iq = locusIq(L, id);
  if (Number.isNaN(iq) || !feasible(id) || !(-out[1]! < L0)) return p0;
  const q = point(m, w, id, iq, 'mtpa');
  if (q.voltage >= lim.Vmax * (1 - VOLTAGE_SLACK)) { q.region = 'field-weakening'; q.limitedBy = 'voltage'; }
  return q;
}
