/**
 * A flux-map machine: psi_d(id, iq) and psi_q(id, iq) tabulated on a rectangular grid (from
 * finite-element analysis or a test bench), the machine model's second implementation. The table
 * is taken as given (the project checks it: rectangular, ascending, finite, positive incremental
 * inductances); a map of iq >= 0 only is mirrored by the odd symmetry of psi_q in iq and the even
 * symmetry of psi_d. A magnet-temperature shift adds a constant to psi_d (see `fluxMapAt`).
 *
 * Interpolation: C1 bicubic Hermite (see `FluxMapModel.evalAt`). The inverse (current from flux) is Newton's method on the
 * interpolant with its exact derivatives, from the last answer or zero, bounded in steps and in
 * current.
 */
import type { MachineModel } from './machine-model';
import { currentFromFluxNumeric, numericScratch, type NumericScratch } from './model-numeric';
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
  /** the inverse's scratch and last answer (a model is used by one computation at a time) */
  private readonly s: NumericScratch = numericScratch();
  private readonly guess = new Float64Array(2);

  /**
   * @param data the map (checked by the project)
   * @param psidShift_Wb added to psi_d everywhere (the magnet at another temperature, see fluxMapAt)
   */
  constructor(readonly data: FluxMapData, readonly polePairs: number, readonly Rs: number, readonly psidShift_Wb = 0) {
    this.grid = fullPlaneGrid(data);
    const g = this.grid;
    this.surf = new HermiteSurfacePair(g.id, g.iq, hermiteNodes(g.id, g.iq, g.psid), hermiteNodes(g.id, g.iq, g.psiq));
  }

  /** the last point evaluated, its flux (shift included) and derivatives: a solver's Newton step asks twice at one point */
  private lastId = Number.NaN;
  private lastIq = Number.NaN;
  private readonly psi = new Float64Array(2);
  private readonly dpsi = new Float64Array(4);

  /**
   * The C1 interpolant at (id, iq) (mathematics/hermite-surface.ts: bicubic Hermite with monotone
   * slopes along the grid lines, continued linearly beyond the grid) into this.psi, and the exact
   * derivatives of the interpolant [dpsid/did, dpsid/diq, dpsiq/did, dpsiq/diq] into this.dpsi;
   * nothing to do when (id, iq) is the last point evaluated.
   */
  private evalAt(id: number, iq: number): void {
    if (id === this.lastId && iq === this.lastIq) return;
    this.surf.eval(id, iq, this.psi, this.dpsi);
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

  current(psid: number, psiq: number, out: Float64Array): void {
    out[0] = this.guess[0]!;
    out[1] = this.guess[1]!;
    if (currentFromFluxNumeric(this, psid, psiq, out, this.s) < 0) {
      out[0] = 0;
      out[1] = 0;
      currentFromFluxNumeric(this, psid, psiq, out, this.s, 1e-13, 200);
    }
    this.guess[0] = out[0]!;
    this.guess[1] = out[1]!;
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
