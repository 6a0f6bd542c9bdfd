/**
 * Current-reference table for firmware: the (i_d, i_q) a field-oriented drive should apply, against
 * the electromagnetic torque demand and the bus-normalised speed x = w_e / V_bus (electrical rad/s
 * per volt of effective bus, V_bus = Vdc less the two device drops), hot and cold on the same axes.
 *
 * Why x: in steady state v = Rs i + w_e J psi(i) (J the 90° rotation) and the modulator gives
 * |v| <= g V_bus (g the modulation gain times the utilisation). With Rs = 0 the voltage limit reads
 * |psi(i)| <= g / x: the feasible currents, and so the least-current (or maximum-torque) point for
 * every torque, depend on x alone, whatever the bus: one table serves a varying bus exactly, for any
 * flux linkage psi(i) (flux maps too), under a fixed current limit. Rs adds a drop Rs|i| that does
 * not scale with the bus: at a bus V' the voltage a table point needs differs from the one it was
 * built for by at most Rs |i| |1 - V'/V_bus| volts (triangle inequality on v/V'), i.e. the table is
 * exact at the bus it was built for and off by that much elsewhere (the export states it).
 * Loss-minimising control is exact only at the bus it was built for (inverter and iron losses do not
 * scale with x).
 *
 * Axes: x uniform from 0 to xMax (the firmware indexes directly, no search; standstill is a row; with
 * Rs = 0 the rows below the base point coincide, and field weakening, where the currents change, is
 * spread evenly by x because the flux the voltage allows is g / x); torque uniform from -Tpk to +Tpk
 * (2N - 1 nodes, N from 0 to Tpk, zero on a node) with Tpk the largest torque of any row and corner,
 * so motoring and generating both come out of the table (with Rs they differ). Negative speeds: the
 * point at (-x, -T) has the same i_d and the opposite i_q as (x, T), exact for the dq model, Rs
 * included. Per row the largest motoring and generating torque (maxTorquePoint, both limits) so that
 * the firmware clamps the demand; a node beyond its row's largest torque holds that row's
 * maximum-torque point of the same sign (beyond the maximum speed, where a row has none, the
 * zero-torque point). Nodes inside come from the least-current solver (solveOperatingPoint: MTPA,
 * field weakening, MTPV through the machine model) or, with `minLoss`, the current of least copper +
 * iron + inverter loss at the same electromagnetic torque (min-loss-em-torque.ts). Values are stored
 * as float32, what the firmware holds.
 */
import type { MachineInput, MachineModel } from '../machine/machine-model';
import type { DriveLimits } from '../drive/inverter-spec';
import type { OperatingPoint } from '../steady-state/operating-point-types';
import type { LossConditions } from '../steady-state/point-losses';
import { InputError } from '../base/errors';
import { machineModel } from '../machine/linear-dq';
import { maxTorquePoint } from '../steady-state/envelope';
import { solveOperatingPoint } from '../steady-state/operating-point';
import { minLossAtEmTorque } from '../steady-state/min-loss-em-torque';
import { newPointLossScratch } from '../steady-state/point-losses';

export interface CurrentTableSpec {
  /** effective bus the table is built at (Vdc less the two device drops), V: x = p w_m / bus_V */
  bus_V: number;
  /** the voltage limit at that bus and the current limit */
  limits: DriveLimits;
  /** top of the speed axis, electrical rad/s per volt of effective bus */
  xMax: number;
  /** speed-axis nodes, 0..xMax (>= 2) */
  speedPoints: number;
  /** torque nodes from 0 to the peak torque (>= 2); the axis has 2N - 1 nodes from -peak to +peak */
  torquePoints: number;
  /** loss data: the loss-minimising current at each electromagnetic torque (else the least current) */
  minLoss?: LossConditions;
}

export interface CurrentTableCorner {
  name: string;
  /** i_d, A peak, row-major [speed][torque] */
  id: Float32Array;
  /** i_q, A peak, row-major [speed][torque] */
  iq: Float32Array;
  /** largest motoring torque per row, N·m (>= 0) */
  tMot: Float32Array;
  /** largest generating torque magnitude per row, N·m (>= 0) */
  tGen: Float32Array;
  /** nodes inside the row's envelope that hold a solved point (the rest hold the row's extreme point) */
  solvedNodes: number;
}

export interface CurrentTable {
  control: 'least-current' | 'min-loss';
  bus_V: number;
  limits: DriveLimits;
  nS: number;
  nT: number;
  xMax: number;
  /** largest |torque| of the torque axis, N·m */
  torquePeak: number;
  /** speed axis, electrical rad/s per V */
  x: Float32Array;
  /** torque axis, N·m (electromagnetic) */
  torque: Float32Array;
  corners: CurrentTableCorner[];
}

/** Mechanical speed of the row at x (electrical rad/s per V) on the bus the table is built at. */
export const rowSpeed = (x: number, bus_V: number, polePairs: number): number => (x * bus_V) / polePairs;

