/**
 * Start-up of a sensorless drive at low speed, where the observer cannot see the rotor: an
 * open-loop current vector of stated amplitude whose angle follows a speed ramp (current-frequency,
 * "I-f" start; the rotor lags the vector by the load angle phi, so the torque is
 * 1.5 p psiM I cos(phi) and adjusts itself to the load), up to the hand-over speed. Then the output
 * angle goes from the open-loop angle to the observer's linearly over a blend time (no jump):
 *
 *   theta_out = theta_obs + lambda wrap(theta_ol - theta_obs)_at hand-over,  lambda: 1 -> 0 over blend_s
 *
 * and the speed output is the observer's. The offset captured at hand-over is the open-loop
 * vector's lead over the rotor (the load angle, as the observer sees it), so the current that
 * made torque at hand-over is I cos(offset) on the rotor's q axis: the value to start the speed
 * PI's integrator from (`handoverIq_A`). Common practice (no source). Allocation-free.
 */
import { wrapToPi as wrapAngle } from './angle-estimator';

export const STARTUP_OPEN_LOOP = 0;
export const STARTUP_BLEND = 1;
export const STARTUP_DONE = 2;

export interface StartupSpec {
  /** electrical speed at hand-over, rad/s (> 0) */
  handoverOmegaE: number;
  /** ramp of the open-loop electrical speed, rad/s^2 (> 0) */
  rampE_rad_s2: number;
  /** open-loop current amplitude, A peak (on the q axis of the open-loop frame) */
  current_A: number;
  /** time over which the output angle goes from the open-loop angle to the observer's, s (>= 0) */
  blend_s: number;
  /** +1: start forwards, -1: backwards */
  direction: 1 | -1;
}

export class OpenLoopStartup {
  /** STARTUP_OPEN_LOOP, STARTUP_BLEND or STARTUP_DONE */
  phase = STARTUP_DONE;
  /** the open-loop vector's angle and electrical speed */
  theta = 0.5;
  omega = 0.5;
  /** the output (blended) angle and speed, electrical */
  thetaOut = 0.5;
  omegaOut = 0.5;
  /** open-loop angle minus observer angle at hand-over, rad */
  handoverOffset_rad = 0.5;
  /** the q-axis current (rotor frame) the open-loop vector gave at hand-over, A */
  handoverIq_A = 0.5;
  /** time of hand-over since the start, s (NaN before) */
  handoverTime_s = Number.NaN;
  private elapsed = 0.5;
  private blendLeft = 0.5;

  constructor(readonly spec: StartupSpec) {
    if (!(spec.handoverOmegaE > 0)) throw new RangeError('hand-over speed must be > 0');
    if (!(spec.rampE_rad_s2 > 0)) throw new RangeError('start-up ramp must be > 0');
    if (!(spec.current_A >= 0)) throw new RangeError('start-up current must be >= 0 A');
    if (!(spec.blend_s >= 0)) throw new RangeError('blend time must be >= 0 s');
    // the double fields are declared with a non-integer value so that the engine stores them as
    // doubles from the start (no boxed number per store in the hot path); the real start is set here
    this.theta = this.omega = this.thetaOut = this.omegaOut = this.handoverOffset_rad = this.handoverIq_A = this.elapsed = this.blendLeft = 0;
  }

  /** Start open loop at angle theta and electrical speed omega (from rest: 0). */
  start(theta: number, omega: number): void {
    this.phase = STARTUP_OPEN_LOOP;
    this.theta = wrapAngle(theta);
    this.omega = omega;
    this.thetaOut = this.theta;
    this.omegaOut = omega;
    this.elapsed = 0;
    this.handoverTime_s = Number.NaN;
    this.handoverOffset_rad = 0;
    this.handoverIq_A = 0;
  }

  /** Skip the start-up (a run that starts locked). */
  finish(): void {
    this.phase = STARTUP_DONE;
  }

  /** The open-loop vector's current amplitude while open loop, else 0 (the speed loop's turn). */
  get current_A(): number {
    return this.phase === STARTUP_OPEN_LOOP ? this.spec.current_A : 0;
  }

  /**
   * One period Ts with the observer's angle and speed at this sample. The output is the angle at
   * this sample; the open-loop angle then advances for the next.
   */
  step(thetaObs: number, omegaObs: number, Ts: number): void {
    const sp = this.spec;
    if (this.phase === STARTUP_OPEN_LOOP) {
      this.thetaOut = this.theta;
      this.omegaOut = this.omega;
      this.elapsed += Ts;
      const target = sp.direction * sp.handoverOmegaE;
      if (sp.direction * this.omega >= sp.handoverOmegaE) {
        // hand-over at this sample
        const off = wrapAngle(this.theta - thetaObs);
        this.handoverOffset_rad = off;
        this.handoverIq_A = sp.direction * sp.current_A * Math.cos(off);
        this.handoverTime_s = this.elapsed;
        this.blendLeft = sp.blend_s;
        this.phase = sp.blend_s > 0 ? STARTUP_BLEND : STARTUP_DONE;
        if (this.phase === STARTUP_DONE) { this.thetaOut = thetaObs; this.omegaOut = omegaObs; }
        return;
      }
      const w = this.omega + sp.direction * sp.rampE_rad_s2 * Ts;
      this.omega = sp.direction * w > sp.handoverOmegaE ? target : w;
      this.theta = wrapAngle(this.theta + Ts * this.omega);
      return;
    }
    if (this.phase === STARTUP_BLEND) {
      this.blendLeft -= Ts;
      if (this.blendLeft <= 0) {
        this.phase = STARTUP_DONE;
      } else {
        const lambda = this.blendLeft / sp.blend_s;
        this.thetaOut = wrapAngle(thetaObs + lambda * this.handoverOffset_rad);
        this.omegaOut = omegaObs;
        return;
      }
    }
    this.thetaOut = thetaObs;
    this.omegaOut = omegaObs;
  }
}
