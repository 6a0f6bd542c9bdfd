/**
 * Sizing against requirement points (speed, torque): for the given bus the least peak current that
 * meets all points, for the given peak current the least bus, and a verdict per point.
 * A point of duty "continuous" is checked against the continuous current limit, every other point
 * against the peak limit (both the weaker of motor and inverter, see current-limits.ts).
 * The caller runs it for the hot and for the cold machine.
 */
import type { CurrentLimits, Duty, LimitSource } from '../drive/current-limit-types';
import type { MachineInput } from '../machine/machine-model';
import type { InverterSpec } from '../drive/inverter-spec';
import type { LimitedBy, Requirement } from './operating-point-types';
import { effectiveCurrentLimits } from '../drive/current-limits';
import { InputError } from '../base/errors';
import { busForVoltageLimit, driveLimits } from '../drive/inverter';
import { rpmToRadS } from '../base/units';
import { assertMachine, mtpaCurrentForTorque } from './mtpa';
import { maxTorquePoint, directionSign } from './envelope';
import { canHoldTorque, solveOperatingPoint, solveOperatingPointUnlimitedCurrent } from './operating-point';
import { machineModel } from '../machine/linear-dq';
import { newScratch } from './max-torque';

export interface SizingPoint {
  label: string;
  speed_rpm: number;
  torque_Nm: number;
  /** the current limit the point is checked against: 'peak' (default) or 'continuous' */
  duty: Duty;
  /** the effective current limit of that duty, A peak */
  currentLimit_A: number;
  /** which rating sets that limit */
  currentLimitBinds: LimitSource;
  /** the point is reachable within the current limit of its duty and the bus's voltage limit */
  met: boolean;
  /** largest torque in the point's direction at its speed within both limits, N·m (signed) */
  torqueAvailable_Nm: number;
  /** least current for the point (or what it would need), A peak */
  current_A: number;
  /** voltage at that current, V peak phase */
  voltage_V: number;
  /** met: the current limit of its duty minus the current at the least-current point, A peak; null when not met */
  currentHeadroom_A: number | null;
  /** met: Vmax minus the voltage at that same point, V peak phase (0 in field weakening, by design); null when not met */
  voltageHeadroom_V: number | null;
  /** not met: the torque missing, |asked| - |available|, N·m (>= 0); null when met */
  torqueShortfall_Nm: number | null;
  /** the headroom or the shortfall in words, e.g. "field weakening, current headroom 2.1 A peak" */
  headroomNote: string;
  limitedBy: LimitedBy;
}

export interface SizingResult {
  /** least peak current meeting every point at the given bus, A peak; null if a point cannot be met at any current (beyond MTPV, or torque forced by the voltage limit) */
  minImax: number | null;
  /** least continuous current meeting every continuous-duty point at the given bus, A peak; null as minImax; absent without such points */
  minIcont?: number | null;
  /** least DC bus meeting every point within the current limit of its duty, V; null if a point needs more than that limit at any bus */
  minVdc: number | null;
  points: SizingPoint[];
}

function assertRequirements(reqs: Requirement[]): void {
  if (!Array.isArray(reqs)) throw new InputError('requirements', 'must be a list');
  reqs.forEach((r, i) => {
    if (!Number.isFinite(r.speed_rpm)) throw new InputError(`requirements[${i}].speed_rpm`, 'must be a finite number (rpm)');
    if (!Number.isFinite(r.torque_Nm)) throw new InputError(`requirements[${i}].torque_Nm`, 'must be a finite number (N·m)');
  });
}

/**
 * Least voltage limit (V peak) that meets (speed, torque) with peak current Imax: bisection on Vmax
 * between 0 and the voltage of the MTPA point (which meets it), 200 steps at most, to 1e-12 relative.
 * Null when even MTPA needs more than Imax.
 */
export function leastVoltageLimit(input: MachineInput, Imax: number, speed_rad_s: number, torque_Nm: number): number | null {
  const m = machineModel(input);
  const mt = mtpaCurrentForTorque(m, torque_Nm);
  if (mt.current > Imax) return null;
  const v = new Float64Array(2);
  m.steadyVoltage(mt.id, mt.iq, m.polePairs * speed_rad_s, v);
  let hi = Math.hypot(v[0]!, v[1]!);
  const sc = newScratch();
  if (!(hi > 0)) return 0;
  let lo = 0;
  for (let it = 0; it < 200 && hi - lo > 1e-12 * hi; it++) {
    const mid = 0.5 * (lo + hi);
    if (!(mid > 0)) break;
    if (canHoldTorque(m, { Vmax: mid, Imax }, speed_rad_s, torque_Nm, sc)) hi = mid;
    else lo = mid;
  }
  return hi;
}

/** Short number for a note: 4 significant digits, no exponent for ordinary sizes. */
const short = (x: number): string => (Math.abs(x) >= 1e-3 && Math.abs(x) < 1e6 ? String(Number(x.toPrecision(4))) : x.toPrecision(4));

