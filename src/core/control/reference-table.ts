/**
 * Torque reference -> (i_d, i_q) references for the simulator's speed and torque modes, taken
 * from the engine's least-current operating-point solver (MTPA where the voltage allows it, field
 * weakening otherwise) and precomputed as a table, so the control loop only interpolates.
 *
 * Grid: mechanical speed 0..speedMax (uniform), and a normalised torque u in [-1, 1] (uniform),
 * where u = +1 is the largest motoring torque that both limits allow at that speed and u = -1 the
 * largest generating torque. The limits per speed row are the envelope's largest torques under both
 * limits (or, with a caller's solver, a bisection on its feasibility). With the standard solver and a
 * constant-parameter machine the cells are built directly, without the solver's search over the
 * current: the MTPA point of the torque when its voltage fits (the solver's own closed form, the same
 * numbers), else the least-current point of that torque on the voltage boundary
 * (ellipse-torque-point.ts); the table agrees with the solver's to 1e-9 of Imax (tested). Negative speeds use the machine's symmetry: the point at (-omega, -T) has the same
 * i_d and the opposite i_q as the point at (omega, T) (exact for the dq model, Rs included).
 * Lookup is bilinear in (speed, u) and allocates nothing.
 */
import type { MachineInput, MachineModel } from '../machine/machine-model';
import { machineModel } from '../machine/linear-dq';
import { mtpaCurrentForTorque, mtpaTorque } from '../steady-state/mtpa';
import { point } from '../steady-state/point-of-current';
import { EllipseTorquePoint } from './ellipse-torque-point';
import { maxTorquePoint } from '../steady-state/envelope';
import type { DriveLimits } from '../drive/inverter-spec';
import type { OperatingPoint } from '../steady-state/operating-point-types';
import { InputError } from '../base/errors';
import { solveOperatingPoint } from '../steady-state/operating-point';
import { bilinear, cellOf, gridPosition, lerp } from '../mathematics/interpolation';

export type OperatingPointSolver = (m: MachineInput, lim: DriveLimits, speed_rad_s: number, torque_Nm: number) => OperatingPoint;

export interface ReferenceTableOptions {
  /** highest mechanical speed of the grid, rad/s (beyond it the last row is used) */
  speedMax_rad_s: number;
  /** grid nodes along speed (>= 2) */
  speedNodes: number;
  /** grid nodes along the normalised torque (>= 3, odd keeps u = 0 on a node) */
  torqueNodes: number;
  /** bisection steps for the torque limit of each speed row */
  limitIterations: number;
}

export const DEFAULT_REFERENCE_TABLE_OPTIONS: Omit<ReferenceTableOptions, 'speedMax_rad_s'> = {
  speedNodes: 33,
  torqueNodes: 25,
  limitIterations: 30,
};

export interface ReferenceTable {
  speedMax: number;
  nS: number;
  nU: number;
  /** largest motoring torque per speed row, N·m (>= 0) */
  tMot: Float64Array;
  /** largest generating torque magnitude per speed row, N·m (>= 0) */
  tGen: Float64Array;
  /** i_d at [row * nU + col], A */
  id: Float64Array;
  /** i_q at [row * nU + col], A */
  iq: Float64Array;
}

function feasible(solve: OperatingPointSolver, m: MachineModel, lim: DriveLimits, w: number, T: number): OperatingPoint | null {
  try {
    const op = solve(m, lim, w, T);
    return op.feasible && Number.isFinite(op.id) && Number.isFinite(op.iq) ? op : null;
  } catch {
    return null;
  }
}

/**
 * Largest |T| with sign `dir` at speed w. With the standard solver: the envelope's largest torque
 * under both limits at that speed (one search instead of a bisection over full solves, each of which
 * is a search of its own), 0 where the solver cannot hold zero torque (`zeroHeld` false, as the
 * bisection finds). Otherwise a bisection on the solver's feasibility (bounded).
 */
