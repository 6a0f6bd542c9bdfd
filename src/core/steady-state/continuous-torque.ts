/**
 * Continuous (S1, IEC 60034-1 duty type S1) shaft torque against speed: at each speed the largest
 * shaft torque whose thermally coupled steady state (thermal-steady-state.ts) keeps the winding, the
 * magnet and (when rated) the inverter's junction within their limits, and whose current and voltage
 * fit the continuous drive limits.
 *
 * Method: along a speed the least-current point of a torque is the largest-torque point at its
 * current (operating-point.ts), so the search runs over the current I in [0, Icont] instead of the
 * torque: at I the point is the largest-torque point at the temperatures (loss-at-temperatures.ts,
 * atCurrent: one max-torque solve on the re-tempered model), its losses
 * heat the network, and the coupled temperatures follow by the copper-tracking iteration of
 * thermal-steady-state.ts (at a held current the only coupling left is the iron loss through the
 * magnet's flux: a few steps, to a step of 1e-9 K, so that the start, the state the previous current
 * or speed left, leaves no trace beyond it; a current the machine cannot drive at the start's
 * temperatures is tried once more from the hottest ones within the limits, the steady state being
 * hot and a hotter magnet having less back-EMF). The shaft torque is T_em - (P_fe + P_mech) / w. The margin
 * phi(I) = min over the rated limits of (T_max - T) / (T_max - T_coolant) falls with I; when it is
 * still >= 0 at Icont the current binds (or the voltage, when the largest torque at Icont is the
 * MTPV point, drawing less than Icont: the coupled state reported is the MTPV point's; the torque
 * is flat in the current there, so a torque a part in 1e9 lower also has a cooler coupled state on
 * the field-weakening side, up to about 1 K apart: the voltage-bound temperatures are those of the
 * MTPV state, the torque is exact); else its root is found by the Illinois variant of regula falsi
 * (Dowell and Jarratt (1971), A modified regula falsi method for computing the root of an equation,
 * BIT 11) from a bracket around the previous speed's current (warm start), widened until it brackets,
 * to |phi| (T_max - T_coolant) <= 1e-7 K. So a point does not depend on the speeds solved before it:
 * its temperatures agree to 1e-6 K (THERMAL_TOL_K) and its torque to about 1e-9 relative with those
 * of the same speed solved alone (checked on the demos). The binding limit on a tie is named by a
 * fixed rule on the converged state: winding before magnet before junction on equal margins, and at
 * Icont 'voltage' when the largest torque at Icont is the MTPV point (or the coupled torque falls
 * over the last 1e-4 of the current, foldOr), else 'current'. A current whose largest torque is below zero at that speed
 * (field weakening needs more current) counts as cool (phi = +1): the torque grows with the current.
 * Where the coupled shaft torque falls as the current rises to the bound found (the hot magnet's
 * lower flux costing more than the current adds), the largest torque lies below it, bound by the
 * voltage (foldOr). The shaft torque reported is never below zero (a speed where even the least
 * current the voltage allows overheats has S1 torque 0, bound by that limit, at its temperatures); beyond the continuous limits' maximum speed it is 0, bound by
 * the voltage, with no temperatures (NaN).
 *
 * Motoring by default. Generating is not the mirror image: at the same current the shaft torque is
 * |T_em| + (P_fe + P_mech)/w instead of |T_em| - ..., and with Rs the voltage limit differs, so
 * 'generating' runs the same search on the negative-torque side (shaft torques reported negative).
 */
import type { DriveLimits } from '../drive/inverter-spec';
import type { TemperatureModel } from '../machine/temperature-model';
import type { ThermalNetworkSpec } from '../machine/thermal-network-spec';
import type { Direction } from './envelope';
import { InputError } from '../base/errors';
import type { Region } from './operating-point-types';
import type { LossConditions } from './point-losses';
import { junctionTemperature } from '../machine/thermal-network';
import { LossAtTemperatures } from './loss-at-temperatures';
import { assertLossConditions } from './loss-point';
import { assertLimits } from './mtpa';
import { goldenSectionMax } from '../mathematics/root-finding';
import { assertThermalNetwork, copperTrackingSteady, THERMAL_TOL_K } from './thermal-steady-state';

export type ContinuousLimit = 'winding' | 'magnet' | 'junction' | 'current' | 'voltage';

/** One point of the S1 curve (the CLI's JSON keys). */
export interface ContinuousPoint {
  speed_rpm: number;
  /** S1 shaft torque, N·m (negative generating) */
  torque_Nm: number;
  limitedBy: ContinuousLimit;
  windingTemp_C: number;
  magnetTemp_C: number;
  /** one switch position's junction; the coolant's when the inverter is not rated */
  junctionTemp_C: number;
}

/** Root tolerance of the binding temperature, K (a tenth of the coupled state's THERMAL_TOL_K). */
export const CONTINUOUS_TOL_K = 1e-7;
/** The coupled state at a held current is iterated until its step is below this, K (from any start it is then within THERMAL_TOL_K / 1000). */
const COUPLED_TOL_K = 1e-9;
const MAX_COUPLED = 40;
const MAX_ROOT = 60;
const WARM = 0.02;
const GOLDEN_STEPS = 60;
const FOLD_PROBE = 1e-4;

