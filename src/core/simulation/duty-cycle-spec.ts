/**
 * A duty cycle: samples of time, speed and shaft torque, linear in between (the project's `dutyCycle`),
 * its checks, the instants it is evaluated at, and its RMS torque.
 *
 * The evaluation instants are the samples' own, or every `step_s` from the first sample to the last
 * (the last sample always included), speed and torque interpolated linearly. The RMS torque is the
 * exact integral of the piecewise-linear profile of the samples themselves (independent of the
 * evaluation step): over a segment from a to b, the integral of T^2 is dt (a^2 + a b + b^2) / 3.
 */
import { InputError } from '../base/errors';

export interface DutyCycleSpec {
  label: string;
  /** sample instants, s, strictly increasing */
  t_s: Float64Array;
  /** mechanical speed at each sample, rpm */
  speed_rpm: Float64Array;
  /** shaft torque at each sample, N·m (negative: braking) */
  torque_Nm: Float64Array;
}

/** The instants a cycle is evaluated at (one array each, same length). */
export interface CycleInstants {
  t_s: Float64Array;
  speed_rpm: Float64Array;
  torque_Nm: Float64Array;
}

/** Most evaluation instants of one cycle (a 30-minute cycle at 1 ms). */
export const MAX_INSTANTS = 2_000_000;

/** Check a cycle: at least two samples, equal lengths, finite values, strictly increasing times. */
export function assertDutyCycle(s: DutyCycleSpec): void {
  const n = s.t_s.length;
  if (n < 2) throw new InputError('dutyCycle.t_s', `must hold at least two samples (got ${n})`);
  if (s.speed_rpm.length !== n) throw new InputError('dutyCycle.speed_rpm', `must hold one value per sample of t_s (${n}, got ${s.speed_rpm.length})`);
  if (s.torque_Nm.length !== n) throw new InputError('dutyCycle.torque_Nm', `must hold one value per sample of t_s (${n}, got ${s.torque_Nm.length})`);
  for (let k = 0; k < n; k++) {
    if (!Number.isFinite(s.t_s[k]!)) throw new InputError(`dutyCycle.t_s[${k}]`, 'must be a finite number of seconds');
    if (!Number.isFinite(s.speed_rpm[k]!)) throw new InputError(`dutyCycle.speed_rpm[${k}]`, 'must be a finite number (rpm)');
    if (!Number.isFinite(s.torque_Nm[k]!)) throw new InputError(`dutyCycle.torque_Nm[${k}]`, 'must be a finite number (N·m)');
    if (k > 0 && !(s.t_s[k]! > s.t_s[k - 1]!)) throw new InputError(`dutyCycle.t_s[${k}]`, `must be later than the sample before (${s.t_s[k - 1]} s, got ${s.t_s[k]} s)`);
  }
}

/** The evaluation instants: the samples' own (step_s absent) or every step_s, linear in between. */
export function cycleInstants(s: DutyCycleSpec, step_s?: number): CycleInstants {
  assertDutyCycle(s);
  if (step_s === undefined) {
    if (s.t_s.length > MAX_INSTANTS) throw new InputError('dutyCycle.t_s', `must hold at most ${MAX_INSTANTS} samples (got ${s.t_s.length})`);
    return { t_s: s.t_s.slice(), speed_rpm: s.speed_rpm.slice(), torque_Nm: s.torque_Nm.slice() };
  }
  const n = s.t_s.length, t0 = s.t_s[0]!, t1 = s.t_s[n - 1]!;
  if (!(Number.isFinite(step_s) && step_s > 0)) throw new InputError('step', `must be a positive number of seconds (got ${step_s})`);
  const steps = Math.ceil((t1 - t0) / step_s - 1e-9);
  if (!(steps + 1 <= MAX_INSTANTS)) throw new InputError('step', `gives ${steps + 1} instants over ${t1 - t0} s: at most ${MAX_INSTANTS} allowed`);
  const N = steps + 1;
  const out: CycleInstants = { t_s: new Float64Array(N), speed_rpm: new Float64Array(N), torque_Nm: new Float64Array(N) };
  let j = 0;
  for (let k = 0; k < N; k++) {
    const t = k === N - 1 ? t1 : t0 + k * step_s;
    while (j < n - 2 && s.t_s[j + 1]! <= t) j++;
    const f = (t - s.t_s[j]!) / (s.t_s[j + 1]! - s.t_s[j]!);
    out.t_s[k] = t;
    out.speed_rpm[k] = s.speed_rpm[j]! + f * (s.speed_rpm[j + 1]! - s.speed_rpm[j]!);
    out.torque_Nm[k] = s.torque_Nm[j]! + f * (s.torque_Nm[j + 1]! - s.torque_Nm[j]!);
  }
  return out;
}

/** RMS of the piecewise-linear torque profile over the cycle, N·m (exact). */
export function rmsTorque(s: DutyCycleSpec): number {
  let sum = 0;
  const n = s.t_s.length;
  for (let k = 1; k < n; k++) {
    const a = s.torque_Nm[k - 1]!, b = s.torque_Nm[k]!;
    sum += (s.t_s[k]! - s.t_s[k - 1]!) * (a * a + a * b + b * b) / 3;
  }
  return Math.sqrt(sum / (s.t_s[n - 1]! - s.t_s[0]!));
}