function torqueLimitAt(solve: OperatingPointSolver, m: MachineModel, hi0: number, lim: DriveLimits, w: number, dir: 1 | -1, iters: number, zeroHeld: boolean): number {
  if (solve === solveOperatingPoint) {
    if (!zeroHeld) return 0;
    const op = maxTorquePoint(m, lim, w, dir > 0 ? 'motoring' : 'generating');
    return op.feasible ? Math.max(0, dir * op.torque) : 0;
  }
  return torqueLimit(solve, m, hi0, lim, w, dir, iters);
}

/** Largest |T| with sign `dir` that the solver reaches at speed w (bisection, bounded). */
function torqueLimit(solve: OperatingPointSolver, m: MachineModel, hi0: number, lim: DriveLimits, w: number, dir: 1 | -1, iters: number): number {
  if (feasible(solve, m, lim, w, dir * hi0)) return hi0;
  let lo = 0;
  let hi = hi0;
  if (!feasible(solve, m, lim, w, 0)) return 0;
  for (let k = 0; k < iters; k++) {
    const mid = 0.5 * (lo + hi);
    if (feasible(solve, m, lim, w, dir * mid)) lo = mid; else hi = mid;
  }
  return lo;
}

/**
 * No torque exceeds this within |i| <= Imax: 1.5 p (psiM + |Ld - Lq| Imax) Imax for a linear model;
 * for any other, the MTPA torque at Imax (the most torque that current makes) with 5 % margin.
 */
function torqueBound(m: MachineModel, Imax: number): number {
  const L = m.linear;
  if (L) return 1.5 * m.polePairs * (L.psiM + Math.abs(L.Ld - L.Lq) * Imax) * Imax;
  return 1.05 * mtpaTorque(m, Imax);
}

export function buildReferenceTable(
  input: MachineInput,
  lim: DriveLimits,
  options: Partial<ReferenceTableOptions> & { speedMax_rad_s: number },
  solve: OperatingPointSolver = solveOperatingPoint,
): ReferenceTable {
  const o = { ...DEFAULT_REFERENCE_TABLE_OPTIONS, ...options };
  if (!(o.speedMax_rad_s > 0 && Number.isFinite(o.speedMax_rad_s))) throw new InputError('reference table speedMax', 'must be > 0 rad/s');
  if (!(Number.isInteger(o.speedNodes) && o.speedNodes >= 2)) throw new InputError('reference table speedNodes', 'must be a whole number >= 2');
  if (!(Number.isInteger(o.torqueNodes) && o.torqueNodes >= 3)) throw new InputError('reference table torqueNodes', 'must be a whole number >= 3');
  const m = machineModel(input);
  const hi0 = torqueBound(m, lim.Imax);
  const nS = o.speedNodes;
  const nU = o.torqueNodes;
  const tMot = new Float64Array(nS);
  const tGen = new Float64Array(nS);
  const id = new Float64Array(nS * nU);
  const iq = new Float64Array(nS * nU);
  const direct = solve === solveOperatingPoint && m.linear !== null ? new EllipseTorquePoint(m.linear, m.polePairs, m.Rs, lim.Vmax) : null;
  const pt = new Float64Array(2);
  // the MTPA current of a torque does not depend on the speed: rows with the same limits (below base
  // speed) ask for the same torques, each found once per table
  const mtpaOf = new Map<number, { id: number; iq: number }>();
  for (let r = 0; r < nS; r++) {
    const w = (o.speedMax_rad_s * r) / (nS - 1);
    const zero = solve === solveOperatingPoint ? feasible(solve, m, lim, w, 0) : null;
    tMot[r] = torqueLimitAt(solve, m, hi0, lim, w, 1, o.limitIterations, zero !== null);
    tGen[r] = torqueLimitAt(solve, m, hi0, lim, w, -1, o.limitIterations, zero !== null);
    const rowDirect = direct !== null && direct.setSpeed(m.polePairs * w);
    let lastId = 0;
    let lastIq = 0;
    for (let c = 0; c < nU; c++) {
      const u = -1 + (2 * c) / (nU - 1);
      const T = u >= 0 ? u * tMot[r]! : u * tGen[r]!;
      // pull the end nodes a hair inside the limit so that bisection round-off never lands outside
      const Tq = Math.abs(u) === 1 ? T * (1 - 1e-9) : T;
      let ok: boolean;
      if (Tq === 0 && zero !== null) { ok = true; pt[0] = zero.id; pt[1] = zero.iq; }
      else if (rowDirect && Tq !== 0) ok = directPoint(m, lim, direct, w, Tq, pt, mtpaOf);
      else {
        const op = feasible(solve, m, lim, w, Tq);
        ok = op !== null;
        if (op) { pt[0] = op.id; pt[1] = op.iq; }
      }
      if (ok) {
        lastId = pt[0]!;
        lastIq = pt[1]!;
      }
      id[r * nU + c] = lastId;
      iq[r * nU + c] = lastIq;
    }
  }
  return { speedMax: o.speedMax_rad_s, nS, nU, tMot, tGen, id, iq };
}

