/**
 * Peak duration: how long an overload (speed, shaft torque) can be held from the thermally coupled
 * steady state of a continuous point, until the first limit (winding, magnet, inverter junction) is
 * reached, or until the machine, heating, can no longer make the torque within the peak limits.
 *
 * Quasi-static: at every instant the losses are those of the overload's loss point on the model
 * re-tempered to the temperatures reached (loss-at-temperatures.ts), and the
 * network (thermal-network.ts) is stepped exactly for losses held over a step. Over a step the losses
 * are the mean of those at its start and at a predicted end (a trapezoid in time, second order in the
 * step), and a step lets no temperature move more than `stepK` (default 1 K; the loss changes about
 * 0.4 % per kelvin of winding). The crossing is refined inside the last step by bisection in time
 * on the exact within-step trajectory (to 1e-9 of the step). The junction has no heat capacity: it
 * follows the inverter loss at once, so an overload whose junction starts beyond its limit lasts 0.
 * Infinity when the overload's own coupled steady state stays within every limit and the
 * temperatures approach it monotonically from where they are (from the start, or from where the
 * integration has brought them: a winding heating while the stator cools can overshoot its steady
 * value); NaN and `outsideEnvelope` when the machine at the starting
 * temperatures cannot make the torque at that speed within the peak limits.
 */
import type { DriveLimits } from '../drive/inverter-spec';
import type { TemperatureModel } from '../machine/temperature-model';
import type { ThermalNetworkSpec } from '../machine/thermal-network-spec';
import { InputError } from '../base/errors';
import { junctionTemperature, statorToCoolantAt, stepTemperatures } from '../machine/thermal-network';
import { assertFinite } from './mtpa';
import type { LossConditions } from './point-losses';
import { LossAtTemperatures } from './loss-at-temperatures';
import { assertThermalNetwork, coupledWith } from './thermal-steady-state';

export type PeakLimit = 'winding' | 'magnet' | 'junction' | 'current' | 'voltage' | 'none';

export interface OperatingDemand {
  /** mechanical speed, rad/s */
  speed_rad_s: number;
  /** shaft torque, N·m */
  torque_Nm: number;
}

export interface Temperatures { windingTemp_C: number; statorTemp_C: number; magnetTemp_C: number; junctionTemp_C: number }

export interface PeakDuration {
  /** seconds: Infinity when never reached, 0 when beyond a limit at once, NaN outside the envelope */
  duration_s: number;
  /** the limit reached ('current'/'voltage': the hot machine can no longer make the torque); 'none' when never */
  limitedBy: PeakLimit;
  /** the overload cannot be made at the starting temperatures within the peak limits */
  outsideEnvelope: boolean;
  /** the continuous point's coupled steady state */
  start: Temperatures;
  /** the temperatures when the limit is reached (the overload's coupled steady state when never) */
  end: Temperatures;
  /** network steps taken */
  steps: number;
}

export interface PeakDurationOptions {
  /** largest temperature change over one step, K (default 1) */
  stepK?: number;
}

const MAX_STEPS = 200000;
const REFINE = 40;

/** The run's state: the two loss evaluators (continuous and peak limits) and the network. */
interface Run { net: ThermalNetworkSpec; cont: LossAtTemperatures; peak: LossAtTemperatures; stepK: number }

/** Which limit (winding, magnet, junction, or the envelope) is reached at temperatures T (losses evaluated there, at the overload); null when none. */
function reached(r: Run, d: OperatingDemand, Tw: number, Tst: number): PeakLimit | null {
  const n = r.net;
  if (Tw >= n.windingMax_C) return 'winding';
  if (Tst + n.magnetAboveStator_K >= n.magnetMax_C) return 'magnet';
  if (!r.peak.atTorque(d.speed_rad_s, d.torque_Nm, Tw, Tst + n.magnetAboveStator_K)) return envelopeLimit(r.peak.limitedBy);
  if (n.junctionMax_C !== undefined && n.junctionToCoolant_K_per_W !== undefined && junctionTemperature(n, r.peak.inverter_W) >= n.junctionMax_C) return 'junction';
  return null;
}

const envelopeLimit = (l: string): PeakLimit => (l === 'current' || l === 'current-and-voltage' ? 'current' : 'voltage');

const temps = (n: ThermalNetworkSpec, Tw: number, Tst: number, inv: number): Temperatures =>
  ({ windingTemp_C: Tw, statorTemp_C: Tst, magnetTemp_C: Tst + n.magnetAboveStator_K, junctionTemp_C: junctionTemperature(n, inv) });

