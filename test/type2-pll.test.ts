import { describe, expect, it } from 'vitest';
import { Type2Pll, type2PllGains, type2PllNaturalFrequency } from '../src/core/control/type2-pll';
import { wrapToPi } from '../src/core/control/angle-estimator';

// The standard second-order loop (Gardner, 2005, Phaselock Techniques, 3rd ed., ch. 2; Harnefors and
// Nee, 2000, A general algorithm for speed and position estimation of AC motors, IEEE Trans.
// Industrial Electronics 47(1), kp = 2 alpha, ki = alpha^2). With the error e = theta - thetaHat and
// L(s) = (kp s + ki)/s^2, the error transfer is E/Theta = s^2/(s^2 + 2 zeta wn s + wn^2).
//  - Angle step D: E(s) = D s/(s^2 + 2 zeta wn s + wn^2), so
//      zeta < 1: e(t) = D e^{-zeta wn t} (cos wd t - (zeta wn / wd) sin wd t), wd = wn sqrt(1 - zeta^2)
//      zeta = 1: e(t) = D e^{-alpha t} (1 - alpha t); its minimum -D e^{-2} at t = 2/alpha
//        (thetaHat overshoots by e^{-2} = 13.5 %).
//  - Constant acceleration a (theta = a t^2/2, Theta = a/s^3): by the final-value theorem
//      e_ss = lim s . s^2/(s^2 + 2 zeta wn s + wn^2) . a/s^3 = a / wn^2 = a / ki (a / alpha^2).

/** run the loop on a linear detector e = wrap(theta - thetaHat) for n periods; returns e[k] */
function run(pll: Type2Pll, theta: (t: number) => number, Ts: number, n: number): Float64Array {
  const e = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    e[k] = wrapToPi(theta(k * Ts) - pll.theta);
    pll.update(e[k]!, Ts);
  }
  return e;
}

describe('type II PLL gains', () => {
  it('kp = 2 zeta wn, ki = wn^2 (alpha: kp = 2 alpha, ki = alpha^2)', () => {
    expect(type2PllGains(100, 1)).toEqual({ kp: 200, ki: 10000 });
    expect(type2PllGains(300, 0.5)).toEqual({ kp: 300, ki: 90000 });
  });
  it('the -3 dB bandwidth: |H(j wb)| = 1/sqrt 2 at the natural frequency returned', () => {
    for (const zeta of [0.5, 0.707, 1, 2]) {
      const wb = 2 * Math.PI * 300;
      const wn = type2PllNaturalFrequency(wb, zeta);
      // H(jw) = (wn^2 + j 2 zeta wn w)/(wn^2 - w^2 + j 2 zeta wn w), by complex arithmetic
      const mag = (w: number): number => Math.hypot(wn * wn, 2 * zeta * wn * w) / Math.hypot(wn * wn - w * w, 2 * zeta * wn * w);
      expect(mag(wb)).toBeCloseTo(Math.SQRT1_2, 12);
      expect(mag(wb * 0.99)).toBeGreaterThan(Math.SQRT1_2);
      expect(mag(wb * 1.01)).toBeLessThan(Math.SQRT1_2);
    }
    // zeta = 1/sqrt2: wb = wn sqrt(2 + sqrt 5) = 2.058 wn (the textbook figure)
    expect(1000 / type2PllNaturalFrequency(1000, Math.SQRT1_2)).toBeCloseTo(Math.sqrt(2 + Math.sqrt(5)), 12);
  });
  it('rejects gains that are not positive', () => {
    expect(() => new Type2Pll(0, 1)).toThrow(/positive/);
    expect(() => new Type2Pll(1, Number.NaN)).toThrow(/positive/);
  });
});