function checkSpec(s: CurrentTableSpec): void {
  if (!(Number.isFinite(s.bus_V) && s.bus_V > 0)) throw new InputError('current table bus', `must be a positive number of volts (got ${s.bus_V})`);
  if (!(Number.isFinite(s.xMax) && s.xMax > 0)) throw new InputError('current table speed range', `must be > 0 rad/s per V (got ${s.xMax})`);
  if (!(Number.isInteger(s.speedPoints) && s.speedPoints >= 2 && s.speedPoints <= 1000)) throw new InputError('--speed-points', `must be a whole number from 2 to 1000 (got ${s.speedPoints})`);
  if (!(Number.isInteger(s.torquePoints) && s.torquePoints >= 2 && s.torquePoints <= 1000)) throw new InputError('--torque-points', `must be a whole number from 2 to 1000 (got ${s.torquePoints})`);
}

/** Largest motoring and generating torque (magnitudes) and their points at mechanical speed w. */
function rowLimits(m: MachineModel, lim: DriveLimits, w: number): { mot: OperatingPoint; gen: OperatingPoint; tMot: number; tGen: number } {
  const mot = maxTorquePoint(m, lim, w, 'motoring');
  const gen = maxTorquePoint(m, lim, w, 'generating');
  return { mot, gen, tMot: mot.feasible ? Math.max(0, mot.torque) : 0, tGen: gen.feasible ? Math.max(0, -gen.torque) : 0 };
}

/** What a caller may follow of a build: `onRow(done, total)` after each speed row of each corner is solved (total = corners x speed rows). */
export interface CurrentTableProgress {
  onRow?: (done: number, total: number) => void;
}

/**
 * The table for each named corner (e.g. hot and cold) on common axes. Throws InputError for a bad
 * grid, or when no corner makes torque at standstill within the limits.
 */
export function buildCurrentTable(corners: ReadonlyArray<{ name: string; model: MachineInput }>, spec: CurrentTableSpec, progress: CurrentTableProgress = {}): CurrentTable {
  checkSpec(spec);
  const nS = spec.speedPoints;
  const nT = 2 * spec.torquePoints - 1;
  const lim = spec.limits;
  const x = new Float32Array(nS);
  for (let r = 0; r < nS; r++) x[r] = (spec.xMax * r) / (nS - 1);
  const models = corners.map((c) => machineModel(c.model));
  // the row limits first: the torque axis spans the largest of them
  const rows = models.map((m) => Array.from(x, (xr) => rowLimits(m, lim, rowSpeed(xr, spec.bus_V, m.polePairs))));
  let peak = 0;
  for (const rs of rows) for (const r of rs) peak = Math.max(peak, r.tMot, r.tGen);
  if (!(peak > 0)) throw new InputError('motor', 'makes no torque within the limits at any speed of the table: there is no table to make');
  const torque = new Float32Array(nT);
  const half = spec.torquePoints - 1;
  for (let j = 0; j < nT; j++) torque[j] = (peak * (j - half)) / half;
  const sc = newPointLossScratch();
  const rowsTotal = corners.length * nS;
  let rowsDone = 0;
  const out: CurrentTableCorner[] = corners.map((c, k) => {
    const m = models[k]!;
    const id = new Float32Array(nS * nT), iq = new Float32Array(nS * nT);
    const tMot = new Float32Array(nS), tGen = new Float32Array(nS);
    let solvedNodes = 0;
    for (let r = 0; r < nS; r++) {
      const row = rows[k]![r]!;
      const w = rowSpeed(x[r]!, spec.bus_V, m.polePairs);
      tMot[r] = row.tMot;
      tGen[r] = row.tGen;
      const zero = solveOperatingPoint(m, lim, w, 0);
      for (let j = 0; j < nT; j++) {
        const T = torque[j]!;
        const edge = T > 0 ? row.tMot : row.tGen;
        const extreme = T > 0 ? row.mot : row.gen;
        let p: OperatingPoint;
        if (T === 0) p = zero;
        else if (Math.abs(T) >= edge * (1 - 1e-9)) p = extreme.feasible ? extreme : zero;
        else {
          p = solveOperatingPoint(m, lim, w, T);
          if (!p.feasible) p = extreme.feasible ? extreme : zero; // round-off at the edge
          else {
            solvedNodes++;
            if (spec.minLoss !== undefined) p = minLossAtEmTorque(m, lim, spec.minLoss, w, T, p, sc);
          }
        }
        id[r * nT + j] = p.id;
        iq[r * nT + j] = p.iq;
      }
      progress.onRow?.(++rowsDone, rowsTotal);
    }
    return { name: c.name, id, iq, tMot, tGen, solvedNodes };
  });
  return {
    control: spec.minLoss !== undefined ? 'min-loss' : 'least-current',
    bus_V: spec.bus_V, limits: { ...lim }, nS, nT, xMax: x[nS - 1]!, torquePeak: torque[nT - 1]!, x, torque, corners: out,
  };
}
