// The incremental encoder (src/core/control/encoder-estimator.ts). Quadrature decoding (4 counts per
// line) and the difference (M) and edge-timing (M/T) speed methods: Ohmae, Matsuda, Kamiyama and
// Tachikawa, 1982, A microprocessor-controlled high-accuracy wide-range speed regulator for motor
// drives, IEEE Trans. Industrial Electronics 29(3). Resolution of the difference method: one count
// D = 2 pi/(4 N) per window T = W Ts, i.e. D/T rad/s = 60/(4 N T) rpm. First-order filter sampled
// exactly for a held input: Franklin, Powell and Workman, 1998, Digital Control of Dynamic Systems.
import { describe, expect, it } from 'vitest';
import { EncoderEstimator } from '../src/core/control/encoder-estimator';
import { wrapToPi } from '../src/core/control/angle-estimator';

const RAD_S_PER_RPM = Math.PI / 30;
const spec = (o: Partial<{ linesPerRev: number; speedWindowPeriods: number; speedFilter_Hz: number; offset_deg: number; timerFrequency_Hz: number }> = {}) =>
  ({ source: 'encoder' as const, linesPerRev: 1024, speedWindowPeriods: 4, speedFilter_Hz: 0, offset_deg: 0, ...o });

/** run at constant mechanical speed wm from mechanical angle th0; calls f after each sample */
function run(enc: EncoderEstimator, p: number, th0: number, wm: number, Ts: number, n: number, f: (k: number, thetaM: number) => void): void {
  enc.reset(wrapToPi(p * th0), p * wm);
  for (let k = 0; k < n; k++) {
    const th = th0 + wm * k * Ts;
    enc.sample(wrapToPi(p * th), wm, 0, 0, 0, 0, Ts);
    f(k, th);
  }
}

describe('encoder angle', () => {
  it('quantised to one count, 2 pi/(4 N) mechanical: 4N distinct angles a turn, the error in (-D, 0]', () => {
    const p = 3, N = 256, D = (2 * Math.PI) / (4 * N), Ts = 1e-4;
    const enc = new EncoderEstimator(spec({ linesPerRev: N }), p);
    const seen = new Set<number>();
    let lo = 0, hi = -1, sum = 0, sq = 0, n = 0;
    const wm = 2 * Math.PI * 0.25; // a quarter turn a second: 2.5e-4 turn per sample, 0.256 count
    run(enc, p, 1e-7, wm, Ts, 40000, (_k, th) => {
      const errM = wrapToPi(enc.thetaE - p * th) / p; // mechanical
      lo = Math.min(lo, errM); hi = Math.max(hi, errM); sum += errM; sq += errM * errM; n++;
      seen.add(Math.round(enc.count));
      // the reported angle is a whole number of counts, exactly
      expect(Math.abs(wrapToPi(enc.thetaE - p * enc.count * D))).toBeLessThan(1e-12);
    });
    expect(seen.size).toBe(4 * N); // one full turn
    expect(lo).toBeGreaterThan(-D * (1 + 1e-9));
    expect(lo).toBeLessThan(-D * 0.99);
    expect(hi).toBeLessThanOrEqual(1e-12);
    // uniform over a count: mean -D/2, rms about the mean D/sqrt(12)
    expect(sum / n / (-D / 2)).toBeCloseTo(1, 2);
    expect(Math.sqrt(sq / n - (sum / n) ** 2) / (D / Math.sqrt(12))).toBeCloseTo(1, 2);
  });
  it('the mounting offset shifts the reported angle by p times it (electrical)', () => {
    const p = 4, N = 2048, D = (2 * Math.PI) / (4 * N);
    const off = 0.5; // mechanical degrees
    const enc = new EncoderEstimator(spec({ linesPerRev: N, offset_deg: off }), p);
    let sum = 0, n = 0;
    run(enc, p, 0.1, 30, 1e-4, 5000, (_k, th) => { sum += wrapToPi(enc.thetaE - p * th); n++; });
    expect(sum / n / (p * ((off * Math.PI) / 180 - D / 2))).toBeCloseTo(1, 2);
  });
});

