/**
 * The thermally coupled steady state at a (speed, shaft torque): the losses heat the network
 * (machine/thermal-network.ts), the temperatures re-temper the model (winding resistance, magnet
 * flux: machine/temperature-model.ts), and the re-tempered model gives the losses again; solved to
 * convergence.
 *
 * Iteration: from temperatures x = (T_w, T_s) the loss point at those temperatures
 * (loss-at-temperatures.ts, least current; magnet at T_s + magnetAboveStator) gives P_cu, P_fe; the next x is the network's
 * steady state with P_fe held and the copper loss following the winding's own temperature at the
 * current held, P_cu(T) = P_cu (1 + a (T - 20)) / (1 + a (T_w - 20)) (a copper's coefficient, the
 * law of thermal.ts): a linear equation in T solved exactly, so that the strongest coupling
 * (resistance) costs no iteration. What remains (the magnet's flux moving the current, the iron loss
 * moving with the flux) is contracting and accelerated by Anderson's method of depth one (Walker and
 * Ni (2011), Anderson acceleration for fixed-point iterations, SIAM J. Numer. Anal. 49(4)). Converged
 * when the step is below 1e-6 K (THERMAL_TOL_K). Thermal runaway: the copper loss grows with the
 * winding's temperature faster than the network removes it (a (R_ws + R_sc) dP_cu/dT >= 1 at the
 * current reached), or a temperature beyond the model's ceiling (loss-at-temperatures.ts,
 * modelCeiling_C: 300 K above the highest limit, where the losses are no longer evaluated); no steady
 * state exists then (within the model's reach). Outside the
 * envelope: the point cannot be made within the limits at the last temperatures reached (iterates
 * outside it go on with the losses of the current they would need).
 */
import type { DriveLimits } from '../drive/inverter-spec';
import type { TemperatureModel } from '../machine/temperature-model';
import type { ThermalNetworkSpec } from '../machine/thermal-network-spec';
import type { LimitedBy } from './operating-point-types';
import type { LossConditions } from './point-losses';
import { InputError } from '../base/errors';
import { COPPER_ALPHA_20 } from '../machine/thermal';
import { junctionTemperature, statorToCoolantAt } from '../machine/thermal-network';
import { LossAtTemperatures, modelCeiling_C } from './loss-at-temperatures';
import { assertFinite } from './mtpa';

/** Convergence of the coupled temperatures, K (largest step of winding and stator temperature). */
export const THERMAL_TOL_K = 1e-6;
const MAX_ITER = 60;

export type CoupledStatus = 'converged' | 'runaway' | 'outside-envelope' | 'no-convergence';

export interface CoupledSteadyState {
  status: CoupledStatus;
  /** mechanical speed, rad/s; shaft torque, N·m */
  speed: number;
  torque_Nm: number;
  /** temperatures, °C (the last iterate unless converged) */
  windingTemp_C: number;
  statorTemp_C: number;
  magnetTemp_C: number;
  /** one switch position's junction; the coolant's when the inverter is not rated */
  junctionTemp_C: number;
  losses: { copper_W: number; iron_W: number; mechanical_W: number; inverter_W: number };
  id: number;
  iq: number;
  /** |i_dq|, A peak */
  current: number;
  /** |v_dq|, V peak phase */
  voltage: number;
  torqueEm_Nm: number;
  /** the point's limit (loss-point.ts) */
  limitedBy: LimitedBy;
  /** loss-point evaluations used */
  iterations: number;
}

