/**
 * MTPA and MTPV current vectors of a dq machine (steady state, motor reference direction,
 * amplitude-invariant scaling, see ../shared/conventions.md).
 *
 *   T = 1.5 p (psiM iq + (Ld - Lq) id iq)
 *   vd = Rs id - we Lq iq,  vq = Rs iq + we (Ld id + psiM),  we = p omega_m
 */
import type { DqMachine } from '../machine/dq-machine';
import type { DriveLimits } from '../drive/inverter-spec';
import { InputError } from '../base/errors';

/** Bad machine data is an InputError naming the project path (motor.*). */
export function assertMachine(m: DqMachine): void {
  if (!(Number.isInteger(m.polePairs) && m.polePairs >= 1)) throw new InputError('motor.polePairs', 'must be an integer >= 1');
  if (!(Number.isFinite(m.Rs) && m.Rs >= 0)) throw new InputError('motor.Rs', 'must be >= 0 ohm');
  if (!(Number.isFinite(m.Ld) && m.Ld > 0)) throw new InputError('motor.Ld', 'must be > 0 H');
  if (!(Number.isFinite(m.Lq) && m.Lq > 0)) throw new InputError('motor.Lq', 'must be > 0 H');
  if (!(Number.isFinite(m.psiM) && m.psiM >= 0)) throw new InputError('motor.psiM', 'must be >= 0 Wb');
  if (m.psiM === 0 && m.Ld === m.Lq) throw new InputError('motor.psiM', 'must be > 0 Wb when Ld = Lq (the machine makes no torque)');
}

/** Limits must be positive; Imax may be Infinity for the current-unlimited solvers. */
export function assertLimits(lim: DriveLimits): void {
  if (!(Number.isFinite(lim.Vmax) && lim.Vmax > 0)) throw new InputError('inverter.Vdc', 'must give a voltage limit > 0 V');
  if (!(lim.Imax > 0) || Number.isNaN(lim.Imax)) throw new InputError('inverter.Imax', 'must be > 0 A');
}

export function assertFinite(field: string, x: number, unit: string): void {
  if (!Number.isFinite(x)) throw new InputError(field, `must be a finite number (${unit})`);
}

/** Electromagnetic torque, N·m. */
export const torqueOf = (m: DqMachine, id: number, iq: number): number =>
  1.5 * m.polePairs * iq * (m.psiM + (m.Ld - m.Lq) * id);

/**
 * The constant-torque locus: the q current that gives torque T at d current id,
 * iq = T / (1.5 p (psiM + (Ld - Lq) id)); NaN where the bracket is not positive (no such point
 * on the motoring side of the locus).
 */
export function constantTorqueIq(m: DqMachine, T: number, id: number): number {
  const den = 1.5 * m.polePairs * (m.psiM + (m.Ld - m.Lq) * id);
  return den > 0 ? T / den : NaN;
}

/**
 * MTPA d-axis current for a current magnitude I (A peak), closed form
 * id = (psiM - sqrt(psiM² + 8 (Lq-Ld)² I²)) / (4 (Lq-Ld)), written in the rationalised form
 * id = -2 (Lq-Ld) I² / (psiM + sqrt(psiM² + 8 (Lq-Ld)² I²)) that stays exact as Lq -> Ld (id = 0 for SPM).
 */
export function mtpaId(m: DqMachine, I: number): number {
  return I * mtpaCos(m, I);
}

/** cos of the MTPA current angle, id / I, in [-1, 1] (0 for SPM; also defined at I = 0). */
function mtpaCos(m: DqMachine, I: number): number {
  const dL = m.Lq - m.Ld;
  const S = Math.sqrt(m.psiM * m.psiM + 8 * dL * dL * I * I);
  const den = m.psiM + S;
  if (!(den > 0)) return 0;
  const x = (-2 * dL * I) / den;
  if (x === 0) return 0; // no -0 for SPM
  return Math.max(-1, Math.min(1, x));
}

/** MTPA currents for a current magnitude I >= 0 (positive torque: iq >= 0). */
export function mtpaCurrents(m: DqMachine, I: number): { id: number; iq: number } {
  const Ia = Math.abs(I);
  const x = mtpaCos(m, Ia);
  return { id: Ia * x, iq: Ia * Math.sqrt(1 - x * x) };
}

/** Torque along the MTPA trajectory at current magnitude I, N·m (>= 0). */
export function mtpaTorque(m: DqMachine, I: number): number {
  const c = mtpaCurrents(m, I);
  return torqueOf(m, c.id, c.iq);
}

/**
 * Least current that gives torque T (sign respected: iq takes the sign of T), along MTPA.
 * The MTPA torque rises strictly with I, so the root is bracketed (doubling from a first guess,
 * bounded) and refined by bisection to relative 1e-14 in I.
 */
export function mtpaCurrentForTorque(m: DqMachine, T: number): { id: number; iq: number; current: number } {
  assertMachine(m);
  assertFinite('torque', T, 'N·m');
  const Ta = Math.abs(T);
  if (Ta === 0) return { id: 0, iq: 0, current: 0 };
  const p = m.polePairs;
  // first guess: the magnet-only or reluctance-only current, then double until the torque is reached
  let hi = m.psiM > 0 ? Ta / (1.5 * p * m.psiM) : Math.sqrt((2 * Ta) / (1.5 * p * Math.abs(m.Ld - m.Lq)));
  let lo = 0;
  for (let k = 0; k < 200 && mtpaTorque(m, hi) < Ta; k++) {
    lo = hi;
    hi *= 2;
  }
  for (let k = 0; k < 200 && hi - lo > 1e-14 * hi; k++) {
    const mid = 0.5 * (lo + hi);
    if (mtpaTorque(m, mid) >= Ta) hi = mid;
    else lo = mid;
  }
  const c = mtpaCurrents(m, hi);
  return { id: c.id, iq: T < 0 ? -c.iq : c.iq, current: hi };
}

