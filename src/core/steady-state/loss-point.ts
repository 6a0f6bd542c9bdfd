/**
 * The steady operating point with losses, at a mechanical speed and a shaft torque.
 *
 * Power flow (motor reference direction): the inverter draws P_dc = P_ac + P_inv from the DC link; the
 * motor takes P_ac = 1.5 (vd id + vq iq) = P_cu + T_em w (the model's steady voltage and torque); the
 * air gap's T_em w covers the shaft power T_shaft w, the iron loss and the mechanical loss. So the
 * electromagnetic torque is the fixed point
 *
 *   T_em = T_shaft + (P_fe(i(T_em)) + P_mech) / w
 *
 * (iron loss depends on the current through the flux), iterated from T_em = T_shaft until successive
 * values agree to 1e-12 relative (well inside the 1e-9 asked, so that the loss-minimising search of
 * min-loss-current.ts starts on its own locus); at standstill T_em = T_shaft (no iron or mechanical power). The
 * current for each T_em is the least-current point (operating-point.ts). With `minLoss` the current
 * is then the one of least copper + iron + inverter loss along the locus of the same shaft torque
 * (min-loss-current.ts; the mechanical loss depends on the speed only), never worse than the least
 * current's. (Holding the shaft torque rather than T_em fixed keeps the comparison to the same
 * output: a current with less iron loss needs less T_em when motoring and more when generating.)
 *
 * Efficiencies are output over input (point-losses.ts, efficiencies): motoring (T_shaft w > 0)
 * motor = shaft / P_ac, inverter = P_ac / P_dc, system = shaft / P_dc; generating (T_shaft w < 0) the
 * other way round (electrical out over mechanical in); 0 at zero shaft power. An infeasible point
 * reports the losses of the current it would need.
 */
import type { DriveLimits } from '../drive/inverter-spec';
import type { MachineInput, MachineModel } from '../machine/machine-model';
import type { LimitedBy, OperatingPoint, Region } from './operating-point-types';
import { InputError } from '../base/errors';
import { machineModel } from '../machine/linear-dq';
import { mechanicalLoss } from '../machine/motor-losses';
import { assertFinite } from './mtpa';
import { solveOperatingPoint } from './operating-point';
import { efficiencies, type LossConditions, newPointLossScratch, PL, type PointLossScratch, pointLosses } from './point-losses';
import { minLossCurrent } from './min-loss-current';

export interface LossPoint {
  feasible: boolean;
  /** the limit that decides an infeasible point (or the voltage in field weakening) */
  limitedBy: LimitedBy;
  region: Region;
  /** which rule chose the current */
  control: 'least-current' | 'min-loss';
  /** mechanical speed, rad/s */
  speed: number;
  torqueShaft_Nm: number;
  torqueEm_Nm: number;
  id: number;
  iq: number;
  /** |i_dq|, A peak */
  current: number;
  vd: number;
  vq: number;
  /** |v_dq|, V peak phase */
  voltage: number;
  losses: { copper_W: number; iron_W: number; mechanical_W: number; inverter_W: number };
  /** fractions */
  efficiency: { motor: number; inverter: number; system: number };
  shaftPower_W: number;
  acPower_W: number;
  dcPower_W: number;
  dcCurrent_A: number;
  /** cos(phi) of v_dq against i_dq, signed (negative generating), 0 at zero current */
  powerFactor: number;
  /** |v_dq| / (Vdc / 2) */
  modulationIndex: number;
  /** fixed-point iterations used */
  iterations: number;
}

export interface LossPointOptions {
  /** choose the current of least copper + iron + inverter loss instead of the least current */
  minLoss?: boolean;
}

const TOL = 1e-12;
const MAX_ITER = 100;
/** consecutive infeasible iterates after which the point is taken as outside the envelope */
const MAX_OUTSIDE = 8;

/** Validate the loss conditions (the DC voltage and the friction terms). */
export function assertLossConditions(c: LossConditions): void {
  if (!(Number.isFinite(c.Vdc) && c.Vdc > 0)) throw new InputError('inverter.Vdc', `must be a positive number of volts (got ${c.Vdc})`);
  if (!(Number.isFinite(c.friction.B) && c.friction.B >= 0)) throw new InputError('motor.viscousFriction', `must be a number >= 0 N·m·s/rad (got ${c.friction.B})`);
  if (!(Number.isFinite(c.friction.Tc) && c.friction.Tc >= 0)) throw new InputError('motor.coulombFriction', `must be a number >= 0 N·m (got ${c.friction.Tc})`);
}

