/**
 * The curves a flux-map view draws, computed through the machine model alone (flux, torque,
 * incremental inductances) and the steady-state MTPA: they hold for a tabulated map and for a
 * constant-parameter machine alike (a constant map gives straight flux lines of slopes Ld and Lq and
 * constant inductances). Currents A peak, flux Wb peak, inductances H, torque N·m.
 *
 * - psi_d against id at several iq (the d axis saturating, and cross-saturation between the lines);
 * - psi_q against iq at several id (iq >= 0: psi_q is odd in iq);
 * - along the MTPA trajectory up to Imax: the apparent inductances
 *     Ld,app = (psi_d(id, iq) - psi_d(0, iq)) / id,   Lq,app = psi_q(id, iq) / iq
 *   (the magnet flux taken at the same q current, so cross-saturation does not end up in Ld; where
 *   the current on the axis is zero, the limit: the incremental inductance there) and the
 *   incremental ones Ldd = d psi_d / d id, Lqq = d psi_q / d iq, Ldq = d psi_d / d iq;
 * - the torque on a rectangular (id, iq) grid (for contour lines) and the MTPA points on it.
 */
import type { MachineModel } from '../machine/machine-model';
import { mtpaCurrents } from '../steady-state/mtpa';

/** One line of a flux family: psi against the swept current at a fixed level of the other current. */
export interface FluxLine {
  /** the fixed current (iq for a psi_d line, id for a psi_q line), A peak */
  level_A: number;
  /** the swept current, A peak */
  current_A: number[];
  psi_Wb: number[];
}

export interface InductanceCurves {
  /** current magnitude along MTPA, A peak */
  current_A: number[];
  LdApparent_H: number[];
  LqApparent_H: number[];
  /** d psi_d / d id */
  LdIncremental_H: number[];
  /** d psi_q / d iq */
  LqIncremental_H: number[];
  /** d psi_d / d iq (cross-saturation) */
  LdqIncremental_H: number[];
}

export interface FluxMapCurves {
  /** the current limit the curves span, A peak */
  Imax: number;
  /** psi_d against id in [-Imax, Imax], one line per q current */
  psid: FluxLine[];
  /** psi_q against iq in [0, Imax], one line per d current (0 and below: the motoring side) */
  psiq: FluxLine[];
  inductance: InductanceCurves;
  /** the MTPA trajectory from zero to Imax */
  mtpa: { current_A: number[]; id_A: number[]; iq_A: number[]; torque_Nm: number[] };
  /** torque on a grid: torque_Nm[j][i] at id_A[i], iq_A[j] (id in [-Imax, Imax/4], iq in [0, Imax]) */
  torque: { id_A: number[]; iq_A: number[]; torque_Nm: number[][] };
}

export interface FluxMapCurveOptions {
  /** the fixed currents of each flux family as fractions of Imax (default 0, 1/4, 1/2, 3/4, 1) */
  levels: readonly number[];
  /** points per swept curve (default 61) */
  points: number;
  /** points per side of the torque grid (default 41) */
  grid: number;
}

const DEFAULTS: FluxMapCurveOptions = { levels: [0, 0.25, 0.5, 0.75, 1], points: 61, grid: 41 };

const sweep = (a: number, b: number, n: number): number[] => Array.from({ length: n }, (_, k) => a + ((b - a) * k) / (n - 1));

/** The view's curves of a machine model up to the current limit Imax (A peak, > 0). */
export function fluxMapCurves(m: MachineModel, Imax: number, options: Partial<FluxMapCurveOptions> = {}): FluxMapCurves {
  if (!(Number.isFinite(Imax) && Imax > 0)) throw new RangeError(`Imax must be a finite current > 0 A (got ${Imax})`);
  const o = { ...DEFAULTS, ...options };
  const n = Math.max(2, Math.floor(o.points));
  const f = new Float64Array(2), f0 = new Float64Array(2), L = new Float64Array(4);

  const psid = o.levels.map((fr) => {
    const iq = fr * Imax;
    const current_A = sweep(-Imax, Imax, n);
    return { level_A: iq, current_A, psi_Wb: current_A.map((id) => (m.flux(id, iq, f), f[0]!)) };
  });
  const psiq = o.levels.map((fr) => {
    const id = -fr * Imax;
    const current_A = sweep(0, Imax, n);
    return { level_A: id, current_A, psi_Wb: current_A.map((iq) => (m.flux(id, iq, f), f[1]!)) };
  });

  const inductance: InductanceCurves = { current_A: [], LdApparent_H: [], LqApparent_H: [], LdIncremental_H: [], LqIncremental_H: [], LdqIncremental_H: [] };
  const mtpa = { current_A: [] as number[], id_A: [] as number[], iq_A: [] as number[], torque_Nm: [] as number[] };
  const tiny = 1e-9 * Imax;
  for (const I of sweep(0, Imax, n)) {
    const { id, iq } = mtpaCurrents(m, I);
    m.flux(id, iq, f);
    m.flux(0, iq, f0);
    m.incrementalInductance(id, iq, L);
    inductance.current_A.push(I);
    inductance.LdApparent_H.push(Math.abs(id) > tiny ? (f[0]! - f0[0]!) / id : L[0]!);
    inductance.LqApparent_H.push(Math.abs(iq) > tiny ? f[1]! / iq : L[3]!);
    inductance.LdIncremental_H.push(L[0]!);
    inductance.LqIncremental_H.push(L[3]!);
    inductance.LdqIncremental_H.push(L[1]!);
    mtpa.current_A.push(I);
    mtpa.id_A.push(id);
    mtpa.iq_A.push(iq);
    mtpa.torque_Nm.push(m.torque(id, iq));
  }

  const g = Math.max(2, Math.floor(o.grid));
  const tid = sweep(-Imax, 0.25 * Imax, g);
  const tiq = sweep(0, Imax, g);
  const torque = { id_A: tid, iq_A: tiq, torque_Nm: tiq.map((iq) => tid.map((id) => m.torque(id, iq))) };
  return { Imax, psid, psiq, inductance, mtpa, torque };
}