/** The per-run state of the current-parametrised search (one per run, never shared). */
class CurrentSearch {
  readonly lp: LossAtTemperatures;
  readonly h = new Float64Array(2);
  readonly gs = new Float64Array(2);
  // the state at the last current evaluated
  Tw: number; Tst: number; Tj = 0; Tem = 0; fe = 0; region: Region = 'mtpa'; ok = false;
  w = 0; rpm = 0; pMech = 0;
  /** the root current of the last speed (NaN when the current or voltage bound it) */
  lastI = Number.NaN;
  /** phi of the last current evaluated */
  lastMargin = 0;
  constructor(tm: TemperatureModel, readonly net: ThermalNetworkSpec, lim: DriveLimits, c: LossConditions, readonly sign: 1 | -1) {
    this.lp = new LossAtTemperatures(tm, net, lim, c);
    this.Tw = net.coolantTemp_C; this.Tst = net.coolantTemp_C;
  }
  setSpeed(w: number): void {
    this.w = w; this.rpm = (w * 30) / Math.PI;
  }
  /** The coupled state at current I (from the last temperatures); returns the margin phi (+1 when no torque of the sign at I, -1 at runaway). */
  margin(I: number): number {
    const net = this.net, off = net.magnetAboveStator_K, lp = this.lp, h = this.h;
    let x0 = this.Tw, x1 = this.Tst, hot = false;
    this.ok = false;
    for (let it = 0, prev = Infinity; it < MAX_COUPLED; it++) {
      if (!lp.atCurrent(this.w, I, this.sign, x0, x1 + off)) {
        // no torque of the sign at I and these temperatures: a hotter magnet (less flux, less
        // back-EMF) may make it, and the steady state is hot. Once, from the hottest temperatures
        // within the limits, whatever the start: the iterates then cool towards the steady state
        // from above, and the answer does not depend on where the previous solve left them
        if (hot) return 1;
        hot = true; it = 0; prev = Infinity;
        x0 = net.windingMax_C; x1 = net.magnetMax_C - off;
        continue;
      }
      if (!copperTrackingSteady(net, lp.copper_W, lp.iron_W, lp.winding_C, this.rpm, h)) return -1;
      const step = Math.max(Math.abs(h[0]! - x0), Math.abs(h[1]! - x1));
      x0 = h[0]!; x1 = h[1]!;
      // converged well inside the thermal tolerance (the start, the previous current's state, must
      // leave no trace), or at rounding level where the steps stop shrinking
      if (step <= COUPLED_TOL_K || (step <= THERMAL_TOL_K && step >= 0.5 * prev)) break;
      prev = step;
    }
    this.ok = true;
    this.Tw = x0; this.Tst = x1;
    this.Tj = junctionTemperature(net, lp.inverter_W);
    this.Tem = lp.torqueEm_Nm;
    this.fe = lp.iron_W; this.pMech = lp.mechanical_W;
    this.region = lp.region;
    this.lastMargin = Math.min(this.windingMargin(), this.magnetMargin(), this.junctionMargin());
    return this.lastMargin;
  }
  windingMargin(): number { const n = this.net; return (n.windingMax_C - this.Tw) / (n.windingMax_C - n.coolantTemp_C); }
  magnetMargin(): number { const n = this.net; return (n.magnetMax_C - this.Tst - n.magnetAboveStator_K) / (n.magnetMax_C - n.coolantTemp_C); }
  junctionMargin(): number {
    const n = this.net;
    return n.junctionToCoolant_K_per_W === undefined || n.junctionMax_C === undefined ? Infinity : (n.junctionMax_C - this.Tj) / (n.junctionMax_C - n.coolantTemp_C);
  }
  rawShaftTorque(): number { return this.w === 0 ? this.Tem : this.Tem - (this.fe + this.pMech) / this.w; }
  /** The shaft torque of the last state, signed, never of the wrong sign. */
  shaftTorque(): number {
    const Ts = this.rawShaftTorque();
    return this.sign > 0 ? Math.max(0, Ts) : Math.min(0, Ts);
  }
  point(limitedBy: ContinuousLimit): ContinuousPoint {
    return {
      speed_rpm: this.rpm, torque_Nm: this.shaftTorque(), limitedBy,
      windingTemp_C: this.Tw, magnetTemp_C: this.Tst + this.net.magnetAboveStator_K, junctionTemp_C: this.Tj,
    };
  }
  thermalLimit(): ContinuousLimit {
    const mw = this.windingMargin(), mm = this.magnetMargin(), mj = this.junctionMargin();
    return mw <= mm && mw <= mj ? 'winding' : mm <= mj ? 'magnet' : 'junction';
  }
}

/**
 * The S1 curve at mechanical speeds (rad/s, >= 0) under the continuous drive limits `lim`, the model
 * re-tempered through `tm` (the run takes over its temperature state). Returns one point per speed.
 */
