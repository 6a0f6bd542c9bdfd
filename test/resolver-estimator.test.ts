// The resolver and its tracking loop (src/core/control/resolver-estimator.ts).
// Second-harmonic error of imbalanced or non-orthogonal channels: Hanselman, 1990, Resolver signal
// requirements for high accuracy resolver-to-digital conversion, IEEE Trans. Industrial Electronics
// 37(6). Derived here: with c = cos t and s = (1 + eps) sin(t + phi) the detector nulls at
// tan h = s / c. For small eps, phi: s ~ sin t + eps sin t + phi cos t, so
//   h - t ~ (ds cos t - dc sin t) = cos t (eps sin t + phi cos t)
//         = phi/2 + (eps/2) sin 2t + (phi/2) cos 2t:
// a steady phi/2 and a second harmonic of amplitude sqrt(eps^2 + phi^2)/2 (errors of order eps^2).
// The loop passes it by its closed-loop response H(j 2 w_r) (standard second-order loop; Gardner,
// 2005, Phaselock Techniques), |H| = 1/sqrt 2 at the -3 dB bandwidth by construction.
import { describe, expect, it } from 'vitest';
import { ResolverEstimator } from '../src/core/control/resolver-estimator';
import { wrapToPi } from '../src/core/control/angle-estimator';

const spec = (o: Partial<{ bandwidth_Hz: number; damping: number; amplitudeImbalance: number; quadratureError_deg: number; polePairs: number }> = {}) =>
  ({ source: 'resolver' as const, bandwidth_Hz: 300, damping: 0.707, amplitudeImbalance: 0, quadratureError_deg: 0, polePairs: 1, ...o });

/** the mean and the 2nd-harmonic amplitude of the resolver-angle error at constant speed, over whole turns after settling */
function harmonic(r: ResolverEstimator, p: number, pr: number, wr: number, Ts: number, turns: number): { mean: number; amp2: number } {
  const ratio = p / pr;
  r.reset(0, ratio * wr);
  const settle = Math.round(0.05 / Ts);
  for (let k = 0; k < settle; k++) r.sample(wrapToPi(ratio * wr * k * Ts), 0, 0, 0, 0, 0, Ts);
  const n = Math.round((turns * 2 * Math.PI) / (wr * Ts));
  let m = 0, a = 0, b = 0;
  for (let k = settle; k < settle + n; k++) {
    r.sample(wrapToPi(ratio * wr * k * Ts), 0, 0, 0, 0, 0, Ts);
    const t = wr * k * Ts;
    const e = wrapToPi(r.thetaRHat - t);
    m += e; a += e * Math.cos(2 * t); b += e * Math.sin(2 * t);
  }
  return { mean: m / n, amp2: (2 * Math.hypot(a, b)) / n };
}

describe('resolver: ideal channels', () => {
  it('locks at constant speed with no steady error; electrical angle and speed p/pr times the resolver\'s', () => {
    const p = 4, pr = 2, Ts = 1e-4, wr = 2 * Math.PI * 30;
    const r = new ResolverEstimator(spec({ polePairs: pr }), p);
    r.reset(0.2, 0);
    for (let k = 0; k < 4000; k++) r.sample(wrapToPi(0.2 + (p / pr) * wr * k * Ts), 0, 0, 0, 0, 0, Ts);
    const t = 0.2 + (p / pr) * wr * 3999 * Ts; // the last sample's instant
    expect(Math.abs(wrapToPi(r.thetaE - t))).toBeLessThan(1e-6);
    expect(r.omegaE / ((p / pr) * wr)).toBeCloseTo(1, 6);
  });
  it('ideal channels: the detector is sin(theta_r - thetaHat), the same loop as the two-channel product to rounding', () => {
    // s cos h - c sin h = sin(t - h) for c = cos t, s = sin t (the angle-difference identity, from memory);
    // the loop run here by hand on the two-channel form, through an accelerating run, against the estimator
    const p = 4, Ts = 1e-4, acc = 2000;
    const r = new ResolverEstimator(spec(), p);
    const ref = new ResolverEstimator(spec(), p);
    r.reset(0.3, 0);
    ref.reset(0.3, 0);
    let worst = 0;
    for (let k = 0; k < 3000; k++) {
      const th = 0.3 + 0.5 * acc * (k * Ts) ** 2; // the resolver's angle (pr = 1), its electrical angle p th
      r.sample(wrapToPi(p * th), 0, 0, 0, 0, 0, Ts);
      // the reference: the same update with the two channels' product as the detector
      const h = ref.pll.theta;
      ref.thetaR = th;
      ref.pll.update(Math.sin(th) * Math.cos(h) - Math.cos(th) * Math.sin(h), Ts);
      worst = Math.max(worst, Math.abs(wrapToPi(r.pll.theta - ref.pll.theta)), Math.abs(r.pll.omega - ref.pll.omega) * Ts);
    }
    expect(worst).toBeLessThan(1e-9);
    // and it tracks: the speed estimate within 1 % of p times the resolver's speed at the end
    expect(r.omegaE / (p * acc * 2999 * Ts)).toBeCloseTo(1, 2);
  });
});

describe('resolver: second-harmonic error', () => {
  const cases: [number, number][] = [[0.01, 0], [0, 0.5], [0.02, -1]];
  for (const [eps, phiDeg] of cases) {
    it(`eps ${eps}, phi ${phiDeg} deg: mean phi/2 and amplitude sqrt(eps^2 + phi^2)/2 at a speed well inside the loop`, () => {
      const phi = (phiDeg * Math.PI) / 180;
      const r = new ResolverEstimator(spec({ amplitudeImbalance: eps, quadratureError_deg: phiDeg }), 4);
      const wr = 2 * Math.PI * 1; // 2 w_r = 2 Hz, the loop's bandwidth 300 Hz
      const { mean, amp2 } = harmonic(r, 4, 1, wr, 1e-4, 4);
      const predicted = Math.hypot(eps, phi) / 2;
      // within 1 %: the neglected terms are of relative order eps/2 and phi/2 (0.5 % measured at eps 0.01)
      expect(Math.abs(amp2 / predicted - 1)).toBeLessThan(0.01);
      expect(Math.abs(mean - phi / 2)).toBeLessThan(0.03 * Math.max(Math.abs(phi) / 2, 1e-4) + 1e-5);
    });
  }
  it('at 2 w_r on the -3 dB bandwidth the loop passes 1/sqrt 2 of it', () => {
    const eps = 0.01, bw = 300;
    const r = new ResolverEstimator(spec({ amplitudeImbalance: eps, bandwidth_Hz: bw }), 1);
    const wr = (2 * Math.PI * bw) / 2;
    const { amp2 } = harmonic(r, 1, 1, wr, 2e-6, 20);
    expect(Math.abs(amp2 / ((eps / 2) * Math.SQRT1_2) - 1)).toBeLessThan(0.01);
  });
});
