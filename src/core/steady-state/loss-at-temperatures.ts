/**
 * The loss point at given winding and magnet temperatures: the one evaluator of the thermal solvers
 * (the coupled steady state, the S1 curve, the peak duration, the duty cycle). The run's temperature
 * model (machine/temperature-model.ts) is re-tempered in place (winding resistance by copper's
 * coefficient, magnet flux by its remanence coefficient), then one of two points is solved on it:
 *
 *  - at a shaft torque (atTorque): the fixed point T_em = T_shaft + (P_fe + P_mech) / w with
 *    least-current control (loss-point.ts, lossFixedPoint) under the voltage limit and no current
 *    limit, so that a point beyond the current limit still has the converged losses of the current it
 *    needs (a heating overload, a duty-cycle instant outside the envelope, an iterate of the coupled
 *    state); it is then infeasible when that current exceeds Imax, named as solveOperatingPoint names
 *    it (operating-point.ts: 'current' when even the MTPA current for the torque exceeds Imax, else
 *    'current-and-voltage'), or when no current holds the torque within the voltage limit
 *    ('beyond-mtpv', 'voltage'; the losses are then those of the MTPA current for it). Within Imax
 *    this is the point and the losses of solveLossPoint on the machine at those temperatures.
 *  - at a current (atCurrent): the largest torque of a sign within the current I and the voltage
 *    limit (max-torque.ts), the S1 curve's parametrisation.
 *
 * The temperatures given to the model are clamped at MODEL_CEILING_K above the highest limit (an
 * iterate or a runaway cycle far beyond every limit would otherwise drive a magnet's linear flux law
 * through zero); the temperatures used are reported (winding_C, magnet_C), and the copper loss's
 * temperature law is to be taken at them. One instance per run (it owns the model's temperature
 * state and its scratch; never share one); allocates nothing per call.
 */
import type { DriveLimits } from '../drive/inverter-spec';
import type { MachineModel } from '../machine/machine-model';
import type { TemperatureModel } from '../machine/temperature-model';
import type { ThermalNetworkSpec } from '../machine/thermal-network-spec';
import type { LimitedBy, Region } from './operating-point-types';
import { mechanicalLoss } from '../machine/motor-losses';
import { assertLossConditions, lossFixedPoint } from './loss-point';
import { type MaxTorqueScratch, maxTorqueCore, newScratch } from './max-torque';
import { assertLimits, mtpaCurrentForTorque } from './mtpa';
import { type LossConditions, newPointLossScratch, PL, type PointLossScratch, pointLosses } from './point-losses';

/** The model is evaluated at temperatures at most this far above the highest limit (winding, magnet), K. */
export const MODEL_CEILING_K = 300;

/** The highest temperature the model is evaluated at, °C: MODEL_CEILING_K above the highest limit. */
export const modelCeiling_C = (net: ThermalNetworkSpec): number => Math.max(net.windingMax_C, net.magnetMax_C) + MODEL_CEILING_K;

/** The loss fixed point's default relative tolerance (loss-point.ts). */
const FIXED_POINT_TOL = 1e-12;

const REGIONS: readonly Region[] = ['mtpa', 'field-weakening', 'mtpv'];

export class LossAtTemperatures {
  /** within the limits (atTorque), or a torque of the sign exists at the current (atCurrent) */
  feasible = false;
  /** the point's limit: 'none' in MTPA, 'voltage' in field weakening or MTPV; infeasible: the limit broken */
  limitedBy: LimitedBy = 'none';
  region: Region = 'mtpa';
  /** the temperatures the model was evaluated at, °C (the ones given, clamped) */
  winding_C = 0; magnet_C = 0;
  /** W */
  copper_W = 0; iron_W = 0; mechanical_W = 0; inverter_W = 0; acPower_W = 0; dcPower_W = 0;
  /** A peak */
  id = 0; iq = 0; current = 0;
  /** |v_dq|, V peak phase */
  voltage = 0;
  /** electromagnetic torque (asked for, when no current holds it), N·m */
  torqueEm_Nm = 0;
  /** (P_fe + P_mech) / w, N·m (0 at standstill) */
  lossTorque_Nm = 0;
  /** the temperature model's model */
  readonly model: MachineModel;
  private readonly ceiling: number;
  /** no node of the network falls below the coolant under losses >= 0 (the magnet: by its offset, when negative) */
  private readonly floorWinding: number;
  private readonly floorMagnet: number;
  private readonly unlimited: DriveLimits;
  private readonly sc: PointLossScratch = newPointLossScratch();
  private readonly ms: MaxTorqueScratch = newScratch();