describe('encoder speed, difference method', () => {
  it('a whole number of resolution steps 60/(4 N T) rpm, bracketing the true speed, mean the true speed', () => {
    const p = 4, N = 1024, W = 4, Ts = 1e-4, T = W * Ts;
    const res_rpm = 60 / (4 * N * T); // 36.62 rpm
    expect(res_rpm).toBeCloseTo(36.62109375, 10);
    const enc = new EncoderEstimator(spec({ linesPerRev: N, speedWindowPeriods: W }), p);
    const true_rpm = 1000.3;
    let sum = 0, n = 0;
    const values = new Set<number>();
    run(enc, p, 0.01, true_rpm * RAD_S_PER_RPM, Ts, 20000, (k) => {
      const rpm = enc.omegaE / p / RAD_S_PER_RPM;
      const steps = rpm / res_rpm;
      expect(Math.abs(steps - Math.round(steps))).toBeLessThan(1e-9);
      expect(Math.abs(rpm - true_rpm)).toBeLessThan(res_rpm);
      values.add(Math.round(steps));
      if (k >= W) { sum += rpm; n++; }
    });
    expect([...values].sort()).toEqual([Math.floor(true_rpm / res_rpm), Math.ceil(true_rpm / res_rpm)]);
    expect(sum / n).toBeCloseTo(true_rpm, 0);
  });
  it('reverse rotation: the same resolution, negative', () => {
    const p = 2, N = 500, W = 8, Ts = 1e-4;
    const res_rpm = 60 / (4 * N * W * Ts);
    const enc = new EncoderEstimator(spec({ linesPerRev: N, speedWindowPeriods: W }), p);
    run(enc, p, 0.3, -500 * RAD_S_PER_RPM, Ts, 3000, () => {
      const rpm = enc.omegaE / p / RAD_S_PER_RPM;
      expect(Math.abs(rpm + 500)).toBeLessThan(res_rpm);
    });
  });
});

describe('encoder speed, edge timing', () => {
  it('at low speed the timer resolves what the difference method cannot', () => {
    const p = 4, N = 1024, W = 4, Ts = 1e-4, fT = 1e7;
    const true_rpm = 10; // 0.68 count per window: the difference method reads 0 or 36.6 rpm
    const enc = new EncoderEstimator(spec({ linesPerRev: N, speedWindowPeriods: W, timerFrequency_Hz: fT }), p);
    let worst = 0;
    run(enc, p, 0.01, true_rpm * RAD_S_PER_RPM, Ts, 20000, (k) => {
      if (k > 100) worst = Math.max(worst, Math.abs(enc.omegaE / p / RAD_S_PER_RPM - true_rpm));
    });
    // M/T: one timer tick over the time between edges (1.46 ms = 14648 ticks): relative 1/14648,
    // twice for the two stamps
    const edgeTicks = ((2 * Math.PI) / (4 * N) / (true_rpm * RAD_S_PER_RPM)) * fT;
    expect(worst / true_rpm).toBeLessThan(2 / edgeTicks);
    expect(worst).toBeGreaterThan(0);
  });
});

describe('encoder speed filter', () => {
  it('first order, exact for a held input: y[k] = w (1 - e^{-2 pi fc (k+1) Ts}) from rest', () => {
    const p = 1, N = 1000, D = (2 * Math.PI) / (4 * N), Ts = 1e-4, fc = 50;
    const enc = new EncoderEstimator(spec({ linesPerRev: N, speedWindowPeriods: 1, speedFilter_Hz: fc }), p);
    const wm = (3 * D) / Ts; // three counts a period, exactly
    const th0 = D / 2;
    enc.reset(th0, 0);
    for (let k = 0; k < 400; k++) {
      enc.sample(wrapToPi(th0 + wm * k * Ts), k === 0 ? 0 : wm, 0, 0, 0, 0, Ts);
      // the raw speed is 0 at the first sample (the primed window at rest), 3 counts per period after
      const expected = k === 0 ? 0 : wm * (1 - Math.exp(-2 * Math.PI * fc * k * Ts));
      expect(enc.omegaE).toBeCloseTo(expected, 6);
    }
  });
});
