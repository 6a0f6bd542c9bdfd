/**
 * A flux-map machine: psi_d(id, iq) and psi_q(id, iq) tabulated on a rectangular grid (from
 * finite-element analysis or a test bench), the machine model's second implementation. The table
 * is taken as given (the project checks it: rectangular, ascending, finite, positive incremental
 * inductances); a map of iq >= 0 only is mirrored by the odd symmetry of psi_q in iq and the even
 * symmetry of psi_d. A magnet-temperature shift adds a constant to psi_d (see `fluxMapAt`).
 *
 * Interpolation: C1 bicubic Hermite (see `FluxMapModel.evalAt`). The inverse (current from flux) is
 * Newton's method on the interpolant with its exact derivatives, from the last answer or zero,
 * bounded in steps and in current (see `FluxMapModel.current`).
 */
import type { MachineModel } from './machine-model';
import { InputError } from '../base/errors';
import { HermiteSurfacePair, hermiteNodes } from '../mathematics/hermite-surface';

/** The map as a project file gives it: psid_Wb[i][j] at id_A[i], iq_A[j]; A peak, Wb peak. */
export interface FluxMapData {
  /** magnet temperature of the map, °C */
  magnetTemp_C: number;
  id_A: readonly number[];
  iq_A: readonly number[];
  psid_Wb: ReadonlyArray<readonly number[]>;
  psiq_Wb: ReadonlyArray<readonly number[]>;
}

/** The map on the full plane, row-major Float64Arrays: psid[i * nq + j] at (id[i], iq[j]). */
export interface FluxGrid {
  id: Float64Array;
  iq: Float64Array;
  psid: Float64Array;
  psiq: Float64Array;
}

/** The full-plane grid of a map: as given, or mirrored to iq < 0 when the map starts at iq = 0 (or above). */
export function fullPlaneGrid(d: FluxMapData): FluxGrid {
  const nd = d.id_A.length;
  const mirror = d.iq_A[0]! >= 0;
  const q = d.iq_A;
  const skip = mirror && q[0] === 0 ? 1 : 0; // iq = 0 is not repeated
  const iqs: number[] = mirror ? [...q.slice(skip).map((x) => -x).reverse(), ...q] : [...q];
  const nq = iqs.length;
  const psid = new Float64Array(nd * nq);
  const psiq = new Float64Array(nd * nq);
  for (let i = 0; i < nd; i++) {
    for (let j = 0; j < nq; j++) {
      // source column: mirrored columns read the column of |iq| (psid even, psiq odd in iq)
      const nm = mirror ? q.length - skip : 0;
      const src = mirror && j < nm ? nm - 1 - j + skip : mirror ? j - nm : j;
      const sign = mirror && j < nm ? -1 : 1;
      psid[i * nq + j] = d.psid_Wb[i]![src]!;
      psiq[i * nq + j] = sign * d.psiq_Wb[i]![src]!;
    }
  }
  return { id: Float64Array.from(d.id_A), iq: Float64Array.from(iqs), psid, psiq };
}

export class FluxMapModel implements MachineModel {
  readonly linear = null;
  readonly grid: FluxGrid;
  /** the interpolant of psi_d (surface 0) and psi_q (surface 1) */
  private readonly surf: HermiteSurfacePair;
  /**
   * the inverse's last answer (a model is used by one computation at a time): [id, iq, its psid,
   * its psiq, 1 when invJac holds the inverse Jacobian there]
   */
  private readonly guess = new Float64Array(5);
  private readonly invJac = new Float64Array(4);
  /** the inverse's flux target and a Newton run's start (read from arrays: no double crosses a call as an argument) */
  private readonly target = new Float64Array(2);
  private readonly start = new Float64Array(2);
  /** the inverse's bounds: the grid widened by its span on every side, the largest step */
  private readonly loD: number;
  private readonly hiD: number;
  private readonly loQ: number;
  private readonly hiQ: number;
  private readonly maxStep: number;
  /** the inverse's flux tolerance: 1e-13 of the largest |psi| on the map (shift included) */
  private fluxTol: number;
  /** the extremes of the grid's psi_d (before the shift) and the largest |psi_q|, for fluxTol at any shift */
  private readonly psidMin: number;
  private readonly psidMax: number;
  private readonly psiqAbsMax: number;