  /**
   * tm: the run's temperature model; net: its limits set the ceiling; lim: the point's limits;
   * tol: the torque fixed point's relative tolerance (default 1e-12).
   */
  constructor(readonly tm: TemperatureModel, net: ThermalNetworkSpec, readonly lim: DriveLimits, readonly c: LossConditions, readonly tol = FIXED_POINT_TOL) {
    assertLossConditions(c);
    assertLimits(lim);
    this.model = tm.model;
    this.ceiling = modelCeiling_C(net);
    this.floorWinding = net.coolantTemp_C;
    this.floorMagnet = net.coolantTemp_C + Math.min(0, net.magnetAboveStator_K);
    this.unlimited = { Vmax: lim.Vmax, Imax: Infinity };
  }

  private retemper(winding_C: number, magnet_C: number): void {
    // an extrapolated state (the duty cycle's periodic-state step) may leave the physical range: the model is evaluated within it
    this.winding_C = Math.min(Math.max(winding_C, this.floorWinding), this.ceiling);
    this.magnet_C = Math.min(Math.max(magnet_C, this.floorMagnet), this.ceiling);
    this.tm.setTemperatures(this.winding_C, this.magnet_C);
  }

  /** Losses of the point's current at speed w into the fields. */
  private losses(w: number, pMech: number): void {
    const r = this.sc.r;
    pointLosses(this.model, this.c, w, this.id, this.iq, this.sc);
    this.copper_W = r[PL.copper]!; this.iron_W = r[PL.iron]!; this.inverter_W = r[PL.inverter]!; this.mechanical_W = pMech;
    this.acPower_W = r[PL.acPower]!; this.dcPower_W = this.acPower_W + this.inverter_W;
    this.voltage = Math.hypot(r[PL.vd]!, r[PL.vq]!);
    this.lossTorque_Nm = w === 0 ? 0 : (this.iron_W + pMech) / w;
  }

  /**
   * The least-current point of shaft torque Ts at mechanical speed w (rad/s) at the winding and
   * magnet temperatures (°C); the fixed point starts from Ts + lossTorqueGuess (default: the last
   * call's loss torque). Returns feasible.
   */
  atTorque(w: number, Ts: number, winding_C: number, magnet_C: number, lossTorqueGuess = this.lossTorque_Nm): boolean {
    this.retemper(winding_C, magnet_C);
    const m = this.model;
    const pMech = mechanicalLoss(this.c.friction, this.c.losses.windage, w);
    const p = lossFixedPoint(m, this.unlimited, this.c, w, Ts, pMech, this.sc, Ts + (w === 0 ? 0 : lossTorqueGuess), this.tol).point;
    this.id = p.id; this.iq = p.iq; this.current = p.current; this.region = p.region;
    this.torqueEm_Nm = p.feasible ? m.torque(p.id, p.iq) : p.torque;
    this.feasible = p.feasible && p.current <= this.lim.Imax;
    this.limitedBy = p.feasible && !this.feasible ? (mtpaCurrentForTorque(m, this.torqueEm_Nm).current > this.lim.Imax ? 'current' : 'current-and-voltage') : p.limitedBy;
    this.losses(w, pMech);
    return this.feasible;
  }

  /**
   * The largest torque of `sign` within current I (A peak) and the voltage limit at mechanical speed
   * w (rad/s) at the winding and magnet temperatures (°C); returns false (the fields untouched but
   * the temperatures) when no point gives torque of that sign.
   */
  atCurrent(w: number, I: number, sign: 1 | -1, winding_C: number, magnet_C: number): boolean {
    this.retemper(winding_C, magnet_C);
    const m = this.model, ms = this.ms;
    // the numeric path keeps the torque maxima along the current circle for the model object it found
    // them on; re-tempering changes that object's flux in place, so they are found again
    if (ms.numeric !== null) ms.numeric.circle.model = null;
    maxTorqueCore(m, this.lim.Vmax, I, m.polePairs * w, sign, ms);
    this.feasible = ms.ok;
    if (!ms.ok) return false;
    this.id = ms.id; this.iq = ms.iq; this.current = Math.hypot(ms.id, ms.iq); this.region = REGIONS[ms.region]!;
    this.limitedBy = ms.region === 0 ? 'none' : 'voltage';
    this.torqueEm_Nm = m.torque(ms.id, ms.iq);
    this.losses(w, mechanicalLoss(this.c.friction, this.c.losses.windage, w));
    return true;
  }
}