/** Largest MTPA current angle from the +d axis, rad (pi/2 for SPM, > pi/2 for IPM). */
export function mtpaAngle(m: DqMachine, I: number): number {
  const c = mtpaCurrents(m, I);
  return Math.atan2(c.iq, c.id);
}

/**
 * Currents on the voltage boundary |v| = Vmax at electrical speed we, parametrised by the voltage
 * angle phi: v = Vmax (cos phi, sin phi), i = A^-1 (v - b), A = [[Rs, -we Lq], [we Ld, Rs]],
 * b = (0, we psiM). Writes into out[0] = id, out[1] = iq. Requires Rs² + we² Ld Lq > 0.
 */
export function currentOnVoltageBoundary(m: DqMachine, Vmax: number, we: number, phi: number, out: Float64Array): void {
  const Xd = we * m.Ld;
  const Xq = we * m.Lq;
  const D = m.Rs * m.Rs + Xd * Xq;
  const ud = Vmax * Math.cos(phi);
  const uq = Vmax * Math.sin(phi) - we * m.psiM;
  out[0] = (m.Rs * ud + Xq * uq) / D;
  out[1] = (-Xd * ud + m.Rs * uq) / D;
}

const GOLD = (Math.sqrt(5) - 1) / 2;

/**
 * MTPV point at a mechanical speed with Rs included: the largest torque of sign `sign` on the
 * voltage boundary |v| = Vmax, current unlimited. The torque along the boundary is a trigonometric
 * polynomial of degree 2 in the voltage angle; its local maxima are bracketed by 32 samples and
 * refined by golden section (60 steps), the best is returned. Null when voltage never binds
 * (Rs = 0 at standstill) or when no boundary point gives torque of that sign.
 */
export function mtpvPoint(m: DqMachine, Vmax: number, speed_rad_s: number, sign: 1 | -1 = 1): { id: number; iq: number; torque: number; current: number } | null {
  assertMachine(m);
  assertFinite('speed', speed_rad_s, 'rad/s');
  const we = m.polePairs * speed_rad_s;
  if (m.Rs * m.Rs + we * we * m.Ld * m.Lq === 0) return null;
  const n = 32;
  const buf = new Float64Array(2);
  const J = (phi: number): number => {
    currentOnVoltageBoundary(m, Vmax, we, phi, buf);
    return sign * torqueOf(m, buf[0], buf[1]);
  };
  const step = (2 * Math.PI) / n;
  const samples = new Float64Array(n);
  for (let k = 0; k < n; k++) samples[k] = J(k * step);
  let best = -Infinity;
  let bestPhi = 0;
  for (let k = 0; k < n; k++) {
    const a = samples[(k + n - 1) % n];
    const b = samples[k];
    const c = samples[(k + 1) % n];
    if (!(b >= a && b >= c)) continue;
    let lo = (k - 1) * step;
    let hi = (k + 1) * step;
    let x1 = hi - GOLD * (hi - lo);
    let x2 = lo + GOLD * (hi - lo);
    let f1 = J(x1);
    let f2 = J(x2);
    for (let it = 0; it < 60; it++) {
      if (f1 < f2) { lo = x1; x1 = x2; f1 = f2; x2 = lo + GOLD * (hi - lo); f2 = J(x2); }
      else { hi = x2; x2 = x1; f2 = f1; x1 = hi - GOLD * (hi - lo); f1 = J(x1); }
    }
    const x = f1 > f2 ? x1 : x2;
    const f = Math.max(f1, f2);
    if (f > best) { best = f; bestPhi = x; }
  }
  if (!(best > 0)) return null;
  currentOnVoltageBoundary(m, Vmax, we, bestPhi, buf);
  return { id: buf[0], iq: buf[1], torque: sign * best, current: Math.hypot(buf[0], buf[1]) };
}

/**
 * Lossless (Rs = 0) MTPV in closed form, a check for `mtpvPoint`. With flux linkage
 * psi = Vmax/we at angle delta from d: psi_d = Ld id + psiM = psi cos(delta), psi_q = Lq iq = psi sin(delta),
 * T = 1.5 p psi_q (psi_d (1/Lq - 1/Ld) + psiM/Ld); dT/d(delta) = 0 gives
 * cos(delta) = 2k / (c + sqrt(c² + 8k²)) with k = psi (Ld-Lq)/(Ld Lq), c = psiM/Ld. Positive torque.
 */
export function mtpvLossless(m: DqMachine, Vmax: number, speed_rad_s: number): { id: number; iq: number; torque: number } {
  const we = Math.abs(m.polePairs * speed_rad_s);
  const psi = Vmax / we;
  const k = (psi * (m.Ld - m.Lq)) / (m.Ld * m.Lq);
  const c = m.psiM / m.Ld;
  const cosd = (2 * k) / (c + Math.sqrt(c * c + 8 * k * k));
  const sind = Math.sqrt(Math.max(0, 1 - cosd * cosd));
  const id = (psi * cosd - m.psiM) / m.Ld;
  const iq = (psi * sind) / m.Lq;
  return { id, iq, torque: torqueOf(m, id, iq) };
}