/** Validate a thermal network (each limit above the coolant, capacities and resistances positive). */
export function assertThermalNetwork(s: ThermalNetworkSpec): void {
  const pos = (k: keyof ThermalNetworkSpec & string): void => {
    const v = s[k] as number;
    if (!(Number.isFinite(v) && v > 0)) throw new InputError(`thermal.${k}`, `must be a positive number (got ${v})`);
  };
  if (!Number.isFinite(s.coolantTemp_C)) throw new InputError('thermal.coolantTemp_C', `must be a finite temperature, °C (got ${s.coolantTemp_C})`);
  if (!Number.isFinite(s.magnetAboveStator_K)) throw new InputError('thermal.magnetAboveStator_K', `must be a finite number of kelvin (got ${s.magnetAboveStator_K})`);
  pos('windingCapacity_J_per_K'); pos('windingToStator_K_per_W'); pos('statorCapacity_J_per_K'); pos('statorToCoolant_K_per_W');
  const t = s.statorToCoolantBySpeed;
  if (t !== undefined && (t.speed_rpm.length !== t.K_per_W.length || t.K_per_W.some((r) => !(Number.isFinite(r) && r > 0)) || t.speed_rpm.some((v, k) => !Number.isFinite(v) || (k > 0 && !(v > t.speed_rpm[k - 1]!))))) {
    throw new InputError('thermal.statorToCoolantBySpeed', 'must give increasing speeds and as many positive resistances, K/W');
  }
  for (const k of ['windingMax_C', 'magnetMax_C'] as const) {
    if (!(Number.isFinite(s[k]) && s[k] > s.coolantTemp_C)) throw new InputError(`thermal.${k}`, `must be a temperature above the coolant's ${s.coolantTemp_C} °C (got ${s[k]})`);
  }
  if (s.junctionToCoolant_K_per_W !== undefined) {
    pos('junctionToCoolant_K_per_W');
    const j = s.junctionMax_C;
    if (!(j !== undefined && Number.isFinite(j) && j > s.coolantTemp_C)) throw new InputError('thermal.junctionMax_C', `must be a temperature above the coolant's ${s.coolantTemp_C} °C when junctionToCoolant_K_per_W is given (got ${j})`);
  }
}

/**
 * The network's steady temperatures with the iron loss held and the copper loss `cu` (taken at the
 * winding temperature Tw0) following the winding's own temperature: out[0] = T_w, out[1] = T_s.
 * Returns false (thermal runaway) when no such steady state exists (out NaN) or when it lies beyond
 * the model's ceiling (out that state).
 */
export function copperTrackingSteady(s: ThermalNetworkSpec, cu: number, fe: number, Tw0: number, speed_rpm: number, out: Float64Array): boolean {
  const Rsc = statorToCoolantAt(s, speed_rpm), Rws = s.windingToStator_K_per_W, Tc = s.coolantTemp_C;
  const b = (cu * COPPER_ALPHA_20) / (1 + COPPER_ALPHA_20 * (Tw0 - 20)); // dP_cu/dT_w
  const a = cu - b * Tw0;
  const den = 1 - b * (Rsc + Rws);
  if (!(den > 0)) { out[0] = Number.NaN; out[1] = Number.NaN; return false; }
  const Tw = (Tc + (a + fe) * Rsc + a * Rws) / den;
  const pc = a + b * Tw;
  out[0] = Tw;
  out[1] = Tc + (pc + fe) * Rsc;
  const top = modelCeiling_C(s);
  return Tw < top && out[1] < top;
}

/**
 * Anderson(1) on a fixed-point map of two variables, allocation-free: push x_k and H(x_k), get the
 * next iterate in `next`. Owned by one solve.
 */
export class Anderson2 {
  private n = 0;
  private px0 = 0; private px1 = 0; private ph0 = 0; private ph1 = 0;
  reset(): void { this.n = 0; }
  next(x0: number, x1: number, h0: number, h1: number, next: Float64Array): void {
    const f0 = h0 - x0, f1 = h1 - x1;
    let n0 = h0, n1 = h1;
    if (this.n > 0) {
      const d0 = f0 - (this.ph0 - this.px0), d1 = f1 - (this.ph1 - this.px1);
      const dd = d0 * d0 + d1 * d1;
      if (dd > 0) {
        const g = (f0 * d0 + f1 * d1) / dd;
        n0 = h0 - g * (h0 - this.ph0);
        n1 = h1 - g * (h1 - this.ph1);
      }
    }
    this.px0 = x0; this.px1 = x1; this.ph0 = h0; this.ph1 = h1; this.n++;
    next[0] = n0; next[1] = n1;
  }
}

export interface CoupledOptions {
  /** first guess of winding and stator temperatures, °C (default: the coolant's) */
  start?: { winding_C: number; stator_C: number };
}

/**
 * The thermally coupled steady state at mechanical speed `speed_rad_s` and shaft torque `torque_Nm`
 * under the drive limits `lim` (the point must fit them at the temperatures reached), least-current
 * control. See the file's comment for the method; `status` says whether it converged.
 */
