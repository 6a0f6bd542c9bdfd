/**
 * MTPA and MTPV current vectors of a PMSM (steady state, motor reference direction,
 * amplitude-invariant scaling, see ../shared/conventions.md), through the machine model
 * (machine/machine-model.ts). A linear model takes the closed forms; any other model the numeric
 * paths of mtpa-numeric.ts and voltage-boundary.ts. Every public function accepts a MachineInput.
 */
import type { DriveLimits } from '../drive/inverter-spec';
import type { LinearTerms, MachineInput, MachineModel } from '../machine/machine-model';
import { isMachineModel } from '../machine/machine-model';
import { machineModel } from '../machine/linear-dq';
import { numericScratch } from '../machine/model-numeric';
import { InputError } from '../base/errors';
import { goldenSectionMax, polishMax } from '../mathematics/root-finding';
import { constantTorqueIqNumeric, mtpaCurrentsNumeric } from './mtpa-numeric';
import { currentOnVoltageBoundaryLinear, currentOnVoltageBoundaryNumeric } from './voltage-boundary';

export { currentOnVoltageBoundary } from './voltage-boundary';

/** The constant terms of an input: a plain dq machine is its own; a model says (null when not linear). */
export const linearTermsOf = (m: MachineInput): LinearTerms | null => (isMachineModel(m) ? m.linear : m);

/** Bad machine data is an InputError naming the project path (motor.*). */
export function assertMachine(m: MachineInput): void {
  if (!(Number.isInteger(m.polePairs) && m.polePairs >= 1)) throw new InputError('motor.polePairs', 'must be an integer >= 1');
  if (!(Number.isFinite(m.Rs) && m.Rs >= 0)) throw new InputError('motor.Rs', 'must be >= 0 ohm');
  const L = linearTermsOf(m);
  if (L === null) return;
  if (!(Number.isFinite(L.Ld) && L.Ld > 0)) throw new InputError('motor.Ld', 'must be > 0 H');
  if (!(Number.isFinite(L.Lq) && L.Lq > 0)) throw new InputError('motor.Lq', 'must be > 0 H');
  if (!(Number.isFinite(L.psiM) && L.psiM >= 0)) throw new InputError('motor.psiM', 'must be >= 0 Wb');
  if (L.psiM === 0 && L.Ld === L.Lq) throw new InputError('motor.psiM', 'must be > 0 Wb when Ld = Lq (the machine makes no torque)');
}

/** Limits must be positive; Imax may be Infinity for the current-unlimited solvers. */
export function assertLimits(lim: DriveLimits): void {
  if (!(Number.isFinite(lim.Vmax) && lim.Vmax > 0)) throw new InputError('inverter.Vdc', 'must give a voltage limit > 0 V');
  if (!(lim.Imax > 0) || Number.isNaN(lim.Imax)) throw new InputError('inverter.Imax', 'must be > 0 A');
}

export function assertFinite(field: string, x: number, unit: string): void {
  if (!Number.isFinite(x)) throw new InputError(field, `must be a finite number (${unit})`);
}

/** Electromagnetic torque, N·m (the model's). */
export const torqueOf = (m: MachineInput, id: number, iq: number): number => machineModel(m).torque(id, iq);

/**
 * The constant-torque locus: the q current that gives torque T at d current id; NaN where no such
 * point exists on the motoring side of the locus. Linear: iq = T / (1.5 p (psiM + (Ld - Lq) id)).
 */
export function constantTorqueIq(m: MachineInput, T: number, id: number): number {
  const L = linearTermsOf(m);
  if (L === null) return constantTorqueIqNumeric(machineModel(m), T, id);
  const den = 1.5 * m.polePairs * (L.psiM + (L.Ld - L.Lq) * id);
  return den > 0 ? T / den : NaN;
}

/**
 * cos of the MTPA current angle, id / I, in [-1, 1] (0 for SPM; also defined at I = 0), closed form
 * id = (psiM - sqrt(psiM² + 8 (Lq-Ld)² I²)) / (4 (Lq-Ld)) in the rationalised form
 * id = -2 (Lq-Ld) I² / (psiM + sqrt(psiM² + 8 (Lq-Ld)² I²)) that stays exact as Lq -> Ld.
 */
