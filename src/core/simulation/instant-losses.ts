/**
 * The loss point of one instant of a duty cycle at the temperatures reached: the temperature model
 * re-tempered in place (winding temperature, magnet at the stator node's plus its offset), then the
 * shaft torque's fixed point T_em = T_shaft + (P_fe + P_mech) / w with least-current control
 * (steady-state/loss-point.ts, lossFixedPoint) under the voltage limit and NO current limit, so that an
 * instant beyond the peak current still has the (converged) losses of the current it needs; the
 * instant is then outside the envelope when that current exceeds the peak limit, or when no current
 * holds the torque within the voltage limit (the losses are then those of the MTPA current for it).
 * The temperatures given to the model are clamped at RUNAWAY_K above the highest limit.
 * Results go into the run's scratch (indices IL); nothing is allocated by this file per call.
 */
import type { DriveLimits } from '../drive/inverter-spec';
import type { TemperatureModel } from '../machine/temperature-model';
import type { ThermalNetworkSpec } from '../machine/thermal-network-spec';
import { magnetTemperature } from '../machine/thermal-network';
import { mechanicalLoss } from '../machine/motor-losses';
import { lossFixedPoint } from '../steady-state/loss-point';
import { type LossConditions, newPointLossScratch, PL, type PointLossScratch, pointLosses } from '../steady-state/point-losses';

/** Indices into InstantLossScratch.out. */
export const IL = { copper: 0, iron: 1, mechanical: 2, inverter: 3, dcPower: 4, current: 5, lossTorque: 6, outside: 7 } as const;
export const IL_COUNT = 8;

/** Why an instant is outside the envelope (IL.outside): 0 inside. */
export const OUTSIDE = ['inside', 'current', 'current-and-voltage', 'voltage', 'beyond-mtpv'] as const;
export type OutsideKind = (typeof OUTSIDE)[number];

/**
 * The loss point is solved at temperatures at most this far above the highest limit, K (a cycle far
 * beyond the envelope can drive the network's periodic state to where a magnet model's flux would
 * vanish; the verdict says so long before, and the traces themselves are not clamped).
 */
export const RUNAWAY_K = 300;

/** The fixed point's relative tolerance: the per-instant energy balance holds to it. */
export const INSTANT_TOL = 1e-9;

export interface InstantLossScratch {
  /** results, indices IL */
  out: Float64Array;
  pl: PointLossScratch;
  /** the voltage limit and no current limit */
  unlimited: DriveLimits;
  peakImax: number;
}

export function newInstantLossScratch(peak: DriveLimits): InstantLossScratch {
  return { out: new Float64Array(IL_COUNT), pl: newPointLossScratch(), unlimited: { Vmax: peak.Vmax, Imax: Infinity }, peakImax: peak.Imax };
}

/**
 * Losses at speed w (rad/s), shaft torque Ts (N·m), winding and stator temperatures (°C) into sc.out;
 * lossTorqueGuess (N·m) starts the fixed point (the last instant's loss torque). Returns sc.out.
 */
export function instantLosses(tm: TemperatureModel, th: ThermalNetworkSpec, c: LossConditions, sc: InstantLossScratch, w: number, Ts: number, winding_C: number, stator_C: number, lossTorqueGuess: number): Float64Array {
  const cap = Math.max(th.windingMax_C, th.magnetMax_C) + RUNAWAY_K;
  tm.setTemperatures(Math.min(winding_C, cap), Math.min(magnetTemperature(th, stator_C), cap));
  const m = tm.model;
  const pMech = mechanicalLoss(c.friction, c.losses.windage, w);
  const p = lossFixedPoint(m, sc.unlimited, c, w, Ts, pMech, sc.pl, Ts + lossTorqueGuess, INSTANT_TOL).point;
  pointLosses(m, c, w, p.id, p.iq, sc.pl);
  const r = sc.pl.r, o = sc.out;
  const fe = r[PL.iron]!, inv = r[PL.inverter]!;
  o[IL.copper] = r[PL.copper]!;
  o[IL.iron] = fe;
  o[IL.mechanical] = pMech;
  o[IL.inverter] = inv;
  o[IL.dcPower] = r[PL.acPower]! + inv;
  o[IL.current] = p.current;
  o[IL.lossTorque] = w === 0 ? 0 : (fe + pMech) / w;
  let why = 0;
  if (!p.feasible) why = p.limitedBy === 'beyond-mtpv' ? 4 : 3;
  else if (p.current > sc.peakImax) why = p.region === 'mtpa' ? 1 : 2;
  o[IL.outside] = why;
  return o;
}
