/**
 * Least-current operating point for a (speed, torque) under |i_dq| <= Imax and |v_dq| <= Vmax,
 * Rs included in the steady-state voltage, motoring and generating, either sign of speed, for any
 * machine model (a MachineInput is wrapped once at the entry; each solve owns its scratch).
 *
 * Method: the torques reachable within a current I (and Vmax) form an interval [Tmin(I), Tmax(I)] that
 * widens with I. The least current for torque T is the larger of the roots of Tmax(I) = T and
 * Tmin(I) = T (the second matters with Rs, where the voltage limit can force torque of one sign),
 * each bracketed in I and bisected to relative 1e-13 with the max-torque search of max-torque.ts.
 * At that current the extreme point is the wanted one: MTPA when its voltage fits, else the
 * field-weakening point where the constant-torque curve meets the voltage boundary (on a linear model
 * polished onto the exact torque in closed form; the numeric path keeps the bisected point, within
 * 1e-13 of the current). Zero torque: zero-torque.ts. Beyond MTPV: no current at all reaches T
 * within Vmax at that speed.
 */
import type { DriveLimits } from '../drive/inverter-spec';
import type { LinearTerms, MachineInput, MachineModel } from '../machine/machine-model';
import type { OperatingPoint, Region } from './operating-point-types';
import { machineModel } from '../machine/linear-dq';
import { assertFinite, assertLimits, assertMachine, mtpaCurrentForTorque } from './mtpa';
import { type MaxTorqueScratch, maxTorqueCore, newScratch } from './max-torque';
import { zeroTorque } from './zero-torque';
import { point } from './point-of-current';

const REGIONS: readonly Region[] = ['mtpa', 'field-weakening', 'mtpv'];

/**
 * Least current for torque T at speed, voltage limit Vmax, current unlimited. Returns the point, or
 * 'too-much' when the torque is beyond MTPV at that speed, or 'too-little' when the voltage limit
 * forces more torque of that sign than T at any current (with Rs; or zero torque cannot be held).
 */
function leastCurrent(m: MachineModel, Vmax: number, speed: number, T: number): OperatingPoint | 'too-much' | 'too-little' {
  const we = m.polePairs * speed;
  const sign: 1 | -1 = T < 0 ? -1 : 1;
  const Ta = Math.abs(T);
  if (Ta === 0) return zeroTorque(m, Vmax, speed, voltageRegionBound(m, Vmax, we)) ?? 'too-little';
  // MTPA for T: when its voltage fits it is the least current
  const mt = mtpaCurrentForTorque(m, T);
  const pm = point(m, speed, mt.id, mt.iq, 'mtpa');
  if (pm.voltage <= Vmax) return pm;
  const Ib = voltageRegionBound(m, Vmax, we);
  if (Ib === null) return pm; // no voltage drop at all (Rs = 0 at standstill)
  const top = Math.max(Ib, mt.current) * (1 + 1e-9);
  const sc = newScratch(); // this solve's own (only a voltage-bound point needs it)
  // least current whose largest torque reaches |T| ...
  const a = leastReaching(m, Vmax, we, sign, Ta, 0, top, sc);
  if (!a) return 'too-much';
  // ... and whose smallest torque is not above it (with Rs the voltage limit can force torque of one sign)
  maxTorqueCore(m, Vmax, a.I, we, -sign as 1 | -1, sc, -Ta);
  let r = a;
  if (!(sc.ok && sc.J >= -Ta)) {
    const b = leastReaching(m, Vmax, we, -sign as 1 | -1, -Ta, a.I, top, sc);
    if (!b) return 'too-little';
    r = b;
  }
  let id = r.id, iq = r.iq;
  if (r.region !== 0 && m.linear !== null) {
    const pol = polish(m.linear, m.polePairs, m.Rs, Vmax, we, T, id, r.I);
    if (pol) { id = pol[0]; iq = pol[1]; }
  }
  return point(m, speed, id, iq, REGIONS[r.region]);
}

