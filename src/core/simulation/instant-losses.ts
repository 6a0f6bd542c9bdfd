/**
 * The loss point of one instant of a duty cycle at the temperatures reached, as the cycle records it:
 * the loss point at the winding temperature and the magnet's (the stator node's plus its offset)
 * from the one evaluator of the thermal solvers (steady-state/loss-at-temperatures.ts: least
 * current, the fixed point under the voltage limit and no current limit, so that an instant beyond
 * the peak current still has the converged losses of the current it needs; the model's temperatures
 * clamped MODEL_CEILING_K above the highest limit), its losses, DC power, current and loss torque,
 * and why the instant is outside the peak envelope (indices OUTSIDE).
 * Results go into the run's scratch (indices IL); nothing is allocated by this file per call.
 */
import type { DriveLimits } from '../drive/inverter-spec';
import type { TemperatureModel } from '../machine/temperature-model';
import type { ThermalNetworkSpec } from '../machine/thermal-network-spec';
import type { LimitedBy } from '../steady-state/operating-point-types';
import type { LossConditions } from '../steady-state/point-losses';
import { magnetTemperature } from '../machine/thermal-network';
import { LossAtTemperatures } from '../steady-state/loss-at-temperatures';

/** Indices into InstantLossScratch.out. */
export const IL = { copper: 0, iron: 1, mechanical: 2, inverter: 3, dcPower: 4, current: 5, lossTorque: 6, outside: 7 } as const;
export const IL_COUNT = 8;

/** Why an instant is outside the envelope (IL.outside): 0 inside. */
export const OUTSIDE = ['inside', 'current', 'current-and-voltage', 'voltage', 'beyond-mtpv'] as const;
export type OutsideKind = (typeof OUTSIDE)[number];

/** The index into OUTSIDE of a loss point's limit (0 inside the envelope). */
const outsideIndex = (feasible: boolean, l: LimitedBy): number =>
  feasible ? 0 : l === 'current' ? 1 : l === 'current-and-voltage' ? 2 : l === 'beyond-mtpv' ? 4 : 3;

/** The fixed point's relative tolerance: the per-instant energy balance holds to it. */
export const INSTANT_TOL = 1e-9;

export interface InstantLossScratch {
  /** results, indices IL */
  out: Float64Array;
  /** the run's evaluator under the peak limits */
  lp: LossAtTemperatures;
  th: ThermalNetworkSpec;
}

/** A run's scratch: it owns `tm` (re-tempered in place at every instant). */
export function newInstantLossScratch(tm: TemperatureModel, th: ThermalNetworkSpec, c: LossConditions, peak: DriveLimits): InstantLossScratch {
  return { out: new Float64Array(IL_COUNT), lp: new LossAtTemperatures(tm, th, peak, c, INSTANT_TOL), th };
}

/**
 * Losses at speed w (rad/s), shaft torque Ts (N·m), winding and stator temperatures (°C) into sc.out;
 * lossTorqueGuess (N·m) starts the fixed point (the last instant's loss torque). Returns sc.out.
 */
export function instantLosses(sc: InstantLossScratch, w: number, Ts: number, winding_C: number, stator_C: number, lossTorqueGuess: number): Float64Array {
  const lp = sc.lp, o = sc.out;
  const inside = lp.atTorque(w, Ts, winding_C, magnetTemperature(sc.th, stator_C), lossTorqueGuess);
  o[IL.copper] = lp.copper_W;
  o[IL.iron] = lp.iron_W;
  o[IL.mechanical] = lp.mechanical_W;
  o[IL.inverter] = lp.inverter_W;
  o[IL.dcPower] = lp.dcPower_W;
  o[IL.current] = lp.current;
  o[IL.lossTorque] = lp.lossTorque_Nm;
  o[IL.outside] = outsideIndex(inside, lp.limitedBy);
  return o;
}