export function mtpaCosLinear(L: LinearTerms, I: number): number {
  const dL = L.Lq - L.Ld;
  const S = Math.sqrt(L.psiM * L.psiM + 8 * dL * dL * I * I);
  const den = L.psiM + S;
  if (!(den > 0)) return 0;
  const x = (-2 * dL * I) / den;
  if (x === 0) return 0; // no -0 for SPM
  return Math.max(-1, Math.min(1, x));
}

/** MTPA d-axis current for a current magnitude I (A peak). */
export function mtpaId(m: MachineInput, I: number): number {
  const L = linearTermsOf(m);
  return L !== null ? I * mtpaCosLinear(L, I) : mtpaCurrents(m, I).id;
}

/** MTPA currents for a current magnitude I >= 0 (positive torque: iq >= 0). */
export function mtpaCurrents(m: MachineInput, I: number): { id: number; iq: number } {
  const Ia = Math.abs(I);
  const L = linearTermsOf(m);
  if (L === null) {
    const c = new Float64Array(2);
    mtpaCurrentsNumeric(machineModel(m), Ia, c);
    return { id: c[0]!, iq: c[1]! };
  }
  const x = mtpaCosLinear(L, Ia);
  return { id: Ia * x, iq: Ia * Math.sqrt(1 - x * x) };
}

/** Torque along the MTPA trajectory at current magnitude I, N·m (>= 0). */
export function mtpaTorque(m: MachineInput, I: number): number {
  const c = mtpaCurrents(m, I);
  return torqueOf(m, c.id, c.iq);
}

/**
 * Least current that gives torque T (sign respected: iq takes the sign of T), along MTPA.
 * The MTPA torque rises strictly with I, so the root is bracketed (doubling from a first guess,
 * bounded) and refined by bisection to relative 1e-14 in I.
 */
export function mtpaCurrentForTorque(input: MachineInput, T: number): { id: number; iq: number; current: number } {
  assertMachine(input);
  assertFinite('torque', T, 'N·m');
  const m = machineModel(input);
  const Ta = Math.abs(T);
  if (Ta === 0) return { id: 0, iq: 0, current: 0 };
  const p = m.polePairs;
  // first guess: the magnet-only or reluctance-only current (flux and inductances at zero current),
  // then double until the torque is reached
  const lin = m.linear;
  let psi0: number, dL0: number;
  if (lin !== null) { psi0 = lin.psiM; dL0 = lin.Ld - lin.Lq; }
  else {
    const f0 = new Float64Array(2), L0 = new Float64Array(4);
    m.flux(0, 0, f0);
    m.incrementalInductance(0, 0, L0);
    psi0 = f0[0]!; dL0 = L0[0]! - L0[3]!;
  }
  // MTPA torque at current I: the closed form without allocation on a linear model
  const tq = lin !== null
    ? (I: number): number => { const x = mtpaCosLinear(lin, I); return m.torque(I * x, I * Math.sqrt(1 - x * x)); }
    : (I: number): number => mtpaTorque(m, I);
  let hi = psi0 > 0 ? Ta / (1.5 * p * psi0) : Math.sqrt((2 * Ta) / (1.5 * p * Math.abs(dL0)));
  let lo = 0;
  for (let k = 0; k < 200 && tq(hi) < Ta; k++) {
    lo = hi;
    hi *= 2;
  }
  for (let k = 0; k < 200 && hi - lo > 1e-14 * hi; k++) {
    const mid = 0.5 * (lo + hi);
    if (tq(mid) >= Ta) hi = mid;
    else lo = mid;
  }
  const c = mtpaCurrents(m, hi);
  return { id: c.id, iq: T < 0 ? -c.iq : c.iq, current: hi };
}

/** Largest MTPA current angle from the +d axis, rad (pi/2 for SPM, > pi/2 for IPM). */
export function mtpaAngle(m: MachineInput, I: number): number {
  const c = mtpaCurrents(m, I);
  return Math.atan2(c.iq, c.id);
}