/**
 * The standard solver's least-current point for a nonzero torque T at speed w on a constant-parameter
 * machine, without its search over the current: MTPA when its voltage fits (the solver's closed form),
 * else the least-current point of T on the voltage boundary; within Imax, or false (as the solver's
 * infeasible point). `mtpaOf`: the MTPA currents of the torques met so far in this table.
 */
function directPoint(m: MachineModel, lim: DriveLimits, e: EllipseTorquePoint, w: number, T: number, out: Float64Array, mtpaOf: Map<number, { id: number; iq: number }>): boolean {
  let mt = mtpaOf.get(T);
  if (mt === undefined) mtpaOf.set(T, (mt = mtpaCurrentForTorque(m, T)));
  const pm = point(m, w, mt.id, mt.iq, 'mtpa');
  if (pm.voltage <= lim.Vmax) {
    out[0] = pm.id;
    out[1] = pm.iq;
    return Number.isFinite(pm.id) && Number.isFinite(pm.iq) && pm.current <= lim.Imax;
  }
  if (!e.solve(T)) return false;
  const id = e.out[0]!;
  const iq = e.out[1]!;
  out[0] = id;
  out[1] = iq;
  return Number.isFinite(id) && Number.isFinite(iq) && Math.hypot(id, iq) <= lim.Imax;
}

/** Torque limits (motoring >= 0, generating <= 0) at mechanical speed w, N·m; writes out[0], out[1]. */
export function torqueLimitsAt(tab: ReferenceTable, w: number, out: Float64Array): void {
  const neg = w < 0;
  const x = gridPosition(Math.abs(w), tab.speedMax, tab.nS);
  const r = cellOf(x, tab.nS);
  const f = x - r;
  const mot = lerp(tab.tMot[r]!, tab.tMot[r + 1]!, f);
  const gen = lerp(tab.tGen[r]!, tab.tGen[r + 1]!, f);
  // at negative speed, motoring is negative torque: the roles swap
  out[0] = neg ? gen : mot;
  out[1] = neg ? -mot : -gen;
}

/**
 * (i_d, i_q) references for torque T at mechanical speed w: out[0] = i_d, out[1] = i_q.
 * T beyond the limits is clamped to them. Returns the torque actually asked (after the clamp).
 */
export function lookupCurrents(tab: ReferenceTable, w: number, T: number, out: Float64Array): number {
  const neg = w < 0;
  const Tp = neg ? -T : T;
  const x = gridPosition(Math.abs(w), tab.speedMax, tab.nS);
  const r = cellOf(x, tab.nS);
  const f = x - r;
  const mot = lerp(tab.tMot[r]!, tab.tMot[r + 1]!, f);
  const gen = lerp(tab.tGen[r]!, tab.tGen[r + 1]!, f);
  let u: number;
  if (Tp >= 0) u = mot > 0 ? Math.min(Tp / mot, 1) : 0;
  else u = gen > 0 ? Math.max(Tp / gen, -1) : 0;
  const y = ((u + 1) / 2) * (tab.nU - 1);
  const c = cellOf(y, tab.nU);
  const g = y - c;
  out[0] = bilinear(tab.id, tab.nU, r, f, c, g);
  const iqv = bilinear(tab.iq, tab.nU, r, f, c, g);
  out[1] = neg ? -iqv : iqv;
  const Tasked = u >= 0 ? u * mot : u * gen;
  return neg ? -Tasked : Tasked;
}
