/**
 * The current that minimises the electrical losses (copper + iron + inverter) for one shaft torque at
 * one speed, within |i_dq| <= Imax and |v_dq| <= Vmax, through the machine model.
 *
 * Method: the locus of constant shaft torque, torque(id, iq) - (P_fe(id, iq) + P_mech) / w = T_shaft
 * (at standstill the constant electromagnetic torque), is parametrised by id; its iq is bisected on
 * [0, sqrt(Imax^2 - id^2)] with the sign of the least-current point's electromagnetic torque (an id
 * whose locus point needs more than Imax is infeasible). Along this locus the mechanical loss is fixed,
 * so the total loss is minimal where copper + iron + inverter is. From the least-current point the
 * feasible stretch is bracketed on both sides by bisection of feasibility (current, and the voltage
 * within VOLTAGE_SLACK of Vmax), and the loss is minimised over it by golden section (Kiefer (1953),
 * assumed unimodal along the stretch). The result is kept only when its loss is below the
 * least-current point's, so it is never worse; with no iron or inverter losses the locus is one of
 * constant electromagnetic torque and the least copper loss is the least current.
 */
import type { DriveLimits } from '../drive/inverter-spec';
import type { MachineModel } from '../machine/machine-model';
import type { OperatingPoint } from './operating-point-types';
import { type LossConditions, type PointLossScratch, PL, pointLosses } from './point-losses';
import { ironLossAt } from '../machine/motor-losses';
import { goldenSectionMax } from '../mathematics/root-finding';
import { point } from './point-of-current';

/** relative voltage excess tolerated on the locus (the least-current point lies on Vmax in field weakening) */
export const VOLTAGE_SLACK = 1e-10;

/** The constant-shaft-torque locus at one speed. */
export interface ShaftLocus {
  m: MachineModel;
  c: LossConditions;
  Imax: number;
  /** mechanical speed, rad/s */
  w: number;
  /** shaft torque, N·m */
  Ts: number;
  /** mechanical loss at w, W */
  pMech: number;
  /** sign of the electromagnetic torque (and of iq) on the locus */
  sign: 1 | -1;
  /** 2-element scratch */
  flux: Float64Array;
}

/** Shaft torque of (id, iq): the electromagnetic torque less the iron and mechanical loss torques. */
export function shaftTorque(L: ShaftLocus, id: number, iq: number): number {
  const T = L.m.torque(id, iq);
  if (L.w === 0) return T;
  return T - (ironLossAt(L.m, L.c.losses.iron, id, iq, L.m.polePairs * L.w, L.flux) + L.pMech) / L.w;
}

/** iq on the locus at id, within |i| <= Imax; NaN when there is none. */
export function locusIq(L: ShaftLocus, id: number): number {
  const rem = L.Imax * L.Imax - id * id;
  if (!(rem > 0)) return Number.NaN;
  const s = L.sign, target = s * L.Ts;
  const top = Math.sqrt(rem);
  if (!(s * shaftTorque(L, id, s * top) >= target)) return Number.NaN;
  if (s * shaftTorque(L, id, 0) >= target) return Number.NaN;
  let lo = 0, hi = top;
  for (let it = 0; it < 200 && hi - lo > 1e-15 * top; it++) {
    const mid = 0.5 * (lo + hi);
    if (s * shaftTorque(L, id, s * mid) >= target) hi = mid;
    else lo = mid;
  }
  return s * hi;
}

/**
 * The loss-minimising point for shaft torque Ts at mechanical speed w, or p0 (the least-current
 * point of the same shaft torque) when nothing along the locus has less loss, or p0 is infeasible
 * or makes no torque. On the voltage boundary the point says region 'field-weakening' (limitedBy
 * 'voltage'), else 'mtpa'.
 */
export function minLossCurrent(m: MachineModel, lim: DriveLimits, c: LossConditions, w: number, Ts: number, pMech: number, p0: OperatingPoint, sc: PointLossScratch): OperatingPoint {
  if (!p0.feasible || p0.iq === 0) return p0;
  const L: ShaftLocus = { m, c, Imax: lim.Imax, w, Ts, pMech, sign: p0.iq < 0 ? -1 : 1, flux: new Float64Array(2) };
  return minLossOnLocus(L, lim, w, p0, sc);
}

/**
 * The search itself along a locus (its points parametrised by id): from p0 the feasible stretch at the
 * real mechanical speed w (current, and the voltage within VOLTAGE_SLACK of Vmax) bracketed on both
 * sides by bisection, the loss at w minimised over it by golden section; p0 unless a point has less
 * loss. Shared by the shaft-torque locus (above) and the electromagnetic-torque locus (min-loss-em-torque.ts).
 */
export function minLossOnLocus(L: ShaftLocus, lim: DriveLimits, w: number, p0: OperatingPoint, sc: PointLossScratch): OperatingPoint {
  const m = L.m, c = L.c;
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
    let a = id0, b = end; // a feasible, b not (|id| = Imax leaves no iq)
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
    return Math.hypot(sc.r[PL.vd]!, sc.r[PL.vq]!) <= vmax ? -loss : -Infinity;
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
