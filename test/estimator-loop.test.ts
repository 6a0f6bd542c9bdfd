// The estimator's loop in the tuning (src/core/control/estimator-loop.ts). Type II loop closed forms:
// Gardner, 2005, Phaselock Techniques, 3rd ed., ch. 2 (kp = 2 zeta wn, ki = wn^2; the -3 dB bandwidth);
// the crossover and phase margin of L = (kp s + ki)/s^2 derived here from |L| = 1 and arg L (standard
// derivation). The window mean (1 - e^{-sT})/(sT): common practice (no source).
import { describe, expect, it } from 'vitest';
import { bodeMargins, estimatorLoop, type2Margins } from '../src/core/control/estimator-loop';
import type { LoopReport } from '../src/core/control/tuning';
import { demoJson } from './helpers';
import { loadProjectText } from '../src/core/project/project';
import { tuneFromProject } from '../src/core/project/tuning-from-project';

/** a speed loop whose open loop is 0 dB and -120 deg flat (margins read straight through the estimator) */
function flatSpeed(bandwidth_Hz: number | null): LoopReport {
  const f = Array.from({ length: 400 }, (_, i) => 1 * 10 ** (i / 100));
  return { bode: { f_Hz: f, mag_dB: f.map((x) => -20 * Math.log10(x / 100)), phase_deg: f.map(() => -120) }, bandwidth_Hz: bandwidth_Hz, phaseMargin_deg: 60 } as unknown as LoopReport;
}

describe('estimator loop', () => {
  it('type II closed forms: zeta = 1 gives kp = 2 wn, ki = wn^2, crossover sqrt(2 + sqrt 5) wn, PM atan(2 sqrt(2 + sqrt 5)) (Gardner 2005)', () => {
    const wn = 500;
    const m = type2Margins(2 * wn, wn * wn);
    expect(m.crossover_rad_s / wn).toBeCloseTo(Math.sqrt(2 + Math.sqrt(5)), 12);
    expect(m.phaseMargin_deg).toBeCloseTo((Math.atan(2 * Math.sqrt(2 + Math.sqrt(5))) * 180) / Math.PI, 10);
    // |L(j wc)| = 1 exactly
    const wc = m.crossover_rad_s;
    expect(Math.hypot(2 * wn * wc, wn * wn) / (wc * wc)).toBeCloseTo(1, 12);
  });
  it('resolver 300 Hz, zeta 0.707: wn from the bandwidth formula, gains, the speed estimate ki/(s^2 + kp s + ki) at -3 dB', () => {
    const r = estimatorLoop({ source: 'resolver', bandwidth_Hz: 300, damping: 0.707 }, 1e-4, flatSpeed(20))!;
    const z = 0.707, b = 1 + 2 * z * z, wn = (2 * Math.PI * 300) / Math.sqrt(b + Math.sqrt(b * b + 1));
    expect(r.report.naturalFrequency_rad_s!).toBeCloseTo(wn, 9);
    expect(r.report.kp!).toBeCloseTo(2 * z * wn, 9);
    expect(r.report.ki!).toBeCloseTo(wn * wn, 6);
    // |ki/(ki - w^2 + j kp w)|^2 = 1/2 at w^2 = wn^2 (1 - 2 z^2 + sqrt((1 - 2 z^2)^2 + 1))
    const a = 1 - 2 * z * z, w3 = wn * Math.sqrt(a + Math.sqrt(a * a + 1));
    expect(r.report.speedBandwidth_Hz / (w3 / (2 * Math.PI))).toBeCloseTo(1, 6);
    expect(r.finding).toBeNull();
  });
  it('encoder window N Ts: the speed estimate\'s -3 dB where sin(x)/x = 1/sqrt 2 (x = 1.3916), lag N Ts/2 in the speed loop\'s phase', () => {
    const Ts = 1 / 16000, N = 8;
    const r = estimatorLoop({ source: 'encoder', linesPerRev: 2048, speedWindowPeriods: N, speedFilter_Hz: 0, offset_deg: 0 }, Ts, flatSpeed(400))!;
    expect(r.report.speedBandwidth_Hz).toBeCloseTo((2 * 1.39155737 / (N * Ts)) / (2 * Math.PI), 2);
    // through the estimator the flat -120 deg loop loses w N Ts/2 at its crossover (near 100 Hz: |sinc| ~ 1)
    const fc = r.report.speedLoop.crossover_Hz!;
    expect(r.report.speedLoop.phaseMargin_deg!).toBeCloseTo(60 - (2 * Math.PI * fc * N * Ts * 180) / (2 * Math.PI), 1);
    // bandwidth 400 Hz above a third of ~886 Hz: the finding
    expect(r.finding?.code).toBe('speed-loop-near-estimator');
  });
  it('bodeMargins: interpolated 0 dB crossing and 180 + phase there', () => {
    const m = bodeMargins(flatSpeed(null).bode);
    expect(m.crossover_Hz!).toBeCloseTo(100, 6);
    expect(m.phaseMargin_deg!).toBeCloseTo(60, 9);
  });
  it('the 48 V demo (sensorless, 1000 Hz PLL, speed loop tuned to 60 Hz): at least 45 deg of phase margin through the estimator and no finding (45 deg: common practice, no source)', () => {
    const r = tuneFromProject(loadProjectText(JSON.stringify(demoJson('demo-spm-48v'))));
    const through = r.estimator!.speedLoop;
    // measured 54.9 deg at 60.2 Hz; 72.1 deg with the true angle: the estimator's lag costs about 17 deg
    expect(through.phaseMargin_deg!).toBeGreaterThan(45);
    expect(r.speed.phaseMargin_deg! - through.phaseMargin_deg!).toBeGreaterThan(10);
    expect(r.warnings.some((w) => w.code === 'speed-loop-near-estimator')).toBe(false);
  });
  it('tune of the demos: each reports its estimator; the ideal copy none', () => {
    for (const [name, source] of [['demo-servo-axis', 'encoder'], ['demo-ipm-traction', 'resolver'], ['demo-spm-48v', 'sensorless']] as const) {
      const o = demoJson(name);
      expect(tuneFromProject(loadProjectText(JSON.stringify(o))).estimator?.source).toBe(source);
      o.control.angle = { source: 'ideal' };
      const r = tuneFromProject(loadProjectText(JSON.stringify(o)));
      expect(r.estimator).toBeUndefined();
      // the interpolated margins of the speed loop's Bode agree with the sampled loop's bisected ones
      const m = bodeMargins(r.speed.bode);
      expect(m.crossover_Hz! / r.speed.crossover_Hz!).toBeCloseTo(1, 3);
      expect(m.phaseMargin_deg!).toBeCloseTo(r.speed.phaseMargin_deg!, 1);
    }
  });
});