export function continuousTorqueCurve(tm: TemperatureModel, net: ThermalNetworkSpec, lim: DriveLimits, c: LossConditions, speeds_rad_s: ArrayLike<number>, direction: Direction = 'motoring'): ContinuousPoint[] {
  assertThermalNetwork(net);
  assertLimits(lim);
  assertLossConditions(c);
  if (!Number.isFinite(lim.Imax)) throw new InputError('inverter.Icont', 'must be a finite continuous current, A');
  for (let i = 0; i < speeds_rad_s.length; i++) {
    const w = speeds_rad_s[i]!;
    if (!(Number.isFinite(w) && w >= 0)) throw new InputError(`speeds[${i}]`, `must be a finite speed >= 0 rad/s (got ${w})`);
  }
  const s = new CurrentSearch(tm, net, lim, c, direction === 'motoring' ? 1 : -1);
  const out: ContinuousPoint[] = [];
  const Imax = lim.Imax;
  const tolPhi = CONTINUOUS_TOL_K / (Math.max(net.windingMax_C, net.magnetMax_C, net.junctionMax_C ?? -Infinity) - net.coolantTemp_C);
  let Iprev = Number.NaN;
  for (let i = 0; i < speeds_rad_s.length; i++) {
    s.setSpeed(speeds_rad_s[i]!);
    out.push(atSpeed(s, Imax, Iprev, tolPhi));
    Iprev = s.lastI;
  }
  return out;
}

/** One speed of the curve; leaves the root current in s.lastI (NaN when the current or voltage binds). */
function atSpeed(s: CurrentSearch, Imax: number, Iprev: number, tolPhi: number): ContinuousPoint {
  s.lastI = Number.NaN;
  // the bracket: around the previous speed's root, else the whole range
  let hi = Number.isNaN(Iprev) ? Imax : Math.min(Imax, Iprev * (1 + WARM));
  let fhi = s.margin(hi);
  if (!s.ok && hi < Imax) { hi = Imax; fhi = s.margin(hi); }
  if (!s.ok && fhi > 0) {
    const p = s.point('voltage');
    p.torque_Nm = 0; p.windingTemp_C = Number.NaN; p.magnetTemp_C = Number.NaN; p.junctionTemp_C = Number.NaN;
    return p;
  }
  let lo = Number.isNaN(Iprev) ? 0 : Iprev * (1 - WARM), flo: number;
  // widen upward while hi is still within every limit
  while (fhi >= 0) {
    if (hi >= Imax) return s.region === 'mtpv' ? s.point('voltage') : foldOr(s, Imax, 'current');
    lo = hi;
    hi = Math.min(Imax, hi * (1 + 4 * WARM));
    fhi = s.margin(hi);
  }
  flo = s.margin(lo);
  // widen downward while lo is beyond a limit
  while (flo < 0 && lo > 0) {
    hi = lo; fhi = flo;
    lo = lo > 1e-3 * Imax ? lo * (1 - 4 * WARM) - 1e-3 * Imax : 0;
    lo = Math.max(0, lo);
    flo = s.margin(lo);
  }
  if (flo < 0) { // beyond a limit even at zero current
    const p = s.point(s.thermalLimit());
    p.torque_Nm = 0;
    return p;
  }
  // Illinois
  let side = 0, x = hi;
  for (let it = 0; it < MAX_ROOT; it++) {
    x = (lo * fhi - hi * flo) / (fhi - flo);
    if (!(x > lo && x < hi)) x = 0.5 * (lo + hi);
    const fx = s.margin(x);
    if (Math.abs(fx) <= tolPhi && s.ok) break;
    if (fx < 0) { hi = x; fhi = fx; if (side === -1) flo *= 0.5; side = -1; }
    else { lo = x; flo = fx; if (side === 1) fhi *= 0.5; side = 1; }
    if (hi - lo <= 1e-12 * Imax) { x = hi; s.margin(hi); break; }
  }
  s.lastI = x;
  // the bracket closed on the least current the voltage allows, and that already overheats: no S1 torque
  if (!s.ok || s.lastMargin < -100 * tolPhi) {
    const p = s.point(s.thermalLimit());
    p.torque_Nm = 0;
    return p;
  }
  return foldOr(s, x, s.thermalLimit());
}

/**
 * The point at current x bound by `limit`, unless the coupled shaft torque already falls as the
 * current rises to x (deep in field weakening the hotter magnet's lower flux can cost more torque
 * than the current adds): then the largest torque lies at a lower current, where no temperature is
 * at its limit and the voltage (field weakening) is what bounds it; found by golden section
 * (root-finding.ts) over [0, x].
 */
function foldOr(s: CurrentSearch, x: number, limit: ContinuousLimit): ContinuousPoint {
  const T = s.sign * s.rawShaftTorque();
  const p = s.point(limit);
  s.margin(x * (1 - FOLD_PROBE));
  if (!(s.ok && s.sign * s.rawShaftTorque() > T + 1e-12 * Math.abs(T))) return p;
  const f = (I: number): number => (s.margin(I) >= 0 && s.ok ? s.sign * s.rawShaftTorque() : -Infinity);
  goldenSectionMax(f, 0, x, GOLDEN_STEPS, s.gs);
  f(s.gs[0]!);
  return s.point('voltage');
}
