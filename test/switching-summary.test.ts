// The switching result from a capture (src/core/simulation/switching-summary.ts), on a capture
// written by hand with known content: a phase current with a 5th harmonic, a dead-time voltage error
// that is a square wave against the current, a known ripple and DC-link integrals.
import { describe, expect, it } from 'vitest';
import { SwitchingCapture } from '../src/core/simulation/switching-capture';
import { switchingSummary, ANALYSIS_CYCLES } from '../src/core/simulation/switching-summary';
import type { PwmSpec } from '../src/core/drive/pwm-spec';

const spec: PwmSpec = { model: 'switching', fsw_Hz: 10000, updatesPerPeriod: 1, deadTime_s: 2e-6, modulation: 'svpwm', Vdc: 300, deviceDrop_V: 0, zeroCurrent_A: 0.01 };

/** A capture of `periods` carrier periods at fe Hz electrical: ia = 100 cos + 4 cos 5, the legs' error -E sgn(i_x). */
function synthetic(periods: number, fe: number, E: number, window: { from_s: number; to_s: number } | null = null): SwitchingCapture {
  const c = new SwitchingCapture(periods, window, spec.fsw_Hz);
  const Tc = 1 / spec.fsw_Hz;
  const cur = (th: number, shift: number): number => 100 * Math.cos(th - shift) + 4 * Math.cos(5 * (th - shift));
  for (let k = 0; k < periods; k++) {
    const t = k * Tc, th = 2 * Math.PI * fe * t, thm = 2 * Math.PI * fe * (t + Tc / 2);
    const j = c.slot();
    c.t[j] = t; c.theta[j] = th; c.ia[j] = cur(th, 0);
    c.p2p[j] = 5 + Math.abs(Math.sin(th));
    c.ea[j] = -E * Math.sign(cur(thm, 0)); c.eb[j] = -E * Math.sign(cur(thm, (2 * Math.PI) / 3)); c.ec[j] = -E * Math.sign(cur(thm, (-2 * Math.PI) / 3));
    c.idc[j] = 50 * Tc; c.idc2[j] = 3000 * Tc; c.span[j] = Tc;
    const w = c.window, i = w.slot();
    w.t[i] = t; w.ia[i] = cur(th, 0);
  }
  c.tEnd = periods * Tc; c.thetaEnd = 2 * Math.PI * fe * c.tEnd; c.iaEnd = cur(c.thetaEnd, 0);
  return c;
}

describe('switching summary', () => {
  it('THD and harmonics of the valley current over whole fundamental periods: 4/100 (common practice, no source); the analysed span ends at the run\'s end', () => {
    const r = switchingSummary(synthetic(3000, 50, 0), spec);
    expect(r.analysed.cycles).toBe(ANALYSIS_CYCLES);
    expect(r.analysed.to_s).toBeCloseTo(0.3, 12);
    expect(r.analysed.from_s).toBeCloseTo(0.3 - ANALYSIS_CYCLES / 50, 6);
    expect(r.fundamental_Hz).toBeCloseTo(50, 9);
    expect(r.thdMaxHarmonic).toBe(40);
    expect(r.harmonics_A[1]).toBeCloseTo(100, 1);
    expect(Math.abs(r.harmonics_A[5]! / 4 - 1)).toBeLessThan(0.003); // linear resampling, 200 valleys per period
    expect(r.thd).toBeCloseTo(0.04, 3);
  });

  it('dead-time error: the fundamental of a square wave of amplitude E on each leg, common mode removed, is (4/pi) E (Murai, Watanabe and Iwasaki 1987)', () => {
    const E = 300 * 2e-6 * 10000; // Vdc td fsw
    const r = switchingSummary(synthetic(3000, 50, E), spec);
    expect(r.deadTimeVoltageError_V / ((4 / Math.PI) * E)).toBeCloseTo(1, 2);
  });

  it('ripple, envelope and DC-link current over the analysed periods; the default window the last two fundamental periods', () => {
    const r = switchingSummary(synthetic(3000, 50, 0), spec);
    expect(r.ripplePeakToPeak_A.max).toBeCloseTo(6, 3);
    expect(r.ripplePeakToPeak_A.mean).toBeCloseTo(5 + 2 / Math.PI, 2); // mean of |sin|
    const env = r.rippleEnvelope;
    expect(env.angle_rad.length).toBe(env.peakToPeak_A.length);
    expect(Math.max(...env.peakToPeak_A)).toBeCloseTo(6, 2);
    expect(r.dcLink.mean_A).toBeCloseTo(50, 9);
    expect(r.dcLink.rms_A).toBeCloseTo(Math.sqrt(3000), 9);
    expect(r.dcLink.rippleRms_A).toBeCloseTo(Math.sqrt(3000 - 2500), 9);
    expect(r.window.t_s[r.window.t_s.length - 1]).toBeCloseTo(0.2999, 9);
    expect(r.window.t_s[0]).toBeGreaterThanOrEqual(0.2999 - 2 / 50 - 1e-9);
    expect(r.window.t_s[0]).toBeLessThan(0.2999 - 2 / 50 + 2e-4);
  });

  it('without a whole fundamental period the harmonic figures are NaN and the ripple takes every period', () => {
    const r = switchingSummary(synthetic(100, 50, 0), spec); // 10 ms: half a period
    expect(r.analysed.cycles).toBe(0);
    expect(Number.isNaN(r.thd) && Number.isNaN(r.deadTimeVoltageError_V)).toBe(true);
    expect(r.ripplePeakToPeak_A.max).toBeGreaterThan(5);
    expect(r.dcLink.mean_A).toBeCloseTo(50, 9);
  });
});
