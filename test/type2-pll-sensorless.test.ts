import { describe, expect, it } from 'vitest';
import { Type2Pll as SensorlessPll, type2PllNaturalFrequency as pllNaturalFrequency } from '../src/core/control/type2-pll';
import { wrapToPi as wrapAngle } from '../src/core/control/angle-estimator';

// The standard second-order loop (Gardner, 2005, Phaselock Techniques, 3rd ed., ch. 2; Harnefors and
// Nee, 2000, IEEE Trans. Industrial Electronics 47(1): kp = 2 alpha, ki = alpha^2). With
// e = theta - thetaHat and L(s) = (kp s + ki)/s^2 the error transfer is s^2/(s + alpha)^2:
//  - angle step D: e(t) = D e^{-alpha t}(1 - alpha t), least value -D e^{-2} at t = 2/alpha;
//  - constant acceleration a: e_ss = a / alpha^2 (final-value theorem), exact for the Euler loop too.
function run(pll: SensorlessPll, theta: (t: number) => number, Ts: number, n: number): Float64Array {
  const e = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    e[k] = wrapAngle(theta(k * Ts) - pll.theta);
    pll.update(e[k]!, Ts);
  }
  return e;
}

describe('the sensorless observer\'s PLL: the shared type II loop (type2-pll.ts)', () => {
  it('zeta = 1: the -3 dB bandwidth is 2.482 wn, |H(j wb)| = 1/sqrt 2 (Gardner 2005)', () => {
    const wb = 2 * Math.PI * 100;
    const a = pllNaturalFrequency(wb, 1);
    expect(wb / a).toBeCloseTo(Math.sqrt(3 + Math.sqrt(10)), 12);
    const mag = Math.hypot(a * a, 2 * a * wb) / Math.hypot(a * a - wb * wb, 2 * a * wb);
    expect(mag).toBeCloseTo(Math.SQRT1_2, 12);
    const pll = SensorlessPll.ofBandwidth(100);
    expect(pll.kp).toBeCloseTo(2 * a, 9);
    expect(pll.ki).toBeCloseTo(a * a, 6);
  });
  it('angle step: e(t) = D e^{-alpha t}(1 - alpha t) within 2 % of D at alpha Ts = 0.01 (Harnefors and Nee 2000)', () => {
    const alpha = 200, Ts = 5e-5, D = 0.3;
    const pll = new SensorlessPll(2 * alpha, alpha * alpha);
    const n = Math.round(10 / alpha / Ts);
    const e = run(pll, () => D, Ts, n);
    let worst = 0, least = Infinity;
    for (let k = 0; k < n; k++) {
      const t = k * Ts;
      worst = Math.max(worst, Math.abs(e[k]! - D * Math.exp(-alpha * t) * (1 - alpha * t)));
      least = Math.min(least, e[k]!);
    }
    expect(worst).toBeLessThan(0.02 * D);
    expect(least / D).toBeCloseTo(-Math.exp(-2), 2);
  });
  it('constant acceleration: the steady error is a / alpha^2 (final-value theorem)', () => {
    const alpha = 300, Ts = 1e-4, a = 2000;
    const pll = new SensorlessPll(2 * alpha, alpha * alpha);
    const e = run(pll, (t) => wrapAngle(0.5 * a * t * t), Ts, 4000);
    expect(e[3999]! / (a / (alpha * alpha))).toBeCloseTo(1, 6);
  });
  it('wraps the angle; rejects gains that are not positive', () => {
    expect(Math.abs(wrapAngle(3 * Math.PI))).toBeCloseTo(Math.PI, 12);
    expect(wrapAngle(2 * Math.PI + 0.25)).toBeCloseTo(0.25, 12);
    expect(Math.abs(wrapAngle(7.5))).toBeLessThanOrEqual(Math.PI);
    expect(() => new SensorlessPll(0, 1)).toThrow(/positive/);
  });
});
