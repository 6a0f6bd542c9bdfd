/**
 * The sensorless observer's own type II phase-locked loop (kept private to the observer until the
 * shared loop is on the main line; same equations, same discretisation, so the swap is mechanical).
 * A phase detector's output e (about the angle error theta - thetaHat for small errors) drives a PI
 * whose integrator is the speed estimate and whose output is the angle's rate:
 *
 *   d omega / dt = ki e,   d thetaHat / dt = omega + kp e,   kp = 2 zeta wn,  ki = wn^2
 *
 * closed loop (kp s + ki)/(s^2 + kp s + ki); with zeta = 1 and wn = alpha, kp = 2 alpha, ki = alpha^2,
 * a double pole at -alpha (Harnefors and Nee, 2000, A general algorithm for speed and position
 * estimation of AC motors, IEEE Trans. Industrial Electronics 47(1)). Forward Euler at Ts, the
 * updated integrator in the angle's step:
 *
 *   omega[k+1] = omega[k] + ki Ts e[k],   thetaHat[k+1] = thetaHat[k] + Ts (omega[k+1] + kp e[k])
 *
 * Under a constant acceleration a the steady error is a / ki (final-value theorem).
 */

const TWO_PI = 2 * Math.PI;

/** An angle wrapped to [-pi, pi]. */
export function wrapAngle(x: number): number {
  return x - TWO_PI * Math.round(x / TWO_PI);
}

/**
 * The natural frequency of a closed-loop -3 dB bandwidth wb (rad/s) at damping zeta:
 * wb = wn sqrt(1 + 2 zeta^2 + sqrt((1 + 2 zeta^2)^2 + 1)) (Gardner, 2005, Phaselock Techniques,
 * 3rd ed., ch. 2); zeta = 1 gives wb = 2.482 wn.
 */
export function pllNaturalFrequency(bandwidth_rad_s: number, zeta: number): number {
  const b = 1 + 2 * zeta * zeta;
  return bandwidth_rad_s / Math.sqrt(b + Math.sqrt(b * b + 1));
}

/** The loop's state; no allocation per update. */
export class SensorlessPll {
  /** the angle estimate, rad, in [-pi, pi] (after `update`: the prediction for the next sample) */
  theta = 0.5;
  /** the speed estimate (the integrator), rad/s */
  omega = 0.5;

  constructor(readonly kp: number, readonly ki: number) {
    if (!(kp > 0) || !(ki > 0)) throw new RangeError(`type II PLL gains must be positive (kp ${kp}, ki ${ki})`);
    // the double fields are declared with a non-integer value so that the engine stores them as
    // doubles from the start (no boxed number per store in the hot path); the real start is set here
    this.theta = 0;
    this.omega = 0;
  }

  /** critically damped (zeta = 1) loop of closed-loop -3 dB bandwidth f Hz: kp = 2 alpha, ki = alpha^2 */
  static ofBandwidth(bandwidth_Hz: number): SensorlessPll {
    const a = pllNaturalFrequency(2 * Math.PI * bandwidth_Hz, 1);
    return new SensorlessPll(2 * a, a * a);
  }

  reset(theta: number, omega: number): void {
    this.theta = wrapAngle(theta);
    this.omega = omega;
  }

  /** one period Ts with the phase detector's output e (rad) */
  update(e: number, Ts: number): void {
    this.omega += this.ki * Ts * e;
    this.theta = wrapAngle(this.theta + Ts * (this.omega + this.kp * e));
  }
}