/** What stops a point that is not met, in words, with the limit's figure. */
function bindingWords(by: LimitedBy, duty: Duty, I: number, binds: LimitSource, Vmax: number): string {
  const cur = `the ${duty} current limit ${short(I)} A peak (${binds === 'motor' ? (duty === 'peak' ? "motor's peak current" : "motor's rated current") : duty === 'peak' ? "inverter's Imax" : "inverter's Icont"})`;
  const volt = `the voltage limit ${short(Vmax)} V peak phase`;
  switch (by) {
    case 'current': return cur;
    case 'current-and-voltage': return `${cur} with ${volt} (field weakening)`;
    case 'voltage': return volt;
    case 'beyond-mtpv': return `${volt}: beyond the maximum-torque-per-volt limit, no current reaches it`;
    default: return cur;
  }
}

/** What sizeDrive computes besides the verdicts: `bounds` false skips the least Imax and least bus (both then null), for a study that needs only the verdicts and headrooms. */
export interface SizingOptions {
  bounds?: boolean;
}

/**
 * Verdict per requirement, least Imax for the bus, least bus for Imax. `limits` are the effective
 * current limits (the weaker of motor and inverter); without them, the inverter's Imax and Icont.
 */
export function sizeDrive(input: MachineInput, inverter: InverterSpec, requirements: Requirement[], limits?: CurrentLimits, opts: SizingOptions = {}): SizingResult {
  const bounds = opts.bounds !== false;
  assertMachine(input);
  const m = machineModel(input);
  assertRequirements(requirements);
  const lim = driveLimits(inverter, 'peak');
  const cl = limits ?? effectiveCurrentLimits(inverter);
  if (!(lim.Vmax > 0)) throw new InputError('inverter.Vdc', 'must leave a voltage limit > 0 V after the device drop');
  if (!(Number.isFinite(cl.peak.A) && cl.peak.A > 0)) throw new InputError('inverter.Imax', 'must be > 0 A');
  if (!(Number.isFinite(cl.continuous.A) && cl.continuous.A > 0)) throw new InputError('inverter.Icont', 'must be > 0 A');
  let minImax: number | null = 0;
  let minIcont: number | null = 0;
  let anyContinuous = false;
  let minVmax: number | null = 0;
  const points: SizingPoint[] = requirements.map((r) => {
    const duty: Duty = r.duty === 'continuous' ? 'continuous' : 'peak';
    const eff = duty === 'continuous' ? cl.continuous : cl.peak;
    const L = { Vmax: lim.Vmax, Imax: eff.A };
    const w = rpmToRadS(r.speed_rpm);
    const T = r.torque_Nm;
    const op = solveOperatingPoint(m, L, w, T);
    const dir = T === 0 || directionSign(w, 'motoring') === Math.sign(T) ? 'motoring' : 'generating';
    const avail = maxTorquePoint(m, L, w, dir);
    if (duty === 'continuous') anyContinuous = true;
    if (bounds) {
      const u = solveOperatingPointUnlimitedCurrent(m, lim.Vmax, w, T);
      if (!u.feasible) minImax = null;
      else if (minImax !== null) minImax = Math.max(minImax, u.current);
      if (duty === 'continuous') {
        if (!u.feasible) minIcont = null;
        else if (minIcont !== null) minIcont = Math.max(minIcont, u.current);
      }
      const v = leastVoltageLimit(m, eff.A, w, T);
      if (v === null) minVmax = null;
      else if (minVmax !== null) minVmax = Math.max(minVmax, v);
    } else {
      minImax = minIcont = minVmax = null;
    }
    let currentHeadroom_A: number | null = null;
    let voltageHeadroom_V: number | null = null;
    let torqueShortfall_Nm: number | null = null;
    let headroomNote: string;
    if (op.feasible) {
      currentHeadroom_A = eff.A - op.current;
      // the least-current point in field weakening sits on the voltage limit: no voltage headroom by design
      const fw = op.region !== 'mtpa';
      voltageHeadroom_V = fw ? 0 : lim.Vmax - op.voltage;
      const ch = `current headroom ${short(Math.max(0, currentHeadroom_A))} A peak (${duty} limit)`;
      headroomNote = fw ? `field weakening, ${ch}` : `${ch}, voltage headroom ${short(voltageHeadroom_V)} V peak phase`;
    } else {
      torqueShortfall_Nm = Math.max(0, Math.abs(T) - Math.abs(avail.torque));
      headroomNote = `short by ${short(torqueShortfall_Nm)} N·m: ${short(Math.abs(avail.torque))} N·m available, limited by ${bindingWords(op.limitedBy, duty, eff.A, eff.binds, lim.Vmax)}`;
    }
    return {
      label: r.label,
      speed_rpm: r.speed_rpm,
      torque_Nm: T,
      duty,
      currentLimit_A: eff.A,
      currentLimitBinds: eff.binds,
      met: op.feasible,
      torqueAvailable_Nm: avail.torque,
      current_A: op.current,
      voltage_V: op.voltage,
      currentHeadroom_A,
      voltageHeadroom_V,
      torqueShortfall_Nm,
      headroomNote,
      limitedBy: op.limitedBy,
    };
  });
  const mv = minVmax as number | null;
  return { minImax, ...(anyContinuous ? { minIcont } : {}), minVdc: mv === null ? null : busForVoltageLimit(mv, inverter), points };
}
