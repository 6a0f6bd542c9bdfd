/**
 * An algebraic saturation model: current as a closed-form function of flux, the gradient of one
 * magnetic energy function W(psi), hence reciprocal (d psi_d/d i_q = d psi_q/d i_d) by construction.
 * Hinkkanen, Pescetto, Mölsä, Saarakkala, Pellegrino, Bojoi (2017), Sensorless self-commissioning
 * of synchronous reluctance motors at standstill without rotor locking, IEEE Trans. Ind. Appl. 53(3):
 *
 *   i_d = (a_d0 + a_dd |psi_d|^S + a_dq/(V+2) |psi_d|^U |psi_q|^(V+2)) psi_d - i_f
 *   i_q = (a_q0 + a_qq |psi_q|^T + a_dq/(U+2) |psi_d|^(U+2) |psi_q|^V) psi_q
 *
 * made a permanent-magnet machine by the magnet as a constant d-axis current i_f (its magnetomotive
 * force; common practice (no source)): still the gradient of W(psi) - i_f psi_d, and psi_d at zero
 * current falls as psi_q rises (cross-saturation). Flux from current is Newton's method on this
 * function (damped on the residual), warm-started from the last answer.
 */
import type { MachineModel } from './machine-model';

export interface SaturationParams {
  /** inverse unsaturated inductances, 1/H */
  a_d0: number;
  a_q0: number;
  /** self-saturation coefficients (1/H per Wb^S, per Wb^T) and exponents */
  a_dd: number;
  S: number;
  a_qq: number;
  T: number;
  /** cross-saturation coefficient and exponents */
  a_dq: number;
  U: number;
  V: number;
  /** the magnet as a d-axis current, A peak */
  i_f: number;
}

export class SaturationModel implements MachineModel {
  readonly linear = null;
  /** flux of the last call and the Newton scratch (a model is used by one computation at a time) */
  private readonly psi = new Float64Array(2);
  private readonly G = new Float64Array(4);
  private readonly cur = new Float64Array(2);
  private warm = false;

  constructor(readonly params: Readonly<SaturationParams>, readonly polePairs: number, readonly Rs: number) {}

  /** The current (id, iq) of flux (psid, psiq), closed form, into out; its Jacobian d i/d psi [Gdd, Gdq, Gqd, Gqq] into G when given. */
  currentAndGradient(psid: number, psiq: number, out: Float64Array, G: Float64Array | null): void {
    const { a_d0, a_q0, a_dd, S, a_qq, T, a_dq, U, V, i_f } = this.params;
    const ad = Math.abs(psid), aq = Math.abs(psiq);
    const dS = Math.pow(ad, S), qT = Math.pow(aq, T), dU = Math.pow(ad, U), qV = Math.pow(aq, V);
    const dU2 = dU * ad * ad, qV2 = qV * aq * aq;
    out[0] = (a_d0 + a_dd * dS + (a_dq / (V + 2)) * dU * qV2) * psid - i_f;
    out[1] = (a_q0 + a_qq * qT + (a_dq / (U + 2)) * dU2 * qV) * psiq;
    if (G) {
      G[0] = a_d0 + (S + 1) * a_dd * dS + ((U + 1) * a_dq / (V + 2)) * dU * qV2;
      G[1] = a_dq * dU * psid * qV * psiq;
      G[2] = G[1];
      G[3] = a_q0 + (T + 1) * a_qq * qT + ((V + 1) * a_dq / (U + 2)) * dU2 * qV;
    }
  }

  current(psid: number, psiq: number, out: Float64Array): void {
    this.currentAndGradient(psid, psiq, out, null);
  }

  /** Newton's method for the flux of (id, iq) into this.psi (and Jacobian in this.G at the answer). */
  private solve(id: number, iq: number): void {
    const psi = this.psi, G = this.G, c = this.cur, p = this.params;
    if (!this.warm || !Number.isFinite(psi[0]!) || !Number.isFinite(psi[1]!)) {
      // the unsaturated flux: an upper bound of the saturated one in size
      psi[0] = (id + p.i_f) / p.a_d0; psi[1] = iq / p.a_q0;
    }
    this.warm = true;
    this.currentAndGradient(psi[0]!, psi[1]!, c, G);
    let r0 = id - c[0]!, r1 = iq - c[1]!;
    const scale = 1 + Math.abs(id) + Math.abs(iq) + p.i_f;
    for (let k = 0; k < 100 && Math.abs(r0) + Math.abs(r1) > 1e-12 * scale; k++) {
      const det = G[0]! * G[3]! - G[1]! * G[2]!;
      const d0 = (G[3]! * r0 - G[1]! * r1) / det, d1 = (-G[2]! * r0 + G[0]! * r1) / det;
      const n0 = Math.abs(r0) + Math.abs(r1);
      let t = 1;
      const x0 = psi[0]!, x1 = psi[1]!;
      for (let h = 0; h < 30; h++) {
        psi[0] = x0 + t * d0; psi[1] = x1 + t * d1;
        this.currentAndGradient(psi[0]!, psi[1]!, c, G);
        if (Math.abs(id - c[0]!) + Math.abs(iq - c[1]!) < n0 || !(det > 0)) break;
        t *= 0.5;
      }
      r0 = id - c[0]!; r1 = iq - c[1]!;
    }
  }

  flux(id: number, iq: number, out: Float64Array): void {
    this.solve(id, iq);
    out[0] = this.psi[0]!;
    out[1] = this.psi[1]!;
  }

  torque(id: number, iq: number): number {
    this.solve(id, iq);
    return 1.5 * this.polePairs * (this.psi[0]! * iq - this.psi[1]! * id);
  }

  steadyVoltage(id: number, iq: number, we: number, out: Float64Array): void {
    this.solve(id, iq);
    out[0] = this.Rs * id - we * this.psi[1]!;
    out[1] = this.Rs * iq + we * this.psi[0]!;
  }

  /** The inverse of the Jacobian d i/d psi at the flux of (id, iq). */
  incrementalInductance(id: number, iq: number, out: Float64Array): void {
    this.solve(id, iq);
    const G = this.G;
    const det = G[0]! * G[3]! - G[1]! * G[2]!;
    out[0] = G[3]! / det;
    out[1] = -G[1]! / det;
    out[2] = -G[2]! / det;
    out[3] = G[0]! / det;
  }
}

/**
 * Invented parameters (not a product's data): an 8-pole interior-magnet traction motor of roughly
 * 450 A peak on a 350 V bus. psi_d(0, 0) = 0.066 Wb; incremental Ld 0.31 mH and Lq 0.85 mH at zero
 * current; at 450 A on the q axis the apparent Lq falls by about 35 % and psi_d by about 12 %.
 */
export const INVENTED_IPM_SATURATION: Readonly<SaturationParams> = Object.freeze({
  a_d0: 3000, a_q0: 1150, a_dd: 2e6, S: 4, a_qq: 1e4, T: 2, a_dq: 2.5e5, U: 1, V: 0, i_f: 200,
});