/**
 * The least-current point of the T_em fixed point at speed w and shaft torque Ts (pMech the mechanical
 * loss at w), from the guess T0 (default Ts): the residual e(T) = Ts + (P_fe(i(T)) + pMech)/w - T is
 * driven to |e| <= tol |T| (default 1e-12) by the plain step T + e, then secant steps (each residual costs one
 * least-current solve). An infeasible iterate does not stop it (generating, the first guess T_em = Ts
 * can lie beyond the envelope while the fixed point does not): the losses of the current it would need
 * drive the next step, and the point is infeasible when the converged one is. An infeasible iterate
 * after a feasible one ends it as infeasible: the iterates approach the fixed point from one side (the
 * loss torque changes little with T_em), so crossing the envelope's edge outward means the fixed point
 * lies beyond it (and at the edge the losses jump, where a fixed point need not exist); so does a run
 * of MAX_OUTSIDE infeasible iterates.
 */
export function lossFixedPoint(m: MachineModel, lim: DriveLimits, c: LossConditions, w: number, Ts: number, pMech: number, sc: PointLossScratch, T0 = Ts, tol = TOL): { point: OperatingPoint; iterations: number } {
  let T = w === 0 ? Ts : T0;
  let Tp = Number.NaN, ep = Number.NaN;
  let p: OperatingPoint;
  let it = 0, wasFeasible = false, outside = 0;
  for (;;) {
    it++;
    p = solveOperatingPoint(m, lim, w, T);
    outside = p.feasible ? 0 : outside + 1;
    if (w === 0 || it >= MAX_ITER || (wasFeasible && !p.feasible) || outside >= MAX_OUTSIDE) break;
    wasFeasible = p.feasible;
    pointLosses(m, c, w, p.id, p.iq, sc);
    const e = Ts + (sc.r[PL.iron]! + pMech) / w - T;
    if (Math.abs(e) <= tol * Math.max(Math.abs(T), Math.abs(T + e))) break;
    // secant on e(T) once two residuals are known and the last step shrank the residual
    let Tn = T + e;
    if (!Number.isNaN(ep) && e !== ep && Math.abs(e) < Math.abs(ep)) {
      const ts = T - (e * (T - Tp)) / (e - ep);
      if (Number.isFinite(ts)) Tn = ts;
    }
    Tp = T; ep = e; T = Tn;
  }
  return { point: p, iterations: it };
}

/** The operating point with losses at mechanical speed `speed_rad_s` and shaft torque `torqueShaft_Nm`. */
export function solveLossPoint(input: MachineInput, lim: DriveLimits, c: LossConditions, speed_rad_s: number, torqueShaft_Nm: number, opts: LossPointOptions = {}): LossPoint {
  assertFinite('speed', speed_rad_s, 'rad/s');
  assertFinite('torque', torqueShaft_Nm, 'N·m');
  assertLossConditions(c);
  const m = machineModel(input);
  const w = speed_rad_s, Ts = torqueShaft_Nm;
  const sc = newPointLossScratch();
  const pMech = mechanicalLoss(c.friction, c.losses.windage, w);
  const fp = lossFixedPoint(m, lim, c, w, Ts, pMech, sc);
  let p = fp.point;
  const it = fp.iterations;
  if (opts.minLoss === true) p = minLossCurrent(m, lim, c, w, Ts, pMech, p, sc);
  pointLosses(m, c, w, p.id, p.iq, sc);
  const r = sc.r;
  const cu = r[PL.copper]!, fe = r[PL.iron]!, inv = r[PL.inverter]!, pac = r[PL.acPower]!;
  const pdc = pac + inv;
  const ps = Ts * w;
  const e = new Float64Array(3);
  efficiencies(ps, pac, pdc, e);
  const efficiency = { motor: e[0]!, inverter: e[1]!, system: e[2]! };
  return {
    feasible: p.feasible, limitedBy: p.limitedBy, region: p.region,
    control: opts.minLoss === true ? 'min-loss' : 'least-current',
    speed: w, torqueShaft_Nm: Ts, torqueEm_Nm: p.feasible ? m.torque(p.id, p.iq) : p.torque,
    id: p.id, iq: p.iq, current: p.current, vd: r[PL.vd]!, vq: r[PL.vq]!, voltage: Math.hypot(r[PL.vd]!, r[PL.vq]!),
    losses: { copper_W: cu, iron_W: fe, mechanical_W: pMech, inverter_W: inv },
    efficiency, shaftPower_W: ps, acPower_W: pac, dcPower_W: pdc, dcCurrent_A: pdc / c.Vdc,
    powerFactor: r[PL.powerFactor]!, modulationIndex: r[PL.modulation]!, iterations: it,
  };
}
