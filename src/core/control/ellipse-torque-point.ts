/**
 * Field weakening without a search over the current, for the constant-parameter machine: the point
 * of least current that gives torque T on the voltage boundary |v_dq| = Vmax at one electrical speed.
 *
 * In steady state v = A i + b with A = [[Rs, -we Lq], [we Ld, Rs]], b = (0, we psiM), so the
 * boundary is the image of the circle v = Vmax (cos phi, sin phi) under i = A^-1 (v - b): every
 * boundary point is a closed form of phi, and so are its torque 1.5 p iq (psiM + (Ld - Lq) id) and
 * its current. The points with torque T are the roots of T(phi) - T, a smooth periodic function:
 * bracketed by NS samples (a pair of roots hiding between samples is opened by a golden-section
 * search for the extremum between them) and refined by regula falsi (Illinois) to the last bits of phi. Of the roots, the one
 * of least current is the answer. When the MTPA point for T lies outside the voltage region (the
 * caller checks), the least current within the region on the constant-torque curve lies on its
 * boundary, so this is the least-current operating point of field weakening (or of MTPV at the
 * largest torque). Common practice (no source); the trajectory is the one of Morimoto, Takeda,
 * Hirasa, Taniguchi (1990), IEEE Trans. Ind. Appl. 26(5).
 *
 * One instance per speed row: `setSpeed` samples the boundary once, `solve` is called per torque.
 * Nothing is allocated per call.
 */
import type { LinearTerms } from '../machine/machine-model';

const NS = 96;
const ROOT_STEPS = 80;
const GOLDEN = 60;
const GOLD = (Math.sqrt(5) - 1) / 2;

export class EllipseTorquePoint {
  private readonly Ld: number;
  private readonly Lq: number;
  private readonly psiM: number;
  private readonly Rs: number;
  private readonly k: number;
  private readonly Vmax: number;
  private we = 0;
  private det = 0;
  private readonly ph = new Float64Array(NS + 1);
  private readonly tq = new Float64Array(NS + 1);
  /** the last point evaluated: id, iq, torque */
  private id = 0;
  private iq = 0;
  /** the answer of `solve`: id, iq (A) */
  readonly out = new Float64Array(2);

  constructor(L: LinearTerms, polePairs: number, Rs: number, Vmax: number) {
    this.Ld = L.Ld;
    this.Lq = L.Lq;
    this.psiM = L.psiM;
    this.Rs = Rs;
    this.k = 1.5 * polePairs;
    this.Vmax = Vmax;
  }

  /** Sample the boundary at electrical speed we; false when the voltage does not depend on the current (Rs = 0 at standstill). */
  setSpeed(we: number): boolean {
    this.we = we;
    this.det = this.Rs * this.Rs + we * we * this.Ld * this.Lq;
    if (!(this.det > 0) || !Number.isFinite(this.det)) return false;
    for (let j = 0; j <= NS; j++) {
      const phi = (2 * Math.PI * j) / NS;
      this.ph[j] = phi;
      this.tq[j] = this.at(phi);
    }
    return true;
  }

  /** Torque of the boundary point at voltage angle phi (its currents kept in this.id, this.iq). */
  private at(phi: number): number {
    const vd = this.Vmax * Math.cos(phi);
    const vq = this.Vmax * Math.sin(phi) - this.we * this.psiM;
    const id = (this.Rs * vd + this.we * this.Lq * vq) / this.det;
    const iq = (-this.we * this.Ld * vd + this.Rs * vq) / this.det;
    this.id = id;
    this.iq = iq;
    return this.k * iq * (this.psiM + (this.Ld - this.Lq) * id);
  }

  /**
   * Root of T(phi) = T in [a, b] with T(a) - T and T(b) - T of opposite signs (or zero), by regula
   * falsi with the Illinois modification (superlinear, the bracket kept) down to the last bits of
   * phi; keeps the root of least current so far (its current squared returned, the point in `out`).
   */
  private root(a: number, fa: number, b: number, T: number, best: number): number {
    let fb = this.at(b) - T;
    let x = fa === 0 ? a : b;
    let fx = fa === 0 ? 0 : fb;
    let side = 0;
    for (let it = 0; it < ROOT_STEPS && fx !== 0 && Math.abs(b - a) > 4e-16 * (Math.abs(a) + Math.abs(b)); it++) {
      let c = (a * fb - b * fa) / (fb - fa);
      if (!(c > Math.min(a, b) && c < Math.max(a, b))) c = 0.5 * (a + b);
      const fc = this.at(c) - T;
      x = c;
      fx = fc;
      if (fc === 0) break;
      if ((fc < 0) === (fb < 0)) {
        // c replaces b, on b's side: halve the weight of a when this happens twice running
        b = c; fb = fc;
        if (side === -1) fa *= 0.5;
        side = -1;
      } else {
        a = b; fa = fb;
        b = c; fb = fc;
        side = 1;
      }
    }
    if (fx !== 0 && Math.abs(fa) < Math.abs(fx)) x = a;
    this.at(x);
    const i2 = this.id * this.id + this.iq * this.iq;
    if (i2 < best) {
      this.out[0] = this.id;
      this.out[1] = this.iq;
      return i2;
    }
    return best;
  }

  /**
   * The boundary point of least current with torque T (into `out`); false when no boundary point
   * has that torque (beyond the largest torque at this speed). Call `setSpeed` first.
   */
  solve(T: number): boolean {
    const ph = this.ph;
    const tq = this.tq;
    let best = Infinity;
    for (let j = 0; j < NS; j++) {
      const fa = tq[j]! - T;
      const fb = tq[j + 1]! - T;
      if (fa === 0 || (fa < 0) !== (fb < 0)) {
        best = this.root(ph[j]!, fa, ph[j + 1]!, T, best);
        continue;
      }
      // no sign change: a pair of roots may hide around a sampled extremum of the same side
      const fc = tq[j === NS - 1 ? 1 : j + 2]! - T; // the sample after b (periodic)
      const peak = (fc < 0) === (fa < 0) && fc !== 0 && (fa < 0 ? fb > fa && fb > fc : fb < fa && fb < fc);
      if (!peak) continue;
      // golden section for the extremum of sign -sign(fa) in [ph[j], ph[j] + 2 step]
      const s = fa < 0 ? 1 : -1;
      let lo = ph[j]!;
      let hi = ph[j]! + 2 * (ph[1]! - ph[0]!);
      let x1 = hi - GOLD * (hi - lo);
      let x2 = lo + GOLD * (hi - lo);
      let f1 = s * this.at(x1);
      let f2 = s * this.at(x2);
      for (let it = 0; it < GOLDEN; it++) {
        if (f1 < f2) { lo = x1; x1 = x2; f1 = f2; x2 = lo + GOLD * (hi - lo); f2 = s * this.at(x2); }
        else { hi = x2; x2 = x1; f2 = f1; x1 = hi - GOLD * (hi - lo); f1 = s * this.at(x1); }
      }
      const xm = f1 >= f2 ? x1 : x2;
      const fm = this.at(xm) - T;
      if (fm === 0 || (fm < 0) !== (fa < 0)) {
        best = this.root(ph[j]!, fa, xm, T, best);
        best = this.root(xm, fm, ph[j]! + 2 * (ph[1]! - ph[0]!), T, best);
      }
    }
    return best < Infinity;
  }
}
