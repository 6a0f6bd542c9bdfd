/**
 * The drive is limited by the weaker of motor and inverter: the effective peak current is
 * min(inverter Imax, motor peak current) and the effective continuous current
 * min(inverter Icont, motor rated current), never above the effective peak. Each says which binds.
 */
import type { CurrentLimits, EffectiveCurrent } from './current-limit-types';
import type { InverterSpec } from './inverter-spec';

function weaker(inverter_A: number, motor_A: number | undefined): EffectiveCurrent {
  if (motor_A !== undefined && motor_A < inverter_A) return { A: motor_A, binds: 'motor', inverter_A, motor_A };
  return motor_A === undefined ? { A: inverter_A, binds: 'inverter', inverter_A } : { A: inverter_A, binds: 'inverter', inverter_A, motor_A };
}

/**
 * @param motorRated_A the motor's rated (continuous) current, A peak, if known
 * @param motorPeak_A the motor's peak current, A peak, if known
 */
export function effectiveCurrentLimits(inv: Pick<InverterSpec, 'Imax' | 'Icont'>, motorRated_A?: number, motorPeak_A?: number): CurrentLimits {
  const peak = weaker(inv.Imax, motorPeak_A);
  let continuous = weaker(inv.Icont, motorRated_A);
  // a continuous limit above the effective peak (a motor peak below the inverter's Icont) is capped there
  if (continuous.A > peak.A) continuous = { ...continuous, A: peak.A, binds: peak.binds };
  return { peak, continuous };
}

const sig4 = (x: number): string => (Number.isFinite(x) ? String(Number(x.toPrecision(4))) : String(x));

/** The rating that sets a limit, by its field: e.g. "inverter.Imax" or "motor.peakCurrent". */
export function limitField(kind: 'peak' | 'continuous', e: EffectiveCurrent, section: 'motor' | 'nameplate' = 'motor'): string {
  if (e.binds === 'inverter') return kind === 'peak' ? 'inverter.Imax' : 'inverter.Icont';
  return kind === 'peak' ? `${section}.peakCurrent` : `${section}.ratedCurrent`;
}

/**
 * One limit in words, both as peak and rms, and which rating binds, e.g.
 * "peak 449.7 A peak (318 A rms): motor" (the motor's peak current is below the inverter's Imax).
 */
export function describeLimit(kind: 'peak' | 'continuous', e: EffectiveCurrent): string {
  return `${kind} ${sig4(e.A)} A peak (${sig4(e.A / Math.SQRT2)} A rms): ${e.binds}`;
}

/** Both limits in one line, e.g. "current limits: peak 15 A peak (10.61 A rms): inverter; continuous ...". */
export function describeLimits(l: CurrentLimits): string {
  return `current limits: ${describeLimit('peak', l.peak)}; ${describeLimit('continuous', l.continuous)}`;
}
