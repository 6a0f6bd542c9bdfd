/**
 * What a flux map says about itself (the project turns these into findings):
 *  - reciprocity: a lossless magnetic field has a co-energy W'(i) with psi = grad W', so
 *    d psi_d/d i_q = d psi_q/d i_d; the largest difference over a grid, relative to the inductances;
 *  - the apparent inductances Ld = (psi_d(id, iq) - psi_d(0, iq))/id, Lq = psi_q(id, iq)/iq and the
 *    flux at zero current (psiM), beside the incremental ones.
 * Vas (1993), Electrical Machines and Drives: A Space-Vector Theory Approach, ch. 6 (saturated
 * machines: apparent and incremental inductances, the reciprocity of the cross terms).
 */
import type { MachineModel } from './machine-model';

/**
 * max over the grid of |Ldq - Lqd| / sqrt(Ldd Lqq) (incremental inductances of the model; 0 for a
 * reciprocal model up to the interpolation's error: 0.004 at the nodes of the fourth demo's 41 x 41
 * map, whose source is reciprocal, against 0.66 when its psi_q gains 0.1 mH x id iq / 450 A, so a
 * threshold of a few per cent separates them). NaN when an incremental self-inductance is not positive.
 */
export function reciprocityError(model: MachineModel, ids: readonly number[], iqs: readonly number[]): number {
  const L = new Float64Array(4);
  let e = 0;
  for (const id of ids) {
    for (const iq of iqs) {
      model.incrementalInductance(id, iq, L);
      const s = L[0]! * L[3]!;
      if (!(s > 0)) return Number.NaN;
      e = Math.max(e, Math.abs(L[1]! - L[2]!) / Math.sqrt(s));
    }
  }
  return e;
}

export interface ApparentInductances {
  /** psi_d at zero current, Wb (psiM of a linear model) */
  psiM: number;
  /** apparent Ld, Lq, H (the incremental ones at (id, iq) = 0 when the current is zero on that axis) */
  Ld: number;
  Lq: number;
  /** incremental inductances [Ldd, Ldq, Lqd, Lqq], H */
  incremental: [number, number, number, number];
}

/** The apparent and incremental inductances of a model at (id, iq). */
export function apparentInductances(model: MachineModel, id: number, iq: number): ApparentInductances {
  const f = new Float64Array(2), f0 = new Float64Array(2), z = new Float64Array(2), L = new Float64Array(4);
  model.flux(0, 0, z);
  model.flux(id, iq, f);
  model.flux(0, iq, f0);
  model.incrementalInductance(id, iq, L);
  const Ld = id !== 0 ? (f[0]! - f0[0]!) / id : L[0]!;
  const Lq = iq !== 0 ? f[1]! / iq : L[3]!;
  return { psiM: z[0]!, Ld, Lq, incremental: [L[0]!, L[1]!, L[2]!, L[3]!] };
}