  /**
   * @param data the map (checked by the project)
   * @param psidShift_Wb added to psi_d everywhere (the magnet at another temperature, see fluxMapAt)
   */
  constructor(readonly data: FluxMapData, readonly polePairs: number, readonly Rs: number, readonly psidShift_Wb = 0) {
    this.grid = fullPlaneGrid(data);
    const g = this.grid;
    if (g.id.length < 2 || g.iq.length < 2) throw new InputError('motor.fluxMap', 'needs at least 2 points along id_A and along iq_A (after mirroring a map of iq >= 0)');
    this.surf = new HermiteSurfacePair(g.id, g.iq, hermiteNodes(g.id, g.iq, g.psid), hermiteNodes(g.id, g.iq, g.psiq));
    const nd = g.id.length, nq = g.iq.length;
    const spanD = g.id[nd - 1]! - g.id[0]!, spanQ = g.iq[nq - 1]! - g.iq[0]!;
    this.loD = g.id[0]! - spanD; this.hiD = g.id[nd - 1]! + spanD;
    this.loQ = g.iq[0]! - spanQ; this.hiQ = g.iq[nq - 1]! + spanQ;
    this.maxStep = 0.25 * Math.max(spanD, spanQ);
    let dMin = Infinity, dMax = -Infinity, qAbs = 0;
    for (let k = 0; k < g.psid.length; k++) {
      dMin = Math.min(dMin, g.psid[k]!);
      dMax = Math.max(dMax, g.psid[k]!);
      qAbs = Math.max(qAbs, Math.abs(g.psiq[k]!));
    }
    this.psidMin = dMin;
    this.psidMax = dMax;
    this.psiqAbsMax = qAbs;
    this.fluxTol = this.tolAt(psidShift_Wb);
  }

  /**
   * 1e-13 of the largest |psi| on the map with psi_d shifted: the largest |psid + shift| is at one of
   * psi_d's extremes (rounding is monotone, so this is the maximum over the grid exactly).
   */
  private tolAt(shift: number): number {
    return 1e-13 * Math.max(0, Math.abs(this.psidMin + shift), Math.abs(this.psidMax + shift), this.psiqAbsMax);
  }

  /**
   * Re-temper in place: a new winding resistance and psi_d shift (see fluxMapAt), the interpolant
   * kept. The model then answers exactly as a model built with these (the inverse's kept guess and
   * the last evaluation forgotten). Only for a model that one run owns (temperature-model.ts).
   */
  retemper(Rs: number, psidShift_Wb: number): void {
    const w = this as { Rs: number; psidShift_Wb: number };
    w.Rs = Rs;
    w.psidShift_Wb = psidShift_Wb;
    this.fluxTol = this.tolAt(psidShift_Wb);
    this.lastId = Number.NaN;
    this.lastIq = Number.NaN;
    this.guess.fill(0);
    this.invJac.fill(0);
  }

  /** the last point evaluated, its flux (shift included) and derivatives: a solver's Newton step asks twice at one point */
  private lastId = Number.NaN;
  private lastIq = Number.NaN;
  private readonly psi = new Float64Array(2);
  private readonly dpsi = new Float64Array(4);
  /** the point to evaluate (evalHere reads it: no double crosses a call as an argument) */
  private readonly at = new Float64Array(2);

  /**
   * The C1 interpolant at (id, iq) (mathematics/hermite-surface.ts: bicubic Hermite with monotone
   * slopes along the grid lines, continued linearly beyond the grid) into this.psi, and the exact
   * derivatives of the interpolant [dpsid/did, dpsid/diq, dpsiq/did, dpsiq/diq] into this.dpsi;
   * nothing to do when (id, iq) is the last point evaluated.
   */
  private evalAt(id: number, iq: number): void {
    if (id === this.lastId && iq === this.lastIq) return;
    const at = this.at;
    at[0] = id;
    at[1] = iq;
    this.evalHere();
  }

  /** `evalAt` of the point (this.at[0], this.at[1]). */
  private evalHere(): void {
    const at = this.at;
    const id = at[0]!, iq = at[1]!;
    if (id === this.lastId && iq === this.lastIq) return;
    this.surf.evaluateAt(at, this.psi, this.dpsi);
    this.psi[0] = this.psi[0]! + this.psidShift_Wb;
    this.lastId = id;
    this.lastIq = iq;
  }

  flux(id: number, iq: number, out: Float64Array): void {
    this.evalAt(id, iq);
    out[0] = this.psi[0]!;
    out[1] = this.psi[1]!;
  }

  torque(id: number, iq: number): number {
    this.evalAt(id, iq);
    return 1.5 * this.polePairs * (this.psi[0]! * iq - this.psi[1]! * id);
  }

  steadyVoltage(id: number, iq: number, we: number, out: Float64Array): void {
    this.evalAt(id, iq);
    out[0] = this.Rs * id - we * this.psi[1]!;
    out[1] = this.Rs * iq + we * this.psi[0]!;
  }

  incrementalInductance(id: number, iq: number, out: Float64Array): void {
    this.evalAt(id, iq);
    const d = this.dpsi;
    out[0] = d[0]!; out[1] = d[1]!; out[2] = d[2]!; out[3] = d[3]!;
  }

  /**
   * The current whose flux is (psid, psiq): Newton's method on the interpolant with its exact
   * derivatives. The first guess is one Newton step from the last answer with the inverse Jacobian
   * kept from there (no evaluation: exact on an affine map, second order in the flux change
   * otherwise); then bounded Newton steps, each bounded to a quarter of the grid's span and halved
   * until the flux error shrinks, the iterate kept within the grid widened by its span on every
   * side; it stops when the flux error is at most 1e-13 of the map's flux scale or a step moves the
   * current by at most 1e-13 (1 + |i|); from zero current if that fails. Common practice (no source).
   */
  current(psid: number, psiq: number, out: Float64Array): void {
    // small, so that it inlines into its caller: the rest reads the flux from this.target
    const t = this.target;
    t[0] = psid;
    t[1] = psiq;
    this.inverse(out);
  }

