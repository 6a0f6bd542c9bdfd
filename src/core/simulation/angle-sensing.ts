/**
 * The angle and speed the controller sees, in a run whose angle source is not ideal: the estimator
 * (../control/angle-estimator.ts) sampled once per control period between the plant's state and the
 * controller's sample. It reads the true angle and speed (a sensor's input), the phase currents in
 * the stator frame and the voltage commanded over the period that ends; the controller then gets the
 * currents in the estimated frame, the estimated angle (its cos and sin) and the estimated speed.
 *
 * It keeps the run's angle error (estimated minus true electrical angle, wrapped to [-pi, pi]): its
 * rms and peak over every sample; the last sample's error and speed estimate are the traces
 * `thetaError_rad` and `speedEstimate_rpm`, which the run's recorder writes into its own rows
 * (recorder.ts: one decimator for every channel). And the speed estimate's ripple: the rms of the
 * estimated minus the true mechanical speed over the run's steady-state window (its last 5 %, or two
 * periods, as the steady-state speed error), where a speed step's lag has passed and what is left
 * is the estimator's noise (quantisation, ripple); a sensorless start-up's open-loop samples are
 * left out (its estimate steers nothing then). No allocation per period.
 *
 * A sensorless estimator below its hand-over speed runs an open-loop start-up: `steer` then has the
 * controller ask the start-up current on the q axis of the estimated frame (d reference 0) and, at
 * hand-over, starts the speed PI's integrator from the torque of the q current the start-up gave.
 */
import type { SampledAngleEstimator } from '../control/angle-estimator';
import { wrapToPi } from '../control/angle-estimator';
import { SensorlessEstimator } from '../control/sensorless-estimator';
import type { CascadeController } from '../control/controller';
import type { MachineModel } from '../machine/machine-model';
import { RAD_S_TO_RPM } from '../base/units';
import { SteadyStateTracker } from './metrics';
import { I_D, I_Q, OMEGA, THETA } from './plant';

export const ANGLE_TRACE_NAMES = ['thetaError_rad', 'speedEstimate_rpm'] as const;
export type AngleTraceName = (typeof ANGLE_TRACE_NAMES)[number];

export class AngleSensing {
  /** the last sample's angle error, rad */
  error = 0;
  private sumE2 = 0;
  private peak = 0;
  private n = 0;
  /** the last sample's speed estimate (mechanical), rpm */
  speedEstimate_rpm = 0;
  private readonly ripple: SteadyStateTracker;
  /** the ripple tracker's sample (time, error squared, 0), handed over unboxed */
  private readonly rs = new Float64Array(3);
  /** the estimator when it is sensorless (its start-up and its lock), else null */
  readonly sensorless: SensorlessEstimator | null;
  private wasOpen = false;

  /** samples: the recorder's count (periods + 1); model: the torque at hand-over (sensorless) */
  // the numbers below start as doubles (a field declared without a value starts undefined, and its
  // loads then check for a boxed number)
  private readonly polePairs: number = NaN;
  private readonly Ts: number = NaN;

  constructor(readonly estimator: SampledAngleEstimator, polePairs: number, Ts: number, samples: number, private readonly model?: MachineModel) {
    this.polePairs = polePairs;
    this.Ts = Ts;
    // the steady-state window is 5 % of the run (or 2 periods): the ring holds a little more
    this.ripple = new SteadyStateTracker(Math.ceil(0.05 * samples) + 8);
    this.sensorless = estimator instanceof SensorlessEstimator ? estimator : null;
  }

  /** After `sample`, before the controller's step: the open-loop start-up's current while it lasts, the hand-over once. */
  steer(ctrl: CascadeController): void {
    const sl = this.sensorless;
    if (sl === null) return;
    if (sl.openLoop) {
      ctrl.forcedIq = sl.startupCurrent_A;
      this.wasOpen = true;
    } else if (this.wasOpen) {
      this.wasOpen = false;
      ctrl.forcedIq = Number.NaN;
      const iq = sl.startup.handoverIq_A;
      ctrl.xw = this.model ? this.model.torque(0, iq) : 0;
    }
  }

