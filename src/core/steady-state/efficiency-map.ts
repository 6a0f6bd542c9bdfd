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
 */
import type { DriveLimits } from '../drive/inverter-spec';
import type { MachineInput } from '../machine/machine-model';
import { machineModel } from '../machine/linear-dq';
import { ironLoss, mechanicalLoss } from '../machine/motor-losses';
import { maxTorqueCore, newScratch } from './max-torque';
import { assertFinite } from './mtpa';
import { assertLossConditions, lossFixedPoint } from './loss-point';
import { efficiencies, type LossConditions, newPointLossScratch, PL, pointLosses } from './point-losses';

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


/** The efficiency map over speeds x shaft torques with least-current control. */
export function efficiencyMap(input: MachineInput, lim: DriveLimits, c: LossConditions, speeds: Float64Array, torques: Float64Array): EfficiencyMap {
  assertLossConditions(c);
  speeds.forEach((s, i) => assertFinite(`speeds[${i}]`, s, 'rad/s'));
  torques.forEach((t, j) => assertFinite(`torques[${j}]`, t, 'N·m'));
  const m = machineModel(input);
  const N = speeds.length * torques.length;
  const r: EfficiencyMap = {
    speeds, torques, feasible: new Uint8Array(N),
    motor: new Float64Array(N).fill(Number.NaN), inverter: new Float64Array(N).fill(Number.NaN), system: new Float64Array(N).fill(Number.NaN),
    copper: new Float64Array(N).fill(Number.NaN), iron: new Float64Array(N).fill(Number.NaN), mechanical: new Float64Array(N).fill(Number.NaN),
    inverterLoss: new Float64Array(N).fill(Number.NaN), dcPower: new Float64Array(N).fill(Number.NaN), torqueEm: new Float64Array(N).fill(Number.NaN),
  };
  const sc = newPointLossScratch();
  const pr = sc.r;
  const mt = newScratch();
  const eff = new Float64Array(3);
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
      const guess = !Number.isNaN(T0) && T1 !== T0 ? lt1 + ((lt1 - lt0) * (Ts - T1)) / (T1 - T0) : lt1;
      const p = lossFixedPoint(m, lim, c, w, Ts, pMech, sc, Ts + guess, MAP_TOL).point;
      if (!p.feasible) continue;
      pointLosses(m, c, w, p.id, p.iq, sc);
      const pac = pr[PL.acPower]!, inv = pr[PL.inverter]!, pdc = pac + inv, ps = Ts * w;
      r.feasible[k] = 1;
      r.copper[k] = pr[PL.copper]!; r.iron[k] = pr[PL.iron]!; r.mechanical[k] = pMech; r.inverterLoss[k] = inv;
      r.dcPower[k] = pdc; r.torqueEm[k] = p.torque;
      if (w !== 0) { lt0 = lt1; T0 = T1; lt1 = (pr[PL.iron]! + pMech) / w; T1 = Ts; }
      efficiencies(ps, pac, pdc, eff);
      r.motor[k] = eff[0]!; r.inverter[k] = eff[1]!; r.system[k] = eff[2]!;
    }
  }
  return r;
}

/** n evenly spaced values from a to b inclusive (n >= 2), e.g. a map's axis. */
export function mapAxis(a: number, b: number, n: number): Float64Array {
  const out = new Float64Array(n);
  for (let k = 0; k < n; k++) out[k] = a + ((b - a) * k) / (n - 1);
  return out;
}
