/**
 * The generic numeric paths of the machine model: what a model that is not linear needs from its
 * flux alone. Torque and voltage follow from the flux (see machine-model.ts); the incremental
 * inductances by central differences; the inverse (current from flux) by Newton's method on the
 * flux with the incremental inductances as Jacobian. Each writes into caller-owned scratch.
 */
import type { MachineModel } from './machine-model';

/** Scratch of the numeric paths, owned by the caller (one per run: no shared state). */
export interface NumericScratch {
  readonly a: Float64Array;
  readonly b: Float64Array;
  readonly L: Float64Array;
}
export const numericScratch = (): NumericScratch => ({ a: new Float64Array(2), b: new Float64Array(2), L: new Float64Array(4) });

/** T = 1.5 p (psi_d iq - psi_q id) from the model's flux. Common practice (no source). */
export function torqueFromFlux(m: MachineModel, id: number, iq: number, s: NumericScratch): number {
  m.flux(id, iq, s.a);
  return 1.5 * m.polePairs * (s.a[0]! * iq - s.a[1]! * id);
}

/** vd = Rs id - we psi_q, vq = Rs iq + we psi_d from the model's flux. */
export function steadyVoltageFromFlux(m: MachineModel, id: number, iq: number, we: number, out: Float64Array, s: NumericScratch): void {
  m.flux(id, iq, s.a);
  out[0] = m.Rs * id - we * s.a[1]!;
  out[1] = m.Rs * iq + we * s.a[0]!;
}

/**
 * Incremental inductances [Ldd, Ldq, Lqd, Lqq] by central differences with step h (A): exact up
 * to round-off for a model affine in current, second-order accurate otherwise.
 */
export function incrementalInductanceNumeric(m: MachineModel, id: number, iq: number, h: number, out: Float64Array, s: NumericScratch): void {
  m.flux(id + h, iq, s.a);
  m.flux(id - h, iq, s.b);
  out[0] = (s.a[0]! - s.b[0]!) / (2 * h);
  out[2] = (s.a[1]! - s.b[1]!) / (2 * h);
  m.flux(id, iq + h, s.a);
  m.flux(id, iq - h, s.b);
  out[1] = (s.a[0]! - s.b[0]!) / (2 * h);
  out[3] = (s.a[1]! - s.b[1]!) / (2 * h);
}

/**
 * The current whose flux is (psid, psiq), by Newton's method from the guess in out (the model's
 * incremental inductances as Jacobian), to |delta i| <= tol·(1 + |i|). Returns the iterations
 * used, or -1 when it did not converge in maxIter (out then holds the last iterate).
 */
export function currentFromFluxNumeric(m: MachineModel, psid: number, psiq: number, out: Float64Array, s: NumericScratch, tol = 1e-13, maxIter = 50): number {
  for (let k = 1; k <= maxIter; k++) {
    const id = out[0]!, iq = out[1]!;
    m.flux(id, iq, s.a);
    m.incrementalInductance(id, iq, s.L);
    const rd = psid - s.a[0]!, rq = psiq - s.a[1]!;
    const L = s.L;
    const det = L[0]! * L[3]! - L[1]! * L[2]!;
    if (!(Math.abs(det) > 0)) return -1;
    const dd = (L[3]! * rd - L[1]! * rq) / det;
    const dq = (-L[2]! * rd + L[0]! * rq) / det;
    out[0] = id + dd;
    out[1] = iq + dq;
    if (Math.abs(dd) + Math.abs(dq) <= tol * (1 + Math.abs(out[0]!) + Math.abs(out[1]!))) return k;
  }
  return -1;
}

/**
 * The magnet's terms as the model sees them at zero current: psi_d there (psiM of a linear model)
 * and the incremental d inductance there (Ld of a linear model).
 */
export function zeroCurrentTerms(m: MachineModel): { psi0: number; Ld0: number } {
  const f = new Float64Array(2), L = new Float64Array(4);
  m.flux(0, 0, f);
  m.incrementalInductance(0, 0, L);
  return { psi0: f[0]!, Ld0: L[0]! };
}