/**
 * A bound on the current of every point of the voltage region |v| <= Vmax at we, |i| <= ||A^-1|| (Vmax + |b|),
 * A = [[Rs, -we Lq], [we Ld, Rs]], b = (0, we psiM), with the flux and incremental inductances at zero
 * current (exact for a linear model, a bracket end otherwise); null when the voltage does not depend on
 * the current (Rs = 0 at standstill).
 */
function voltageRegionBound(m: MachineModel, Vmax: number, we: number): number | null {
  let Ld: number, Lq: number, psiM: number;
  if (m.linear !== null) ({ Ld, Lq, psiM } = m.linear);
  else {
    const f = new Float64Array(2), L = new Float64Array(4);
    m.flux(0, 0, f);
    m.incrementalInductance(0, 0, L);
    Ld = L[0]!; Lq = L[3]!; psiM = Math.hypot(f[0]!, f[1]!);
  }
  const D = m.Rs * m.Rs + we * we * Ld * Lq;
  if (!(D > 0)) return null;
  return (Math.sqrt(2 * m.Rs * m.Rs + we * we * (Ld * Ld + Lq * Lq)) / D) * (Vmax + Math.abs(we) * psiM);
}

/** Least current in [lo, hi] at which the largest sign*torque is >= thr (bisection to 1e-13 relative). */
function leastReaching(m: MachineModel, Vmax: number, we: number, sign: 1 | -1, thr: number, lo: number, hi: number, sc: MaxTorqueScratch): { I: number; id: number; iq: number; region: 0 | 1 | 2 } | null {
  maxTorqueCore(m, Vmax, hi, we, sign, sc, thr);
  if (!sc.ok || sc.J < thr) return null;
  let id = sc.id, iq = sc.iq, region = sc.region;
  for (let it = 0; it < 200 && hi - lo > 1e-13 * hi; it++) {
    const mid = 0.5 * (lo + hi);
    maxTorqueCore(m, Vmax, mid, we, sign, sc, thr);
    if (sc.ok && sc.J >= thr) { hi = mid; id = sc.id; iq = sc.iq; region = sc.region; }
    else lo = mid;
  }
  return { I: hi, id, iq, region };
}

/**
 * Exact torque on a voltage-bound point: move onto the constant-torque curve iq = T / (1.5 p (psiM + dl id))
 * at the same id, and if that breaks |v| <= Vmax, bracket the nearby crossing of the voltage boundary
 * along the curve (bisection, feasible end kept). Null when it would not improve (kept as found).
 */
function polish(m: LinearTerms, p: number, Rs: number, Vmax: number, we: number, T: number, id0: number, Ihi: number): [number, number] | null {
  const k = 1.5 * p;
  const dl = m.Ld - m.Lq;
  const den0 = m.psiM + dl * id0;
  if (den0 === 0) return null;
  const iqOf = (id: number) => T / (k * (m.psiM + dl * id));
  const f = (id: number) => {
    const iq = iqOf(id);
    const vd = Rs * id - we * m.Lq * iq;
    const vq = Rs * iq + we * (m.Ld * id + m.psiM);
    return vd * vd + vq * vq - Vmax * Vmax;
  };
  const ok = (id: number) => (m.psiM + dl * id) * den0 > 0;
  let a = id0;
  let fa = f(a);
  if (fa > 0) {
    // find a feasible id nearby on either side
    let b = Number.NaN;
    for (let d = 1e-12 * Math.max(1, Ihi), it = 0; it < 60 && Number.isNaN(b); it++, d *= 2) {
      for (const c of [id0 - d, id0 + d]) if (ok(c) && f(c) <= 0) { b = c; break; }
    }
    if (Number.isNaN(b)) return null;
    for (let it = 0; it < 200 && Math.abs(b - a) > 1e-15 * Math.max(1, Math.abs(b)); it++) {
      const mid = 0.5 * (a + b);
      if (f(mid) <= 0) b = mid;
      else a = mid;
    }
    a = b;
  }
  const iq = iqOf(a);
  if (!Number.isFinite(iq) || Math.hypot(a, iq) > Ihi * (1 + 1e-6)) return null;
  return [a, iq];
}