  /** `current` of the flux (this.target[0], this.target[1]). */
  private inverse(out: Float64Array): void {
    const g = this.guess, s = this.start, tg = this.target;
    const psid = tg[0]!, psiq = tg[1]!;
    let id0 = g[0]!, iq0 = g[1]!;
    if (g[4]! === 1) {
      // one step of the kept inverse Jacobian from the last answer's flux, bounded like a Newton step
      const ed = psid - g[2]!, eq = psiq - g[3]!;
      const j = this.invJac;
      let dd = j[0]! * ed + j[1]! * eq, dq = j[2]! * ed + j[3]! * eq;
      const len = Math.abs(dd) + Math.abs(dq);
      if (len > this.maxStep) { dd *= this.maxStep / len; dq *= this.maxStep / len; }
      if (dd === dd && dq === dq) { id0 += dd; iq0 += dq; }
    }
    s[0] = id0;
    s[1] = iq0;
    if (!this.newtonInverse(out)) {
      s[0] = 0;
      s[1] = 0;
      if (!this.newtonInverse(out)) { g[4] = 0; g[0] = out[0]!; g[1] = out[1]!; return; }
    }
    // out is the last point evaluated: keep its flux and inverse Jacobian for the next guess
    const L = this.dpsi;
    const det = L[0]! * L[3]! - L[1]! * L[2]!;
    g[0] = out[0]!;
    g[1] = out[1]!;
    g[2] = this.psi[0]!;
    g[3] = this.psi[1]!;
    const j = this.invJac;
    j[0] = L[3]! / det; j[1] = -L[1]! / det; j[2] = -L[2]! / det; j[3] = L[0]! / det;
    g[4] = Math.abs(det) > 0 ? 1 : 0;
  }

  /**
   * One bounded Newton run to the flux this.target from the current this.start into out; true when
   * it converged (then out is the last point evaluated).
   */
  private newtonInverse(out: Float64Array): boolean {
    const loD = this.loD, hiD = this.hiD, loQ = this.loQ, hiQ = this.hiQ, maxStep = this.maxStep, tol = this.fluxTol;
    const psid = this.target[0]!, psiq = this.target[1]!;
    const at = this.at;
    let id = Math.min(hiD, Math.max(loD, this.start[0]!)), iq = Math.min(hiQ, Math.max(loQ, this.start[1]!));
    at[0] = id; at[1] = iq;
    this.evalHere();
    let rd = psid - this.psi[0]!, rq = psiq - this.psi[1]!;
    out[0] = id; out[1] = iq;
    if (Math.abs(rd) + Math.abs(rq) <= tol) return true;
    for (let k = 0; k < 60; k++) {
      const L = this.dpsi;
      const det = L[0]! * L[3]! - L[1]! * L[2]!;
      if (!(Math.abs(det) > 0)) return false;
      let dd = (L[3]! * rd - L[1]! * rq) / det, dq = (-L[2]! * rd + L[0]! * rq) / det;
      const len = Math.abs(dd) + Math.abs(dq);
      if (len > maxStep) { dd *= maxStep / len; dq *= maxStep / len; }
      const r0 = Math.abs(rd) + Math.abs(rq);
      let t = 1, nd = id, nq = iq, r1 = r0;
      for (let h = 0; h < 30; h++) {
        nd = Math.min(hiD, Math.max(loD, id + t * dd));
        nq = Math.min(hiQ, Math.max(loQ, iq + t * dq));
        at[0] = nd; at[1] = nq;
        this.evalHere();
        rd = psid - this.psi[0]!; rq = psiq - this.psi[1]!;
        r1 = Math.abs(rd) + Math.abs(rq);
        if (r1 < r0 || r0 === 0) break;
        t *= 0.5;
      }
      const moved = Math.abs(nd - id) + Math.abs(nq - iq);
      id = nd; iq = nq;
      out[0] = id; out[1] = iq;
      if (r1 <= tol || moved <= 1e-13 * (1 + Math.abs(id) + Math.abs(iq))) return true;
    }
    return false;
  }
}

/**
 * The map's model at another magnet temperature: psi_d shifted by alphaBr (T - T_map) psi_d(0, 0),
 * the magnet's flux scaled by its remanence coefficient and the rest of the map left as measured
 * (an approximation: the iron's saturation at the other temperature is not known from one map).
 */
export function fluxMapAt(data: FluxMapData, polePairs: number, Rs: number, magnetTemp_C: number, alphaBr: number): FluxMapModel {
  const base = new FluxMapModel(data, polePairs, Rs);
  const f = new Float64Array(2);
  base.flux(0, 0, f);
  return new FluxMapModel(data, polePairs, Rs, alphaBr * (magnetTemp_C - data.magnetTemp_C) * f[0]!);
}