/**
 * The time the overload `to` can be held from the coupled steady state of the continuous point
 * `from` (which must have one within the limits `continuous`); the overload within the limits `peak`.
 */
export function peakDuration(tm: TemperatureModel, net: ThermalNetworkSpec, peak: DriveLimits, continuous: DriveLimits, c: LossConditions,
  from: OperatingDemand, to: OperatingDemand, opts: PeakDurationOptions = {}): PeakDuration {
  assertThermalNetwork(net);
  for (const [k, d] of [['from', from], ['to', to]] as const) {
    assertFinite(`${k}.speed`, d.speed_rad_s, 'rad/s');
    assertFinite(`${k}.torque`, d.torque_Nm, 'N·m');
  }
  const stepK = opts.stepK ?? 1;
  if (!(Number.isFinite(stepK) && stepK > 0)) throw new InputError('stepK', `must be a positive number of kelvin (got ${stepK})`);
  const r: Run = { net, cont: new LossAtTemperatures(tm, net, continuous, c), peak: new LossAtTemperatures(tm, net, peak, c), stepK };
  return durationFrom(r, startState(r, from), to);
}

/** The continuous point's coupled steady state, refused unless it converges within the continuous limits. */
function startState(r: Run, from: OperatingDemand): Temperatures {
  const s = coupledWith(r.cont, r.net, from.speed_rad_s, from.torque_Nm);
  if (s.status !== 'converged') throw new InputError('from', `the continuous point (${(from.speed_rad_s * 30 / Math.PI).toFixed(0)} rpm, ${from.torque_Nm} N·m) has no thermal steady state within the continuous limits (${s.status})`);
  return temps(r.net, s.windingTemp_C, s.statorTemp_C, s.losses.inverter_W);
}

function durationFrom(r: Run, start: Temperatures, to: OperatingDemand): PeakDuration {
  const net = r.net, lp = r.peak, w = to.speed_rad_s, Ts = to.torque_Nm, off = net.magnetAboveStator_K;
  const result = (duration_s: number, limitedBy: PeakLimit, end: Temperatures, steps: number, outsideEnvelope = false): PeakDuration =>
    ({ duration_s, limitedBy, outsideEnvelope, start, end, steps });
  // outside the envelope at the starting temperatures
  if (!lp.atTorque(w, Ts, start.windingTemp_C, start.magnetTemp_C)) return result(Number.NaN, envelopeLimit(lp.limitedBy), start, 0, true);
  const now = reached(r, to, start.windingTemp_C, start.statorTemp_C);
  if (now !== null) return result(0, now, temps(net, start.windingTemp_C, start.statorTemp_C, lp.inverter_W), 0);
  // never: the overload's own coupled steady state within every limit, once the temperatures approach
  // it monotonically (both nodes heating, or both cooling: the network's matrix has positive
  // off-diagonal terms, so the rates keep their common sign from there on; a stator cooling while
  // the winding heats, as after a point of large iron loss, can carry the winding past its limit
  // before it settles below it)
  const ss = coupledWith(lp, net, w, Ts, { start: { winding_C: start.windingTemp_C, stator_C: start.statorTemp_C } });
  const settles = ss.status === 'converged' && reached(r, to, ss.windingTemp_C, ss.statorTemp_C) === null;
  const never = (): PeakDuration => result(Infinity, 'none', temps(net, ss.windingTemp_C, ss.statorTemp_C, ss.losses.inverter_W), 0);
  // integrate
  const T = new Float64Array(2), Tp = new Float64Array(2);
  T[0] = start.windingTemp_C; T[1] = start.statorTemp_C;
  const rpm = (w * 30) / Math.PI, Rws = net.windingToStator_K_per_W, Rsc = statorToCoolantAt(net, rpm);
  const tauMax = (net.windingCapacity_J_per_K + net.statorCapacity_J_per_K) * (Rws + Rsc);
  /** heat flows into the winding and into the stator node have one sign at T under losses cu, fe */
  const monotone = (cu: number, fe: number): boolean => {
    const q = (T[0]! - T[1]!) / Rws, pw = cu - q, ps = fe + q - (T[1]! - net.coolantTemp_C) / Rsc;
    return (pw >= 0 && ps >= 0) || (pw <= 0 && ps <= 0);
  };
  lp.atTorque(w, Ts, T[0], T[1] + off);
  let cu0 = lp.copper_W, fe0 = lp.iron_W, t = 0;
  if (settles && monotone(cu0, fe0)) return never();
  for (let k = 1; k <= MAX_STEPS; k++) {
    // the step: no temperature moves more than stepK at the present rates
    const q = (T[0]! - T[1]!) / Rws;
    const rate = Math.max(Math.abs((cu0 - q) / net.windingCapacity_J_per_K), Math.abs((fe0 + q - (T[1]! - net.coolantTemp_C) / Rsc) / net.statorCapacity_J_per_K));
    const dt = Math.min(tauMax, r.stepK / Math.max(rate, 1e-300));
    // predictor at the start's losses, then the mean of the losses at both ends
    Tp[0] = T[0]!; Tp[1] = T[1]!;
    stepTemperatures(net, Tp, cu0, fe0, rpm, dt);
    let cu = cu0, fe = fe0;
    if (lp.atTorque(w, Ts, Tp[0]!, Tp[1]! + off)) { cu = 0.5 * (cu0 + lp.copper_W); fe = 0.5 * (fe0 + lp.iron_W); }
    Tp[0] = T[0]!; Tp[1] = T[1]!;
    stepTemperatures(net, Tp, cu, fe, rpm, dt);
    const hit = reached(r, to, Tp[0]!, Tp[1]!);
    if (hit !== null) {
      // bisect the crossing in [0, dt] on the exact trajectory under the step's losses
      let lo = 0, hi = dt, lim: PeakLimit = hit;
      for (let i = 0; i < REFINE; i++) {
        const mid = 0.5 * (lo + hi);
        Tp[0] = T[0]!; Tp[1] = T[1]!;
        stepTemperatures(net, Tp, cu, fe, rpm, mid);
        const h = reached(r, to, Tp[0]!, Tp[1]!);
        if (h === null) lo = mid;
        else { hi = mid; lim = h; }
      }
      Tp[0] = T[0]!; Tp[1] = T[1]!;
      stepTemperatures(net, Tp, cu, fe, rpm, hi);
      lp.atTorque(w, Ts, Tp[0]!, Tp[1]! + off);
      return result(t + hi, lim, temps(net, Tp[0]!, Tp[1]!, lp.inverter_W), k);
    }
    T[0] = Tp[0]!; T[1] = Tp[1]!;
    t += dt;
    cu0 = lp.copper_W; fe0 = lp.iron_W; // reached() evaluated the losses at the step's end
    if (settles && monotone(cu0, fe0)) return never();
  }
  return result(Infinity, 'none', temps(net, T[0]!, T[1]!, lp.inverter_W), MAX_STEPS);
}