/**
 * Operating point for (speed, torque) ignoring the current limit (for sizing): feasible unless no
 * current reaches the torque at that speed within Vmax; then feasible=false with the MTPA point for
 * the torque and the voltage it would need, and limitedBy 'beyond-mtpv' (more torque than the
 * voltage-limited maximum) or 'voltage' (with Rs the voltage limit forces more torque of that sign
 * than asked, or zero torque cannot be held at that speed).
 */
export function solveOperatingPointUnlimitedCurrent(input: MachineInput, Vmax: number, speed_rad_s: number, torque_Nm: number): OperatingPoint {
  assertMachine(input);
  assertLimits({ Vmax, Imax: Infinity });
  assertFinite('speed', speed_rad_s, 'rad/s');
  assertFinite('torque', torque_Nm, 'N·m');
  const m = machineModel(input);
  const p = leastCurrent(m, Vmax, speed_rad_s, torque_Nm);
  if (typeof p === 'object') {
    p.limitedBy = p.region === 'mtpa' ? 'none' : 'voltage';
    return p;
  }
  const mt = mtpaCurrentForTorque(m, torque_Nm);
  const q = point(m, speed_rad_s, mt.id, mt.iq, 'mtpv');
  q.feasible = false;
  q.torque = torque_Nm;
  q.limitedBy = p === 'too-much' ? 'beyond-mtpv' : 'voltage';
  return q;
}

/**
 * Least-current (id, iq) giving torque_Nm at speed_rad_s (mechanical) within both limits.
 * Feasible: region 'mtpa' (limitedBy 'none') or 'field-weakening'/'mtpv' (limitedBy 'voltage').
 * Infeasible: feasible=false with the current and voltage it would need, and limitedBy
 * 'current' (even MTPA needs more than Imax), 'current-and-voltage' (field weakening needs more than
 * Imax), 'voltage' (with Rs the voltage limit forces more torque of that sign than asked at any current) or
 * 'beyond-mtpv' (more torque than any current reaches at that speed within Vmax).
 */
export function solveOperatingPoint(input: MachineInput, lim: DriveLimits, speed_rad_s: number, torque_Nm: number): OperatingPoint {
  assertLimits(lim);
  const m = machineModel(input);
  const p = solveOperatingPointUnlimitedCurrent(m, lim.Vmax, speed_rad_s, torque_Nm);
  if (!p.feasible) return p;
  if (p.current <= lim.Imax) return p;
  p.feasible = false;
  // MTPA alone over Imax: the current binds; field weakening pushing it over Imax: both bind
  p.limitedBy = mtpaCurrentForTorque(m, torque_Nm).current > lim.Imax ? 'current' : 'current-and-voltage';
  return p;
}

/**
 * Whether (speed, torque) can be held within both limits, without locating the point: the limits
 * cut a convex set from the (id, iq) plane, so the reachable torques form the interval
 * [Tmin, Tmax] and two max-torque solves decide it. Inputs are validated.
 */
export function canHoldTorque(input: MachineInput, lim: DriveLimits, speed_rad_s: number, torque_Nm: number, sc: MaxTorqueScratch = newScratch()): boolean {
  assertMachine(input);
  const m = machineModel(input);
  assertLimits(lim);
  assertFinite('speed', speed_rad_s, 'rad/s');
  assertFinite('torque', torque_Nm, 'N·m');
  const we = m.polePairs * speed_rad_s;
  const sign: 1 | -1 = torque_Nm < 0 ? -1 : 1;
  const Ta = Math.abs(torque_Nm);
  maxTorqueCore(m, lim.Vmax, lim.Imax, we, sign, sc, Ta);
  if (!(sc.ok && sc.J >= Ta)) return false;
  maxTorqueCore(m, lim.Vmax, lim.Imax, we, -sign as 1 | -1, sc, -Ta);
  return sc.ok && sc.J >= -Ta;
}
