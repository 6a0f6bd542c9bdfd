/**
 * The efficiency map: the operating point with losses (loss-point.ts, least-current control) at every
 * (speed, shaft torque) of a grid, motoring and generating. Points outside the envelope (no current
 * within both limits holds the torque) have feasible 0 and NaN in every other array. Results are typed
 * arrays indexed k = i * torques.length + j (speed i, torque j); the run owns its scratch.
 *
 * Along each speed the fixed point starts from the loss torque extrapolated from the last two points
 * and stops at 1e-10 relative (inside the 1e-9 asked). A point is skipped as outside without solving
 * when no T_em the losses allow can be held: at a feasible point |we| psi <= |v| + Rs |i| <= Vmax +
 * Rs Imax, so the loss torque lies in [P_mech, P_mech + P_fe(f, (Vmax + Rs Imax)/|we|)] / w, and the
 * reachable T_em at w is the interval [Tmin, Tmax] of two max-torque solves (max-torque.ts).
 *
 * With `control: 'min-loss'` every point inside is the loss-minimising current of loss-point.ts
 * (solveLossPoint with minLoss: its fixed point from T_em = T_shaft to 1e-12, then min-loss-current.ts),
 * the same numbers point by point. With no iron and no inverter loss the electrical loss is the copper
 * loss alone, least at the least current (the definition of the rule), so the start point is kept
 * rather than searched (the search's voltage slack would otherwise buy a copper loss 1e-10 lower).
 * `leastCurrent` (min-loss only) receives each point's least-current start: the two maps then differ
 * only where the search found less loss, and never by more loss.
 */
import type { DriveLimits } from '../drive/inverter-spec';
import type { MachineInput, MachineModel } from '../machine/machine-model';
import { machineModel } from '../machine/linear-dq';
import { ironLoss, mechanicalLoss } from '../machine/motor-losses';
import { maxTorqueCore, newScratch } from './max-torque';
import { assertFinite } from './mtpa';
import { assertLossConditions, lossFixedPoint } from './loss-point';
import { minLossCurrent } from './min-loss-current';
import type { OperatingPoint } from './operating-point-types';
import { efficiencies, type LossConditions, newPointLossScratch, PL, type PointLossScratch, pointLosses } from './point-losses';

export interface EfficiencyMap {
  /** mechanical speeds, rad/s */
  speeds: Float64Array;
  /** shaft torques, N·m */
  torques: Float64Array;
  /** 1 inside the envelope, else 0 */
  feasible: Uint8Array;
  /** efficiencies (fractions, output over input; generating electrical out over mechanical in) */
  motor: Float64Array;
  inverter: Float64Array;
  system: Float64Array;
  /** losses, W */
  copper: Float64Array;
  iron: Float64Array;
  mechanical: Float64Array;
  inverterLoss: Float64Array;
  /** DC-link power, W (positive drawn) */
  dcPower: Float64Array;
  /** electromagnetic torque, N·m */
  torqueEm: Float64Array;
}

const MAP_TOL = 1e-10;

/** The rule that chooses the current at each point of a map. */
export type MapControl = 'least-current' | 'min-loss';

export interface EfficiencyMapOptions {
  /** default 'least-current' */
  control?: MapControl;
  /**
   * min-loss only: a map over the same axes (e.g. emptyEfficiencyMap) that receives, at every point
   * inside, the least-current point the search started from
   */
  leastCurrent?: EfficiencyMap;
}

/** A map over speeds x torques with no point solved (feasible 0, NaN elsewhere). */
export function newEfficiencyMap(speeds: Float64Array, torques: Float64Array): EfficiencyMap {
  const N = speeds.length * torques.length;
  const nan = () => new Float64Array(N).fill(Number.NaN);
  return {
    speeds, torques, feasible: new Uint8Array(N),
    motor: nan(), inverter: nan(), system: nan(), copper: nan(), iron: nan(), mechanical: nan(), inverterLoss: nan(), dcPower: nan(), torqueEm: nan(),
  };
}

/** True when the loss data hold no iron and no inverter loss (absent, or every coefficient zero). */
export function copperLossOnly(c: LossConditions): boolean {
  const fe = c.losses.iron, inv = c.losses.inverter;
  const noIron = fe === undefined || (fe.kh === 0 && fe.ke === 0);
  const noInv = inv === undefined || (inv.Vce0 === 0 && inv.rce === 0 && inv.Vf0 === 0 && inv.rd === 0 && inv.EonEoff_J === 0 && inv.Err_J === 0);
  return noIron && noInv;
}

/** Point k of map r from the losses in sc (pointLosses at the point's current), shaft torque Ts at w. */
function store(r: EfficiencyMap, k: number, sc: PointLossScratch, w: number, Ts: number, pMech: number, torqueEm: number, eff: Float64Array): void {
  const pr = sc.r;
  const pac = pr[PL.acPower]!, inv = pr[PL.inverter]!, pdc = pac + inv;
  r.feasible[k] = 1;
  r.copper[k] = pr[PL.copper]!; r.iron[k] = pr[PL.iron]!; r.mechanical[k] = pMech; r.inverterLoss[k] = inv;
  r.dcPower[k] = pdc; r.torqueEm[k] = torqueEm;
  efficiencies(Ts * w, pac, pdc, eff);
  r.motor[k] = eff[0]!; r.inverter[k] = eff[1]!; r.system[k] = eff[2]!;
}

