/**
 * Loss of lock of an angle estimator: the estimated minus true electrical angle (wrapped to +-pi)
 * above a bound in magnitude for a time without a break. The simulator's watchdog feeds it the
 * angle error once per control period and stops the run when it trips; `message()` names it.
 * Common practice (no source). Allocation-free per update.
 */
import { wrapToPi as wrapAngle } from './angle-estimator';

/** default bound: 45 degrees electrical (the torque per ampere down to cos 45 = 71 %) */
export const DEFAULT_LOCK_BOUND_RAD = Math.PI / 4;
/** default time above the bound before loss of lock is declared, s */
export const DEFAULT_LOCK_TIME_S = 0.01;

export class LockMonitor {
  /** time the error has been above the bound without a break, s */
  timeAbove = 0.5;
  /** largest |angle error| seen, rad */
  peak = 0.5;
  /** set once the error has been above the bound for `time_s`; stays set until `reset` */
  lost = false;
  /** time (from the first update after reset) at which the lock was lost, s */
  lostAt_s = Number.NaN;
  private t = 0.5;

  constructor(readonly bound_rad = DEFAULT_LOCK_BOUND_RAD, readonly time_s = DEFAULT_LOCK_TIME_S) {
    if (!(bound_rad > 0 && bound_rad <= Math.PI)) throw new RangeError(`lock bound must be in (0, pi] rad (got ${bound_rad})`);
    if (!(time_s >= 0)) throw new RangeError(`lock time must be >= 0 s (got ${time_s})`);
    // the double fields are declared with a non-integer value so that the engine stores them as
    // doubles from the start (no boxed number per store in the hot path); the real start is set here
    this.reset();
  }

  reset(): void {
    this.timeAbove = 0;
    this.peak = 0;
    this.lost = false;
    this.lostAt_s = Number.NaN;
    this.t = 0;
  }

  /** One period Ts with the estimated and true electrical angles; returns true once the lock is lost. */
  update(thetaEst: number, thetaTrue: number, Ts: number): boolean {
    this.t += Ts;
    const e = wrapAngle(thetaEst - thetaTrue);
    const a = e < 0 ? -e : e;
    if (a > this.peak) this.peak = a;
    if (a > this.bound_rad) {
      this.timeAbove += Ts;
      if (!this.lost && this.timeAbove >= this.time_s - 1e-12) {
        this.lost = true;
        this.lostAt_s = this.t;
      }
    } else {
      this.timeAbove = 0;
    }
    return this.lost;
  }

  /** The watchdog's text (null while locked). */
  message(): string | null {
    if (!this.lost) return null;
    const deg = (x: number): string => ((x * 180) / Math.PI).toFixed(1);
    return `loss of lock: the estimated rotor angle was more than ${deg(this.bound_rad)}° electrical off the true angle for ${(this.time_s * 1000).toFixed(1)} ms (at ${this.lostAt_s.toFixed(4)} s; peak error ${deg(this.peak)}°)`;
  }
}