export function coupledSteadyState(tm: TemperatureModel, net: ThermalNetworkSpec, lim: DriveLimits, c: LossConditions, speed_rad_s: number, torque_Nm: number, opts: CoupledOptions = {}): CoupledSteadyState {
  assertFinite('speed', speed_rad_s, 'rad/s');
  assertFinite('torque', torque_Nm, 'N·m');
  assertThermalNetwork(net);
  if (opts.start !== undefined) {
    assertFinite('start.winding_C', opts.start.winding_C, '°C');
    assertFinite('start.stator_C', opts.start.stator_C, '°C');
  }
  return coupledWith(new LossAtTemperatures(tm, net, lim, c), net, speed_rad_s, torque_Nm, opts);
}

/** The coupled steady state with a caller-owned loss evaluator (no validation): the reusable core of coupledSteadyState. */
export function coupledWith(lp: LossAtTemperatures, net: ThermalNetworkSpec, w: number, Ts: number, opts: CoupledOptions = {}): CoupledSteadyState {
  const rpm = (w * 30) / Math.PI, off = net.magnetAboveStator_K, Tc = net.coolantTemp_C, top = modelCeiling_C(net);
  let x0 = opts.start?.winding_C ?? net.coolantTemp_C, x1 = opts.start?.stator_C ?? net.coolantTemp_C;
  const h = new Float64Array(2), nx = new Float64Array(2);
  const acc = new Anderson2();
  let status: CoupledStatus = 'no-convergence';
  let it = 0;
  let feasible = false, everOutside = false;
  for (; it < MAX_ITER;) {
    it++;
    // an iterate outside the envelope goes on with the losses of the current it would need (cooler
    // than the steady state, a point near the maximum speed can need the hot magnet's lower flux)
    feasible = lp.atTorque(w, Ts, x0, x1 + off);
    everOutside ||= !feasible;
    // (the copper loss's law taken at the temperature the model was evaluated at)
    if (!copperTrackingSteady(net, lp.copper_W, lp.iron_W, lp.winding_C, rpm, h)) {
      status = 'runaway';
      if (!Number.isNaN(h[0]!)) {
        // beyond the model's ceiling: the envelope decides first there, at the ceiling
        x0 = Math.min(h[0]!, top); x1 = Math.min(h[1]!, top - off);
        it++;
        feasible = lp.atTorque(w, Ts, x0, x1 + off);
      }
      break;
    }
    const step = Math.max(Math.abs(h[0]! - x0), Math.abs(h[1]! - x1));
    if (step <= THERMAL_TOL_K) {
      // the last evaluation was at (x0, x1): report the temperatures of its losses (within the tolerance)
      x0 = h[0]!; x1 = h[1]!;
      status = 'converged';
      break;
    }
    acc.next(x0, x1, h[0]!, h[1]!, nx);
    // the accelerated step only while it stays where a steady state can lie (at or above the
    // coolant, losses being >= 0, and below the model's ceiling); else the plain step, which always does
    if (nx[0]! >= Tc && nx[1]! >= Tc && nx[0]! < top && nx[1]! < top) { x0 = nx[0]!; x1 = nx[1]!; }
    else { x0 = h[0]!; x1 = h[1]!; acc.reset(); }
  }
  // the envelope decides first: a point outside it at the temperatures reached has no steady state,
  // nor one whose iterates cross the envelope's edge without settling (the losses jump there)
  if (!feasible || (status === 'no-convergence' && everOutside)) status = 'outside-envelope';
  return {
    status, speed: w, torque_Nm: Ts,
    windingTemp_C: x0, statorTemp_C: x1, magnetTemp_C: x1 + off, junctionTemp_C: junctionTemperature(net, lp.inverter_W),
    losses: { copper_W: lp.copper_W, iron_W: lp.iron_W, mechanical_W: lp.mechanical_W, inverter_W: lp.inverter_W },
    id: lp.id, iq: lp.iq, current: lp.current, voltage: lp.voltage, torqueEm_Nm: lp.torqueEm_Nm, limitedBy: lp.limitedBy, iterations: it,
  };
}