/**
 * The efficiency map over speeds x shaft torques, least-current control unless `opts.control` is
 * 'min-loss' (the loss-minimising current).
 */
export function efficiencyMap(input: MachineInput, lim: DriveLimits, c: LossConditions, speeds: Float64Array, torques: Float64Array, opts: EfficiencyMapOptions = {}): EfficiencyMap {
  assertLossConditions(c);
  speeds.forEach((s, i) => assertFinite(`speeds[${i}]`, s, 'rad/s'));
  torques.forEach((t, j) => assertFinite(`torques[${j}]`, t, 'N·m'));
  const minLoss = opts.control === 'min-loss';
  const lc = opts.leastCurrent;
  if (lc !== undefined && (!minLoss || lc.feasible.length !== speeds.length * torques.length)) throw new Error('efficiencyMap: leastCurrent is a map over the same axes, with min-loss control only');
  const m = machineModel(input);
  const r = newEfficiencyMap(speeds, torques);
  const sc = newPointLossScratch();
  const pr = sc.r;
  const mt = newScratch();
  const eff = new Float64Array(3);
  const copperOnly = copperLossOnly(c);
  for (let i = 0; i < speeds.length; i++) {
    const w = speeds[i]!;
    const we = m.polePairs * w;
    const pMech = mechanicalLoss(c.friction, c.losses.windage, w);
    // the reachable electromagnetic torques at w, and the loss torque's bounds
    maxTorqueCore(m, lim.Vmax, lim.Imax, we, 1, mt, -Infinity);
    const Tmax = mt.ok ? mt.J : Number.NaN;
    maxTorqueCore(m, lim.Vmax, lim.Imax, we, -1, mt, -Infinity);
    const Tmin = mt.ok ? -mt.J : Number.NaN;
    const slack = 1e-6 * Math.max(Math.abs(Tmax), Math.abs(Tmin));
    let ltLo = 0, ltHi = 0;
    if (w !== 0) {
      const feMax = ironLoss(c.losses.iron, we / (2 * Math.PI), (lim.Vmax + m.Rs * lim.Imax) / Math.abs(we));
      const a = pMech / w, b = (pMech + feMax) / w;
      ltLo = Math.min(a, b); ltHi = Math.max(a, b);
    }
    // the loss torque of the last two points inside, extrapolated: the next point's first guess
    let lt1 = w === 0 ? 0 : pMech / w, T1 = Number.NaN, lt0 = Number.NaN, T0 = Number.NaN;
    for (let j = 0; j < torques.length; j++) {
      const Ts = torques[j]!;
      const k = i * torques.length + j;
      if (!(Ts + ltHi >= Tmin - slack && Ts + ltLo <= Tmax + slack)) continue; // outside for any loss torque (NaN: no point at all)
      if (minLoss) {
        minLossPoint(m, lim, c, w, Ts, pMech, sc, k, r, lc, copperOnly, eff);
        continue;
      }
      const guess = !Number.isNaN(T0) && T1 !== T0 ? lt1 + ((lt1 - lt0) * (Ts - T1)) / (T1 - T0) : lt1;
      const p = lossFixedPoint(m, lim, c, w, Ts, pMech, sc, Ts + guess, MAP_TOL).point;
      if (!p.feasible) continue;
      pointLosses(m, c, w, p.id, p.iq, sc);
      store(r, k, sc, w, Ts, pMech, p.torque, eff);
      if (w !== 0) { lt0 = lt1; T0 = T1; lt1 = (pr[PL.iron]! + pMech) / w; T1 = Ts; }
    }
  }
  return r;
}

/** Point k of the min-loss map r (and of lc, the least-current start), as solveLossPoint with minLoss solves it. */
function minLossPoint(m: MachineModel, lim: DriveLimits, c: LossConditions, w: number, Ts: number, pMech: number, sc: PointLossScratch, k: number, r: EfficiencyMap, lc: EfficiencyMap | undefined, copperOnly: boolean, eff: Float64Array): void {
  const p0 = lossFixedPoint(m, lim, c, w, Ts, pMech, sc).point;
  if (!p0.feasible) return;
  const p: OperatingPoint = copperOnly ? p0 : minLossCurrent(m, lim, c, w, Ts, pMech, p0, sc);
  if (lc !== undefined) {
    pointLosses(m, c, w, p0.id, p0.iq, sc);
    store(lc, k, sc, w, Ts, pMech, m.torque(p0.id, p0.iq), eff);
  }
  pointLosses(m, c, w, p.id, p.iq, sc);
  store(r, k, sc, w, Ts, pMech, m.torque(p.id, p.iq), eff);
}

/** n evenly spaced values from a to b inclusive (n >= 2), e.g. a map's axis. */
export function mapAxis(a: number, b: number, n: number): Float64Array {
  const out = new Float64Array(n);
  for (let k = 0; k < n; k++) out[k] = a + ((b - a) * k) / (n - 1);
  return out;
}