/**
 * MTPV point at a mechanical speed with Rs included: the largest torque of sign `sign` on the
 * voltage boundary |v| = Vmax, current unlimited. The torque along the boundary (parametrised by
 * the voltage angle) has its local maxima bracketed by 32 samples and refined by golden section
 * (60 steps), the best is returned. Linear model: the boundary current in closed form; otherwise (or
 * with `numeric`) by Newton (voltage-boundary.ts) and the maximum polished by Newton on central
 * differences. Null when voltage never binds (Rs = 0 at standstill) or when no boundary point gives
 * torque of that sign.
 */
export function mtpvPoint(input: MachineInput, Vmax: number, speed_rad_s: number, sign: 1 | -1 = 1, numeric = false): { id: number; iq: number; torque: number; current: number } | null {
  assertMachine(input);
  assertFinite('speed', speed_rad_s, 'rad/s');
  const m = machineModel(input);
  const we = m.polePairs * speed_rad_s;
  const L0 = new Float64Array(4);
  m.incrementalInductance(0, 0, L0);
  if (m.Rs * m.Rs + we * we * L0[0]! * L0[3]! === 0) return null;
  const lin = numeric ? null : m.linear;
  const n = 32;
  const buf = new Float64Array(2);
  const ns = numericScratch();
  const at = (phi: number): void => {
    if (lin !== null) currentOnVoltageBoundaryLinear(lin, m.Rs, Vmax, we, phi, buf);
    else currentOnVoltageBoundaryNumeric(m, Vmax, we, phi, buf, ns);
  };
  const J = (phi: number): number => {
    at(phi);
    return sign * m.torque(buf[0]!, buf[1]!);
  };
  const step = (2 * Math.PI) / n;
  const samples = new Float64Array(n);
  for (let k = 0; k < n; k++) samples[k] = J(k * step);
  let best = -Infinity;
  let bestPhi = 0;
  const g = new Float64Array(2);
  for (let k = 0; k < n; k++) {
    const a = samples[(k + n - 1) % n]!;
    const b = samples[k]!;
    const c = samples[(k + 1) % n]!;
    if (!(b >= a && b >= c)) continue;
    goldenSectionMax(J, (k - 1) * step, (k + 1) * step, 60, g);
    let x = g[0]!, f = g[1]!;
    if (lin === null) {
      x = polishMax(J, x, (k - 1) * step, (k + 1) * step, 1e-3);
      f = J(x);
    }
    if (f > best) { best = f; bestPhi = x; }
  }
  if (!(best > 0)) return null;
  at(bestPhi);
  return { id: buf[0]!, iq: buf[1]!, torque: sign * best, current: Math.hypot(buf[0]!, buf[1]!) };
}

/**
 * Lossless (Rs = 0) MTPV in closed form, a check for `mtpvPoint` (linear models only). With flux
 * linkage psi = Vmax/we at angle delta from d: psi_d = Ld id + psiM = psi cos(delta), psi_q = Lq iq = psi sin(delta),
 * T = 1.5 p psi_q (psi_d (1/Lq - 1/Ld) + psiM/Ld); dT/d(delta) = 0 gives
 * cos(delta) = 2k / (c + sqrt(c² + 8k²)) with k = psi (Ld-Lq)/(Ld Lq), c = psiM/Ld. Positive torque.
 */
export function mtpvLossless(input: MachineInput, Vmax: number, speed_rad_s: number): { id: number; iq: number; torque: number } {
  const L = linearTermsOf(input);
  if (L === null) throw new InputError('motor', 'the lossless MTPV closed form needs a linear (constant Ld, Lq, psiM) machine');
  const m: MachineModel = machineModel(input);
  const we = Math.abs(m.polePairs * speed_rad_s);
  const psi = Vmax / we;
  const k = (psi * (L.Ld - L.Lq)) / (L.Ld * L.Lq);
  const c = L.psiM / L.Ld;
  const cosd = (2 * k) / (c + Math.sqrt(c * c + 8 * k * k));
  const sind = Math.sqrt(Math.max(0, 1 - cosd * cosd));
  const id = (psi * cosd - L.psiM) / L.Ld;
  const iq = (psi * sind) / L.Lq;
  return { id, iq, torque: m.torque(id, iq) };
}
