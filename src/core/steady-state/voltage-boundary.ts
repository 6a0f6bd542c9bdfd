/**
 * The current on the voltage boundary |v_dq| = Vmax at electrical speed we, parametrised by the
 * voltage angle phi: v = Vmax (cos phi, sin phi). Steady state, motor reference direction
 * (see machine/machine-model.ts): v = Rs i + we (-psi_q, psi_d).
 *
 * Linear model (fast path): i = A^-1 (v - b), A = [[Rs, -we Lq], [we Ld, Rs]], b = (0, we psiM).
 * Any model (numeric path): Newton's method on steadyVoltage(i) = v with the incremental inductances
 * in the Jacobian dv/di = [[Rs - we Lqd, -we Lqq], [we Ldd, Rs + we Ldq]].
 */
import type { LinearTerms, MachineInput, MachineModel } from '../machine/machine-model';
import { isMachineModel } from '../machine/machine-model';
import { type NumericScratch, numericScratch } from '../machine/model-numeric';

/** The closed form on constant terms (Rs² + we² Ld Lq > 0). Writes out[0] = id, out[1] = iq. */
export function currentOnVoltageBoundaryLinear(L: LinearTerms, Rs: number, Vmax: number, we: number, phi: number, out: Float64Array): void {
  const Xd = we * L.Ld;
  const Xq = we * L.Lq;
  const D = Rs * Rs + Xd * Xq;
  const ud = Vmax * Math.cos(phi);
  const uq = Vmax * Math.sin(phi) - we * L.psiM;
  out[0] = (Rs * ud + Xq * uq) / D;
  out[1] = (-Xd * ud + Rs * uq) / D;
}

/**
 * Numeric path: Newton from the current in `out` (a warm start; zero when not finite) to
 * |delta i| <= tol (1 + |i|), or until the next correction predicted from quadratic convergence
 * (step² / previous step, once a step is under 1 % of the one before) is below that. Returns the iterations used, or -1 when it did not converge (a singular
 * Jacobian or maxIter reached; out then holds the last iterate). Common practice (no source).
 */
export function currentOnVoltageBoundaryNumeric(m: MachineModel, Vmax: number, we: number, phi: number, out: Float64Array, s: NumericScratch, tol = 1e-14, maxIter = 50): number {
  if (!(Number.isFinite(out[0]!) && Number.isFinite(out[1]!))) { out[0] = 0; out[1] = 0; }
  const ud = Vmax * Math.cos(phi), uq = Vmax * Math.sin(phi);
  let prev = Infinity;
  for (let k = 1; k <= maxIter; k++) {
    const id = out[0]!, iq = out[1]!;
    m.steadyVoltage(id, iq, we, s.a);
    m.incrementalInductance(id, iq, s.L);
    const L = s.L;
    const j00 = m.Rs - we * L[2]!, j01 = -we * L[3]!, j10 = we * L[0]!, j11 = m.Rs + we * L[1]!;
    const det = j00 * j11 - j01 * j10;
    if (!(Math.abs(det) > 0)) return -1;
    const rd = ud - s.a[0]!, rq = uq - s.a[1]!;
    const dd = (j11 * rd - j01 * rq) / det;
    const dq = (-j10 * rd + j00 * rq) / det;
    out[0] = id + dd;
    out[1] = iq + dq;
    const step = Math.abs(dd) + Math.abs(dq), scale = tol * (1 + Math.abs(out[0]!) + Math.abs(out[1]!));
    if (step <= scale) return k;
    // converging quadratically: the next correction, about step² / previous step, is already below tol
    if (k > 1 && step < 0.01 * prev && (step * step) / prev <= scale) return k;
    prev = step;
  }
  return -1;
}

/**
 * Current on the voltage boundary (closed form when the model is linear, else Newton from out's
 * contents). Writes out[0] = id, out[1] = iq. Requires a voltage that depends on the current
 * (Rs² + we² Ld Lq > 0 for a linear model).
 */
export function currentOnVoltageBoundary(m: MachineInput, Vmax: number, we: number, phi: number, out: Float64Array): void {
  if (!isMachineModel(m)) { currentOnVoltageBoundaryLinear(m, m.Rs, Vmax, we, phi, out); return; }
  if (m.linear !== null) { currentOnVoltageBoundaryLinear(m.linear, m.Rs, Vmax, we, phi, out); return; }
  currentOnVoltageBoundaryNumeric(m, Vmax, we, phi, out, numericScratch());
}
