/**
 * Least-current operating point for a (speed, torque) under |i_dq| <= Imax and |v_dq| <= Vmax,
 * Rs included in the steady-state voltage, motoring and generating, either sign of speed.
 *
 * Method: the largest torque reachable within a current I (and Vmax), Tmax(I), rises with I, so the
 * least current for torque T is the root of Tmax(I) = |T|, bracketed in I and bisected to relative
 * 1e-13. At that current the maximiser of the torque is the wanted point: MTPA when its voltage fits,
 * else the field-weakening point where the constant-torque curve meets the voltage boundary.
 * Beyond MTPV: no current at all reaches |T| within Vmax at that speed.
 */
import type { DqMachine, DriveLimits, OperatingPoint, Region } from './types';
import { assertFinite, assertLimits, assertMachine, mtpaCurrentForTorque, torqueOf } from './mtpa';
import { maxTorqueCore, newScratch } from './envelope';

const REGIONS: readonly Region[] = ['mtpa', 'field-weakening', 'mtpv'];

function point(m: DqMachine, speed: number, id: number, iq: number, region: Region): OperatingPoint {
  const we = m.polePairs * speed;
  const vd = m.Rs * id - we * m.Lq * iq;
  const vq = m.Rs * iq + we * (m.Ld * id + m.psiM);
  return {
    feasible: true, speed, torque: torqueOf(m, id, iq), id, iq, current: Math.hypot(id, iq),
    vd, vq, voltage: Math.hypot(vd, vq), region, limitedBy: 'none',
  };
}

const sc = newScratch();

/**
 * Least current for torque T at speed, voltage limit Vmax, current unlimited. Returns the point, or
 * null when the torque is beyond MTPV at that speed.
 */
function leastCurrent(m: DqMachine, Vmax: number, speed: number, T: number): OperatingPoint | null {
  const we = m.polePairs * speed;
  const sign: 1 | -1 = T < 0 ? -1 : 1;
  const Ta = Math.abs(T);
  // zero current when the torque is zero and the open-circuit voltage fits
  const p0 = point(m, speed, 0, 0, 'mtpa');
  if (Ta === 0 && p0.voltage <= Vmax) return p0;
  // MTPA for T: when its voltage fits it is the least current
  const mt = mtpaCurrentForTorque(m, T);
  const pm = point(m, speed, mt.id, mt.iq, 'mtpa');
  if (pm.voltage <= Vmax) return pm;
  const D = m.Rs * m.Rs + we * we * m.Ld * m.Lq;
  if (!(D > 0)) return pm; // no voltage drop at all (Rs = 0 at standstill)
  // every point of the voltage region lies within Ib: |i| <= ||A^-1|| (Vmax + |b|)
  const Ib = (Math.sqrt(2 * m.Rs * m.Rs + we * we * (m.Ld * m.Ld + m.Lq * m.Lq)) / D) * (Vmax + Math.abs(we) * m.psiM);
  let hi = Math.max(Ib, mt.current) * (1 + 1e-9);
  maxTorqueCore(m, Vmax, hi, we, sign, sc);
  if (!sc.ok || sc.J < Ta) return null;
  let hid = sc.id, hiq = sc.iq, hreg = sc.region;
  let lo = 0;
  for (let it = 0; it < 200 && hi - lo > 1e-13 * hi; it++) {
    const mid = 0.5 * (lo + hi);
    maxTorqueCore(m, Vmax, mid, we, sign, sc);
    if (sc.ok && sc.J >= Ta) { hi = mid; hid = sc.id; hiq = sc.iq; hreg = sc.region; }
    else lo = mid;
  }
  return point(m, speed, hid, hiq, REGIONS[hreg]);
}

/**
 * Operating point for (speed, torque) ignoring the current limit (for sizing): feasible unless the
 * torque is beyond MTPV at that speed; then feasible=false, limitedBy 'beyond-mtpv' and the MTPA
 * point for the torque with the voltage it would need.
 */
export function solveOperatingPointUnlimitedCurrent(m: DqMachine, Vmax: number, speed_rad_s: number, torque_Nm: number): OperatingPoint {
  assertMachine(m);
  assertLimits({ Vmax, Imax: Infinity });
  assertFinite('speed', speed_rad_s, 'rad/s');
  assertFinite('torque', torque_Nm, 'N·m');
  const p = leastCurrent(m, Vmax, speed_rad_s, torque_Nm);
  if (p) {
    p.limitedBy = p.region === 'mtpa' ? 'none' : 'voltage';
    return p;
  }
  const mt = mtpaCurrentForTorque(m, torque_Nm);
  const q = point(m, speed_rad_s, mt.id, mt.iq, 'mtpv');
  q.feasible = false;
  q.limitedBy = 'beyond-mtpv';
  return q;
}

/**
 * Least-current (id, iq) giving torque_Nm at speed_rad_s (mechanical) within both limits.
 * Feasible: region 'mtpa' (limitedBy 'none') or 'field-weakening'/'mtpv' (limitedBy 'voltage').
 * Infeasible: feasible=false with the current and voltage it would need, and limitedBy
 * 'current' (even MTPA needs more than Imax), 'voltage' (field weakening needs more than Imax)
 * or 'beyond-mtpv' (no current reaches that torque at that speed within Vmax).
 */
export function solveOperatingPoint(m: DqMachine, lim: DriveLimits, speed_rad_s: number, torque_Nm: number): OperatingPoint {
  assertLimits(lim);
  const p = solveOperatingPointUnlimitedCurrent(m, lim.Vmax, speed_rad_s, torque_Nm);
  if (!p.feasible) return p;
  if (p.current <= lim.Imax) return p;
  p.feasible = false;
  p.limitedBy = mtpaCurrentForTorque(m, torque_Nm).current > lim.Imax ? 'current' : 'voltage';
  return p;
}
