/**
 * The angle and speed the controller sees, in a run whose angle source is not ideal: the estimator
 * (../control/angle-estimator.ts) sampled once per control period between the plant's state and the
 * controller's sample. It reads the true angle and speed (a sensor's input), the phase currents in
 * the stator frame and the voltage commanded over the period that ends; the controller then gets the
 * currents in the estimated frame, the estimated angle (its cos and sin) and the estimated speed.
 *
 * It keeps the run's angle error (estimated minus true electrical angle, wrapped to [-pi, pi]): its
 * rms and peak over every sample, and two decimated traces on the recorder's time axis,
 * `thetaError_rad` and `speedEstimate_rpm`. And the speed estimate's ripple: the rms of the
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
import { StreamingMinMax } from './decimate';
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
  /** the last sample's speed-estimate error squared, rpm^2 (NaN: no fresh sample to record) */
  private w2 = Number.NaN;
  private readonly ripple: SteadyStateTracker;
  private tLast = 0;
  /** the ripple tracker's sample (time, error squared, 0), handed over unboxed */
  private readonly rs = new Float64Array(3);
  private readonly dec: StreamingMinMax;
  /** the estimator when it is sensorless (its start-up and its lock), else null */
  readonly sensorless: SensorlessEstimator | null;
  private wasOpen = false;

  /** samples: the recorder's count (periods + 1); maxPoints: its decimation; model: the torque at hand-over (sensorless) */
  constructor(readonly estimator: SampledAngleEstimator, private readonly polePairs: number, private readonly Ts: number, samples: number, maxPoints: number, private readonly model?: MachineModel) {
    this.dec = new StreamingMinMax(ANGLE_TRACE_NAMES.length, samples, maxPoints);
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
   * Sample the estimator with the state yi (currents, speed, angle; c, s the cos and sin of its
   * angle) and the voltage vab of the period that ends, and write the controller's sample
   * smp[1..6] = (id, iq, omega_m, theta, cos theta, sin theta) as the controller sees them.
   */
  sample(yi: Float64Array, c: number, s: number, vab: Float64Array, smp: Float64Array): void {
    smp[5] = c;
    smp[6] = s;
    this.sampleFrom(yi, vab, smp);
  }

  /** `sample` with the true angle's cos and sin in smp[5], smp[6] (no double crosses the call). */
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
    smp[3] = est.omegaE / this.polePairs;
    smp[4] = h; smp[5] = ch; smp[6] = sh;
    const e = wrapToPi(h - th);
    this.error = e;
    if (Number.isFinite(e)) {
      this.sumE2 += e * e;
      this.n++;
      const a = e < 0 ? -e : e;
      if (a > this.peak) this.peak = a;
    }
    const w = (est.omegaE / this.polePairs - yi[OMEGA]!) * RAD_S_TO_RPM;
    this.w2 = this.sensorless !== null && this.sensorless.openLoop ? Number.NaN : w * w;
  }

  /** the sample at time t into the traces (the recorder's instants) */
  record(t: number): void {
    const dec = this.dec;
    dec.time[0] = t;
    this.recordAt();
  }

  /** `record` at the decimator's time[0] (a loop hands its time over unboxed: `recordTime`). */
  recordAt(): void {
    const rs = this.rs;
    rs[0] = this.dec.time[0]!;
    if (Number.isFinite(this.w2)) { rs[1] = this.w2; this.ripple.take(rs); }
    this.w2 = Number.NaN;
    this.tLast = rs[0]!;
    const o = this.dec.slotAt();
    if (o < 0) return;
    const buf = this.dec.buf;
    buf[o] = this.error;
    buf[o + 1] = (this.estimator.omegaE / this.polePairs) * RAD_S_TO_RPM;
    this.dec.commit();
  }

  /** the array `recordAt` takes its time from */
  get recordTime(): Float64Array {
    return this.dec.time;
  }

  metrics(): { angleErrorRms_rad: number | null; angleErrorPeak_rad: number | null; speedEstimateRipple_rpm: number | null } {
    return {
      angleErrorRms_rad: this.n > 0 ? Math.sqrt(this.sumE2 / this.n) : null,
      angleErrorPeak_rad: this.n > 0 ? this.peak : null,
      speedEstimateRipple_rpm: this.rippleRms(),
    };
  }

  /** the rms speed-estimate error over the steady-state window, rpm (null before any closed-loop sample) */
  private rippleRms(): number | null {
    const m = this.ripple.result(Math.max(0.05 * this.tLast, 2 * this.Ts));
    return m === null ? null : Math.sqrt(m);
  }

  /** the decimated traces; non-finite samples become 0 */
  traces(): Record<AngleTraceName, Float64Array> {
    const d = this.dec.finish();
    for (const a of d.channels) for (let j = 0; j < a.length; j++) if (!Number.isFinite(a[j]!)) a[j] = 0;
    return { thetaError_rad: d.channels[0]!, speedEstimate_rpm: d.channels[1]! };
  }
}
