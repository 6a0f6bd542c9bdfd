/**
 * Where the sensorless observer is not valid, as a finding: below a stated fraction of the rated
 * back-EMF (the voltage model integrates v - Rs i, and at low speed the back-EMF drowns in the
 * resistive drop, the inverter's voltage errors and the resistance error), and below the speed at
 * which the current model outweighs the voltage model in the flux estimate (|W(we)| > 1/2, W the
 * correction's weight, see sensorless-active-flux.ts: there the angle comes mostly from the rotor
 * parameters and the estimate itself). The start-up must hand over above both. Common practice
 * (no source) for the fraction (default 5 % of the rated back-EMF).
 */
import type { Finding } from '../base/finding';
import type { MachineInput } from '../machine/machine-model';
import { RAD_S_TO_RPM } from '../base/units';
import type { SensorlessAngle } from './angle-spec';
import { correctionGains, defaultCorrection_Hz } from './sensorless-active-flux';

export const DEFAULT_BACK_EMF_FRACTION = 0.05;

export interface SensorlessValidity {
  /** the speed below which the observer is not valid, rpm (the larger of the two below) */
  minSpeed_rpm: number;
  /** the speed at which the back-EMF is `backEmfFraction` of the rated back-EMF, rpm */
  backEmfSpeed_rpm: number;
  backEmfFraction: number;
  /** the speed below which the current model outweighs the voltage model (|W| > 1/2), rpm */
  correctionSpeed_rpm: number;
  handoverSpeed_rpm: number;
  finding: Finding;
}

/** |W(j we)| of the continuous correction loop, W = K / (j we + K), K = kp + ki / (j we). */
function weightMagnitude(kp: number, ki: number, we: number): number {
  const Ki = -ki / we;
  return Math.hypot(kp, Ki) / Math.hypot(kp, Ki + we);
}

/** The electrical speed where |W| = 1/2 (|W| falls from 1 at standstill to 0), by bisection on log(we). */
function halfWeightSpeed(kp: number, ki: number): number {
  let lo = 1e-6 * kp, hi = 1e6 * kp;
  for (let i = 0; i < 200; i++) {
    const mid = Math.sqrt(lo * hi);
    if (weightMagnitude(kp, ki, mid) > 0.5) lo = mid; else hi = mid;
  }
  return Math.sqrt(lo * hi);
}

export function sensorlessValidity(
  spec: SensorlessAngle,
  machine: MachineInput,
  ratedSpeed_rpm: number,
  opts: { correction_Hz?: number; backEmfFraction?: number } = {},
): SensorlessValidity {
  const fraction = opts.backEmfFraction ?? DEFAULT_BACK_EMF_FRACTION;
  const { kp, ki } = correctionGains(opts.correction_Hz ?? defaultCorrection_Hz(spec.bandwidth_Hz));
  // back-EMF we psiM is proportional to speed: the fraction of the rated back-EMF is reached at the fraction of rated speed
  const backEmfSpeed_rpm = fraction * ratedSpeed_rpm;
  const correctionSpeed_rpm = (halfWeightSpeed(kp, ki) / machine.polePairs) * RAD_S_TO_RPM;
  const minSpeed_rpm = Math.max(backEmfSpeed_rpm, correctionSpeed_rpm);
  const h = spec.handoverSpeed_rpm;
  const ok = h >= minSpeed_rpm;
  const r = (x: number): string => x.toFixed(0);
  const message =
    `the sensorless observer is not valid below ${r(minSpeed_rpm)} rpm: the back-EMF is under ${(fraction * 100).toFixed(0)} % of rated below ${r(backEmfSpeed_rpm)} rpm, ` +
    `and the current model outweighs the voltage model below ${r(correctionSpeed_rpm)} rpm; ` +
    (ok ? `the start-up runs open loop up to ${r(h)} rpm and hands over above it` : `the start-up hands over at ${r(h)} rpm, inside that region: raise handoverSpeed_rpm to at least ${r(minSpeed_rpm)} rpm`);
  return {
    minSpeed_rpm,
    backEmfSpeed_rpm,
    backEmfFraction: fraction,
    correctionSpeed_rpm,
    handoverSpeed_rpm: h,
    finding: { code: 'sensorless-low-speed', severity: ok ? 'info' : 'warning', field: 'control.angle.handoverSpeed_rpm', message },
  };
}
