/**
 * The drive is limited by the weaker of motor and inverter: the effective peak current is
 * min(inverter Imax, motor peak current) and the effective continuous current
 * min(inverter Icont, motor rated current), never above the effective peak. Each says which binds.
 */
import type { CurrentLimits, EffectiveCurrent, InverterSpec } from './types';

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