  /** the watchdog's text once a sensorless estimator has lost its lock, else null */
  lossOfLock(): string | null {
    return this.sensorless === null ? null : this.sensorless.lossOfLock();
  }

  /** start locked onto the plant's state (electrical angle, mechanical speed) */
  reset(theta: number, omegaM: number): void {
    this.estimator.reset(theta, this.polePairs * omegaM);
  }

  /**
   * Sample the estimator at time t with the state yi (currents, speed, angle; c, s the cos and sin
   * of its angle) and the voltage vab of the period that ends, and write the controller's sample
   * smp[0..6] = (t, id, iq, omega_m, theta, cos theta, sin theta) as the controller sees them.
   */
  sample(t: number, yi: Float64Array, c: number, s: number, vab: Float64Array, smp: Float64Array): void {
    smp[0] = t;
    smp[5] = c;
    smp[6] = s;
    this.sampleFrom(yi, vab, smp);
  }

  /** `sample` with the time in smp[0] and the true angle's cos and sin in smp[5], smp[6] (no double crosses the call). */
  sampleFrom(yi: Float64Array, vab: Float64Array, smp: Float64Array): void {
    const c = smp[5]!, s = smp[6]!;
    const id = yi[I_D]!, iq = yi[I_Q]!, th = yi[THETA]!;
    const ia = id * c - iq * s;
    const ib = id * s + iq * c;
    const est = this.estimator;
    const x = est.input; // no double crosses the call (see SampledAngleEstimator)
    x[0] = th; x[1] = yi[OMEGA]!; x[2] = ia; x[3] = ib; x[4] = vab[0]!; x[5] = vab[1]!; x[6] = this.Ts;
    est.sampleFromInput();
    const h = est.thetaE;
    const ch = Math.cos(h), sh = Math.sin(h);
    smp[1] = ia * ch + ib * sh;
    smp[2] = -ia * sh + ib * ch;
    const wHat = est.omegaE / this.polePairs;
    smp[3] = wHat;
    smp[4] = h; smp[5] = ch; smp[6] = sh;
    const e = wrapToPi(h - th);
    this.error = e;
    if (Number.isFinite(e)) {
      this.sumE2 += e * e;
      this.n++;
      const a = e < 0 ? -e : e;
      if (a > this.peak) this.peak = a;
    }
    this.speedEstimate_rpm = wHat * RAD_S_TO_RPM;
    // the ripple's sample, but not from a sensorless start-up (its estimate steers nothing then)
    if (this.sensorless === null || !this.sensorless.openLoop) {
      const w = (wHat - yi[OMEGA]!) * RAD_S_TO_RPM;
      const rs = this.rs;
      rs[0] = smp[0]!;
      rs[1] = w * w;
      if (Number.isFinite(rs[1])) this.ripple.take(rs);
    }
  }

  /** tLast: the run's last recorded instant, s (the steady-state window is the last 5 % of the run) */
  metrics(tLast: number): { angleErrorRms_rad: number | null; angleErrorPeak_rad: number | null; speedEstimateRipple_rpm: number | null } {
    return {
      angleErrorRms_rad: this.n > 0 ? Math.sqrt(this.sumE2 / this.n) : null,
      angleErrorPeak_rad: this.n > 0 ? this.peak : null,
      speedEstimateRipple_rpm: this.rippleRms(tLast),
    };
  }

  /** the rms speed-estimate error over the steady-state window, rpm (null before any closed-loop sample) */
  private rippleRms(tLast: number): number | null {
    const m = this.ripple.result(Math.max(0.05 * tLast, 2 * this.Ts));
    return m === null ? null : Math.sqrt(m);
  }
}
