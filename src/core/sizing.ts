/**
 * Sizing against requirement points (speed, torque): for the given bus the least peak current that
 * meets all points, for the given peak current the least bus, and a verdict per point.
 * The caller runs it for the hot and for the cold machine.
 */
import type { DqMachine, InverterSpec, LimitedBy, Requirement } from './types';
import { InputError } from './errors';
import { busForVoltageLimit, driveLimits } from './inverter';
import { rpmToRadS } from './units';
import { assertMachine, mtpaCurrentForTorque } from './mtpa';
import { maxTorquePoint, directionSign } from './envelope';
import { canHoldTorque, solveOperatingPoint, solveOperatingPointUnlimitedCurrent } from './operating-point';

export interface SizingPoint {
  label: string;
  speed_rpm: number;
  torque_Nm: number;
  /** the point is reachable within Imax and the bus's voltage limit */
  met: boolean;
  /** largest torque in the point's direction at its speed within both limits, N·m (signed) */
  torqueAvailable_Nm: number;
  /** least current for the point (or what it would need), A peak */
  current_A: number;
  /** voltage at that current, V peak phase */
  voltage_V: number;
  /** Imax - current, A peak (negative: short) */
  currentHeadroom_A: number;
  /** Vmax - voltage, V peak phase (negative: short) */
  voltageHeadroom_V: number;
  limitedBy: LimitedBy;
}

export interface SizingResult {
  /** least peak current meeting every point at the given bus, A peak; null if a point cannot be met at any current (beyond MTPV, or torque forced by the voltage limit) */
  minImax: number | null;
  /** least DC bus meeting every point with the given Imax, V; null if a point needs more than Imax at any bus */
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
export function leastVoltageLimit(m: DqMachine, Imax: number, speed_rad_s: number, torque_Nm: number): number | null {
  const mt = mtpaCurrentForTorque(m, torque_Nm);
  if (mt.current > Imax) return null;
  const we = m.polePairs * speed_rad_s;
  const vd = m.Rs * mt.id - we * m.Lq * mt.iq;
  const vq = m.Rs * mt.iq + we * (m.Ld * mt.id + m.psiM);
  let hi = Math.hypot(vd, vq);
  if (!(hi > 0)) return 0;
  let lo = 0;
  for (let it = 0; it < 200 && hi - lo > 1e-12 * hi; it++) {
    const mid = 0.5 * (lo + hi);
    if (!(mid > 0)) break;
    if (canHoldTorque(m, { Vmax: mid, Imax }, speed_rad_s, torque_Nm)) hi = mid;
    else lo = mid;
  }
  return hi;
}

/** Verdict per requirement, least Imax for the bus, least bus for Imax. */
export function sizeDrive(m: DqMachine, inverter: InverterSpec, requirements: Requirement[]): SizingResult {
  assertMachine(m);
  assertRequirements(requirements);
  const lim = driveLimits(inverter, 'peak');
  if (!(lim.Vmax > 0)) throw new InputError('inverter.Vdc', 'must leave a voltage limit > 0 V after the device drop');
  if (!(Number.isFinite(lim.Imax) && lim.Imax > 0)) throw new InputError('inverter.Imax', 'must be > 0 A');
  let minImax: number | null = 0;
  let minVmax: number | null = 0;
  const points: SizingPoint[] = requirements.map((r) => {
    const w = rpmToRadS(r.speed_rpm);
    const T = r.torque_Nm;
    const op = solveOperatingPoint(m, lim, w, T);
    const dir = T === 0 || directionSign(w, 'motoring') === Math.sign(T) ? 'motoring' : 'generating';
    const avail = maxTorquePoint(m, lim, w, dir);
    const u = solveOperatingPointUnlimitedCurrent(m, lim.Vmax, w, T);
    if (!u.feasible) minImax = null;
    else if (minImax !== null) minImax = Math.max(minImax, u.current);
    const v = leastVoltageLimit(m, lim.Imax, w, T);
    if (v === null) minVmax = null;
    else if (minVmax !== null) minVmax = Math.max(minVmax, v);
    return {
      label: r.label,
      speed_rpm: r.speed_rpm,
      torque_Nm: T,
      met: op.feasible,
      torqueAvailable_Nm: avail.torque,
      current_A: op.current,
      voltage_V: op.voltage,
      currentHeadroom_A: lim.Imax - op.current,
      voltageHeadroom_V: lim.Vmax - op.voltage,
      limitedBy: op.limitedBy,
    };
  });
  const mv = minVmax as number | null;
  return { minImax, minVdc: mv === null ? null : busForVoltageLimit(mv, inverter), points };
}
