// The values a part of the losses, thermal and duty-cycle sections starts with when the user switches
// it on: invented, of a plausible size, to be replaced by the user's own data (the section says so).
import type { Json } from '../../state/draft';
import { getAt } from '../../state/draft';

/** Iron loss: the hysteresis and eddy terms scale with psi², so one guess fits small and large motors. */
export const START_IRON: Json = { kh: 40, beta: 2, ke: 0.05 };
/** Windage: 11.5 W at 10 000 rpm. */
export const START_WINDAGE: Json = { kw: 1e-8 };
/** An IGBT half-bridge of about 200 A (the example of the losses section's description). */
export const START_INVERTER_LOSSES: Json = {
  Vce0: 0.8,
  rce: 0.002,
  Vf0: 0.9,
  rd: 0.0015,
  EonEoff_J: 0.022,
  Err_J: 0.006,
  Vref_V: 300,
  Iref_A: 200,
  fsw_Hz: 10000,
};

/** The inverter's junction: its resistance to the coolant and its limit, switched on and off together. */
export const START_JUNCTION: Record<string, Json> = { junctionToCoolant_K_per_W: 0.15, junctionMax_C: 150 };

/** A liquid-cooled motor's network (class F winding), with the inverter's junction rated. */
export const START_THERMAL: Json = {
  coolantTemp_C: 40,
  windingCapacity_J_per_K: 900,
  windingToStator_K_per_W: 0.05,
  statorCapacity_J_per_K: 9000,
  statorToCoolant_K_per_W: 0.02,
  magnetAboveStator_K: 10,
  windingMax_C: 155,
  magnetMax_C: 140,
  ...START_JUNCTION,
};

/** A self-ventilated motor's stator-to-coolant resistance: falling as the fan speeds up. */
export const START_BY_SPEED: Json = { speed_rpm: [0, 1500, 3000], K_per_W: [0.06, 0.03, 0.02] };

const finite = (x: Json | undefined): x is number => typeof x === 'number' && Number.isFinite(x);

/**
 * A first duty cycle from the project's requirement points: the first continuous-duty point (else
 * the first point; else 1000 rpm and 1 N·m) as the cruise, reached in 10 s at that torque, held
 * 40 s at it, then braked to rest in 10 s at half of it and left standing 10 s.
 */
export function startingDutyCycle(tree: Json): Json {
  const reqs = getAt(tree, 'requirements');
  const list = Array.isArray(reqs) ? reqs : [];
  const pick = list.find((r) => getAt(r, 'duty') === 'continuous') ?? list[0];
  const s = getAt(pick ?? null, 'speed_rpm');
  const q = getAt(pick ?? null, 'torque_Nm');
  const speed = finite(s) && s !== 0 ? Math.abs(s) : 1000;
  const torque = finite(q) && q !== 0 ? Math.abs(q) : 1;
  return {
    label: 'new cycle (invented)',
    t_s: [0, 10, 50, 50.01, 60, 60.01, 70],
    speed_rpm: [0, speed, speed, speed, 0, 0, 0],
    torque_Nm: [torque, torque, torque, -torque / 2, -torque / 2, 0, 0],
  };
}