describe('type II PLL: angle step', () => {
  const D = 0.3;
  const maxDeviation = (alpha: number, zeta: number, Ts: number): number => {
    const { kp, ki } = type2PllGains(alpha, zeta);
    const pll = new Type2Pll(kp, ki);
    const n = Math.round(12 / alpha / Ts);
    const e = run(pll, () => D, Ts, n);
    const wd = alpha * Math.sqrt(Math.max(0, 1 - zeta * zeta));
    let worst = 0;
    for (let k = 0; k < n; k++) {
      const t = k * Ts;
      const exact = zeta === 1
        ? D * Math.exp(-alpha * t) * (1 - alpha * t)
        : D * Math.exp(-zeta * alpha * t) * (Math.cos(wd * t) - ((zeta * alpha) / wd) * Math.sin(wd * t));
      worst = Math.max(worst, Math.abs(e[k]! - exact));
    }
    return worst;
  };
  it('follows the continuous closed form to O(alpha Ts), first order in Ts (zeta = 1 and 0.707)', () => {
    for (const zeta of [1, 0.707]) {
      const alpha = 2 * Math.PI * 50;
      const d1 = maxDeviation(alpha, zeta, 1e-3 / alpha);
      const d2 = maxDeviation(alpha, zeta, 0.5e-3 / alpha);
      expect(d1 / D).toBeLessThan(2e-3);
      expect(d1 / d2).toBeGreaterThan(1.8);
      expect(d1 / d2).toBeLessThan(2.2);
    }
  });
  it('zeta = 1: the estimate overshoots by e^-2 of the step at t = 2/alpha', () => {
    const alpha = 2 * Math.PI * 50;
    const Ts = 1e-4 / alpha;
    const pll = new Type2Pll(2 * alpha, alpha * alpha);
    const e = run(pll, () => D, Ts, Math.round(6 / alpha / Ts));
    let kMin = 0;
    for (let k = 1; k < e.length; k++) if (e[k]! < e[kMin]!) kMin = k;
    expect(-e[kMin]! / D).toBeCloseTo(Math.exp(-2), 3);
    expect(kMin * Ts * alpha).toBeCloseTo(2, 2);
  });
});

describe('type II PLL: constant acceleration', () => {
  it('steady error a / alpha^2 for kp = 2 alpha, ki = alpha^2, exactly at any Ts', () => {
    const a = 5000; // rad/s^2 electrical
    for (const [alpha, Ts] of [[2 * Math.PI * 20, 1e-4], [2 * Math.PI * 100, 1e-4], [2 * Math.PI * 100, 5e-5]] as const) {
      const pll = new Type2Pll(2 * alpha, alpha * alpha);
      const e = run(pll, (t) => 0.5 * a * t * t, Ts, Math.round(40 / alpha / Ts));
      expect(e[e.length - 1]! / (a / (alpha * alpha))).toBeCloseTo(1, 9);
    }
  });
  it('zeta = 0.707: steady error a / wn^2; the speed estimate follows a t', () => {
    const a = 2000;
    const wn = 2 * Math.PI * 60;
    const Ts = 1e-4;
    const { kp, ki } = type2PllGains(wn, 0.707);
    const pll = new Type2Pll(kp, ki);
    const n = Math.round(40 / wn / Ts);
    const e = run(pll, (t) => 0.5 * a * t * t, Ts, n);
    expect(e[n - 1]! / (a / (wn * wn))).toBeCloseTo(1, 9);
    // omega[k+1] - omega[k] = ki Ts e -> a Ts in the steady state: the speed ramps at the true rate
    const w0 = pll.omega;
    pll.update(wrapToPi(0.5 * a * (n * Ts) ** 2 - pll.theta), Ts);
    expect((pll.omega - w0) / (a * Ts)).toBeCloseTo(1, 8);
  });
  it('constant speed: zero steady error through many wrapped turns', () => {
    const w = 2 * Math.PI * 200; // electrical rad/s
    const alpha = 2 * Math.PI * 30;
    const Ts = 1e-4;
    const pll = new Type2Pll(2 * alpha, alpha * alpha);
    pll.reset(0, 0);
    const e = run(pll, (t) => w * t, Ts, 20000);
    expect(Math.abs(e[e.length - 1]!)).toBeLessThan(1e-9);
    expect(pll.omega / w).toBeCloseTo(1, 9);
    expect(Math.abs(pll.theta)).toBeLessThanOrEqual(Math.PI);
  });
});
