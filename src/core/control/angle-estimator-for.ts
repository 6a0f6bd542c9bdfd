/**
 * The estimator of an angle source (angle-spec.ts) for a motor of p pole pairs: none for the true
 * angle ("ideal"), an encoder, a resolver with its tracking loop, the sensorless observer. The
 * sensorless observer needs the machine (its model terms) and the open-loop start-up current: by
 * default DEFAULT_STARTUP_CURRENT_FRACTION of the drive's peak current limit Imax (a quarter of it:
 * torque enough for a start against a moderate load, with little excess torque to swing the rotor
 * about the open-loop vector; common practice, no source). The observer's correction crossover is a
 * tenth of the PLL bandwidth but at most MAX_CORRECTION_HZ (sensorlessCorrection_Hz): the speed
 * below which the current model outweighs the voltage model grows with it, and a PLL made fast for
 * a fast speed loop must not push that speed up (common practice, no source).
 */
import { InputError } from '../base/errors';
import type { MachineInput } from '../machine/machine-model';
import type { AngleSpec, SensorlessAngle } from './angle-spec';
import { defaultCorrection_Hz } from './sensorless-active-flux';
import type { SampledAngleEstimator } from './angle-estimator';
import { EncoderEstimator } from './encoder-estimator';
import { ResolverEstimator } from './resolver-estimator';
import { SensorlessEstimator } from './sensorless-estimator';

/** the sensorless start-up current as a fraction of the peak current limit */
export const DEFAULT_STARTUP_CURRENT_FRACTION = 0.25;
/** the largest correction crossover of the sensorless observer, Hz */
export const MAX_CORRECTION_HZ = 30;

/** the sensorless observer's correction crossover, Hz: a tenth of the PLL bandwidth, at most MAX_CORRECTION_HZ */
export function sensorlessCorrection_Hz(spec: SensorlessAngle): number {
  return Math.min(defaultCorrection_Hz(spec.bandwidth_Hz), MAX_CORRECTION_HZ);
}

/** What the sensorless observer needs besides its specification: the machine and the peak current limit, A. */
export interface SensorlessContext {
  machine: MachineInput;
  Imax: number;
  /** the start-up current, A peak (default DEFAULT_STARTUP_CURRENT_FRACTION x Imax) */
  startupCurrent_A?: number;
  /** the start-up's speed ramp, rpm/s (default: the estimator's, the hand-over speed in 0.2 s) */
  startupRamp_rpm_per_s?: number;
}

export function angleEstimatorFor(spec: AngleSpec | undefined, polePairs: number, sensorless?: SensorlessContext): SampledAngleEstimator | null {
  if (spec === undefined || spec.source === 'ideal') return null;
  if (spec.source === 'encoder') return new EncoderEstimator(spec, polePairs);
  if (spec.source === 'resolver') return new ResolverEstimator(spec, polePairs);
  if (spec.source === 'sensorless') {
    if (!sensorless) throw new InputError('control.angle.source', '"sensorless" needs the machine and the current limit to be simulated');
    const I0 = sensorless.startupCurrent_A ?? DEFAULT_STARTUP_CURRENT_FRACTION * sensorless.Imax;
    const ramp = sensorless.startupRamp_rpm_per_s;
    return new SensorlessEstimator(spec, sensorless.machine, { startupCurrent_A: I0, correction_Hz: sensorlessCorrection_Hz(spec), ...(ramp !== undefined && Number.isFinite(ramp) && ramp > 0 ? { startupRamp_rpm_per_s: ramp } : {}) });
  }
  throw new InputError('control.angle.source', `"${(spec as { source: string }).source}" cannot be simulated: use "ideal", "encoder", "resolver" or "sensorless"`);
}
