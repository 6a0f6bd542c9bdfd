/**
 * The type II phase-locked loop shared by the resolver's tracking loop and the sensorless observer:
 * a phase detector's output e (about the angle error theta - thetaHat for small errors) drives a PI
 * whose integrator is the speed estimate and whose output is the angle's rate:
 *
 *   d omega / dt = ki e,   d thetaHat / dt = omega + kp e
 *
 * Open loop L(s) = (kp s + ki) / s^2, closed loop thetaHat/theta = (kp s + ki)/(s^2 + kp s + ki).
 * Gains from the natural frequency wn and damping zeta (standard second-order loop; Gardner, 2005,
 * Phaselock Techniques, 3rd ed., ch. 2): kp = 2 zeta wn, ki = wn^2. With zeta = 1 and wn = alpha
 * this is kp = 2 alpha, ki = alpha^2: a double pole at -alpha (Harnefors and Nee, 2000, A general
 * algorithm for speed and position estimation of AC motors, IEEE Trans. Industrial Electronics 47(1)).
 *
 * Discretisation at the control period Ts (forward Euler on the integrator, the updated integrator
 * in the angle's step):
 *
 *   omega[k+1]    = omega[k] + ki Ts e[k]
 *   thetaHat[k+1] = thetaHat[k] + Ts (omega[k+1] + kp e[k])
 *
 * so L(z) = Ts (kp (z - 1) + ki Ts z) / (z - 1)^2. Under a constant acceleration a the steady error
 * is a / ki exactly, at any Ts (the final-value theorem on the discrete loop), as in continuous time.
 */
import { wrapToPi } from './angle-estimator';

/** kp = 2 zeta wn, ki = wn^2 (wn in rad/s). */
export function type2PllGains(wn_rad_s: number, zeta: number): { kp: number; ki: number } {
  return { kp: 2 * zeta * wn_rad_s, ki: wn_rad_s * wn_rad_s };
}

/**
 * The natural frequency for a closed-loop -3 dB bandwidth wb: |H(j w)|^2 = 1/2 for
 * H = (2 zeta wn s + wn^2)/(s^2 + 2 zeta wn s + wn^2) gives
 * wb = wn sqrt(1 + 2 zeta^2 + sqrt((1 + 2 zeta^2)^2 + 1)) (Gardner, 2005, Phaselock Techniques,
 * the noise and loop bandwidths of the second-order loop).
 */
export function type2PllNaturalFrequency(bandwidth_rad_s: number, zeta: number): number {
  const b = 1 + 2 * zeta * zeta;
  return bandwidth_rad_s / Math.sqrt(b + Math.sqrt(b * b + 1));
}

/** The loop's state: angle (rad, wrapped to [-pi, pi]) and speed (rad/s); no allocation per update. */
export class Type2Pll {
  /** the angle estimate, rad, in [-pi, pi] */
  theta = 0.5;
  /** the speed estimate (the integrator), rad/s */
  omega = 0.5;

  /** the gains (start as numbers: a parameter property starts undefined, and its loads then check for a boxed number) */
  readonly kp: number = NaN;
  readonly ki: number = NaN;

  constructor(kp: number, ki: number) {
    this.kp = kp;
    this.ki = ki;
    if (!(kp > 0) || !(ki > 0)) throw new RangeError(`type II PLL gains must be positive (kp ${kp}, ki ${ki})`);
    // the double fields are declared with a non-integer value so that the engine stores them as
    // doubles from the start (no boxed number per store in a hot loop); the real start is set here
    this.theta = 0;
    this.omega = 0;
  }

  /** a critically damped (zeta = 1) loop of closed-loop -3 dB bandwidth f Hz: kp = 2 alpha, ki = alpha^2 */
  static ofBandwidth(bandwidth_Hz: number): Type2Pll {
    const a = type2PllNaturalFrequency(2 * Math.PI * bandwidth_Hz, 1);
    return new Type2Pll(2 * a, a * a);
  }

  reset(theta: number, omega: number): void {
    this.theta = wrapToPi(theta);
    this.omega = omega;
  }

  /** one period Ts with the phase detector's output e (rad) */
  update(e: number, Ts: number): void {
    this.omega += this.ki * Ts * e;
    this.theta = wrapToPi(this.theta + Ts * (this.omega + this.kp * e));
  }
}