export interface PeakDurationCurve {
  /** overload shaft torques, N·m (k/N of the peak envelope's torque at the starting temperatures, k = 1..N) */
  torque_Nm: Float64Array;
  /** seconds (see PeakDuration) */
  duration_s: Float64Array;
  limitedBy: PeakLimit[];
  start: Temperatures;
}

/**
 * Duration against overload torque at one speed, from the coupled steady state of the continuous
 * point `from`: N torques evenly up to the peak envelope's shaft torque at the starting temperatures.
 */
export function peakDurationCurve(tm: TemperatureModel, net: ThermalNetworkSpec, peak: DriveLimits, continuous: DriveLimits, c: LossConditions,
  from: OperatingDemand, speed_rad_s: number, N: number, opts: PeakDurationOptions = {}): PeakDurationCurve {
  assertThermalNetwork(net);
  assertFinite('speed', speed_rad_s, 'rad/s');
  if (!(Number.isInteger(N) && N >= 1)) throw new InputError('torques', `must be a whole number >= 1 (got ${N})`);
  const stepK = opts.stepK ?? 1;
  const r: Run = { net, cont: new LossAtTemperatures(tm, net, continuous, c), peak: new LossAtTemperatures(tm, net, peak, c), stepK };
  const start = startState(r, from);
  // the envelope's shaft torque at the starting temperatures: its T_em less the loss torque there (a
  // hair inside, so that the last point is made)
  // (motoring: at a negative speed the torque is negative, and the curve has none)
  const Tmax = r.peak.atCurrent(speed_rad_s, peak.Imax, speed_rad_s < 0 ? -1 : 1, start.windingTemp_C, start.magnetTemp_C) && r.peak.torqueEm_Nm > 0
    ? Math.max(0, (r.peak.torqueEm_Nm - r.peak.lossTorque_Nm) * (1 - 1e-7)) : 0;
  const out: PeakDurationCurve = { torque_Nm: new Float64Array(N), duration_s: new Float64Array(N), limitedBy: [], start };
  for (let k = 0; k < N; k++) {
    const Tk = (Tmax * (k + 1)) / N;
    const d = durationFrom(r, start, { speed_rad_s, torque_Nm: Tk });
    out.torque_Nm[k] = Tk; out.duration_s[k] = d.duration_s; out.limitedBy.push(d.limitedBy);
  }
  return out;
}
