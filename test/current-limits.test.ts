import { describe, expect, it } from 'vitest';
import { parseCsv } from '../src/core/reports/csv';
import { describeLimit, describeLimits, effectiveCurrentLimits, limitField } from '../src/core/drive/current-limits';
import { computeEnvelopes, computeVerdicts } from '../src/renderer/src/state/compute';
import { envelopeCsv } from '../src/renderer/src/components/exports';
import { resolveProject } from '../src/core/project/project';
import { parseProject } from '../src/core/project/schema';
import { demoJson } from './helpers';

// The drive's current is limited by the weaker of motor and inverter: common practice (no source).
describe('effectiveCurrentLimits', () => {
  it('takes the weaker rating and says which binds', () => {
    const l = effectiveCurrentLimits({ Imax: 450, Icont: 250 }, 160 * Math.SQRT2, 318 * Math.SQRT2);
    expect(l.peak.A).toBeCloseTo(449.720, 3); // 318 A rms = 449.72 A peak < 450
    expect(l.peak.binds).toBe('motor');
    expect(l.continuous.A).toBeCloseTo(226.274, 3); // 160 A rms = 226.27 A peak < 250
    expect(l.continuous.binds).toBe('motor');
    expect(l.continuous.inverter_A).toBe(250);
  });
  it('is the inverter alone when the motor gives no currents', () => {
    const l = effectiveCurrentLimits({ Imax: 15, Icont: 5.5 });
    expect(l.peak).toEqual({ A: 15, binds: 'inverter', inverter_A: 15 });
    expect(l.continuous).toEqual({ A: 5.5, binds: 'inverter', inverter_A: 5.5 });
  });
  it('never lets the continuous limit exceed the effective peak', () => {
    const l = effectiveCurrentLimits({ Imax: 20, Icont: 18 }, undefined, 12);
    expect(l.peak.A).toBe(12);
    expect(l.continuous.A).toBe(12);
    expect(l.continuous.binds).toBe('motor');
  });
});

describe('motor section currents', () => {
  it('a motor peak current below the inverter Imax sets the envelope limit and warns on Icont above rated', () => {
    const j = demoJson('demo-servo-axis');
    j.motor.peakCurrent = 12;
    j.motor.ratedCurrent = 4.5;
    const p = resolveProject(parseProject(j));
    expect(p.peak.Imax).toBe(12);
    expect(p.currentLimits.peak.binds).toBe('motor');
    expect(p.continuous.Imax).toBe(4.5);
    const f = p.findings.find((x) => x.code === 'icont-above-motor-rated');
    expect(f?.field).toBe('inverter.Icont');
    expect(p.findings.find((x) => x.code === 'imax-above-motor-peak')?.field).toBe('inverter.Imax');
  });
  it('refuses a rated current above the peak current, naming the field', () => {
    const j = demoJson('demo-servo-axis');
    j.motor.peakCurrent = 4;
    j.motor.ratedCurrent = 5;
    expect(() => parseProject(j)).toThrow(/motor\.ratedCurrent.*must be <= motor\.peakCurrent/);
  });
});

describe('which limit binds, in words', () => {
  it('describeLimit gives peak and rms and the binding rating; limitField names its field', () => {
    const l = effectiveCurrentLimits({ Imax: 450, Icont: 226 }, 160 * Math.SQRT2, 318 * Math.SQRT2);
    // 318 A rms = 449.7 A peak (a sine's peak is √2 times its rms: common practice (no source))
    expect(describeLimit('peak', l.peak)).toBe('peak 449.7 A peak (318 A rms): motor');
    expect(describeLimit('continuous', l.continuous)).toBe('continuous 226 A peak (159.8 A rms): inverter');
    expect(describeLimits(l)).toBe('current limits: peak 449.7 A peak (318 A rms): motor; continuous 226 A peak (159.8 A rms): inverter');
    expect(limitField('peak', l.peak)).toBe('motor.peakCurrent');
    expect(limitField('peak', l.peak, 'nameplate')).toBe('nameplate.peakCurrent');
    expect(limitField('continuous', l.continuous)).toBe('inverter.Icont');
  });

  it("the app's envelope CSV states the effective limits and which binds (traction demo: the motor's 318 A rms)", () => {
    const p = resolveProject(parseProject(demoJson('demo-ipm-traction')));
    const env = computeEnvelopes(p, { points: 5, speedMax: null });
    const csv = envelopeCsv({ ...env, ...computeVerdicts(p, env.speedMax) });
    const head = parseCsv(csv).map((row) => row[0] ?? '').filter((c) => c.startsWith('#'));
    expect(head).toContain('# current limits: peak 449.7 A peak (318 A rms): motor; continuous 226 A peak (159.8 A rms): inverter; Vmax 190.871999 V peak phase');
    // the curves are drawn at the effective limit: the standstill current of the peak curve is 449.7 A
    const first = parseCsv(csv).find((row) => row[0] === 'peak-hot-motoring')!;
    expect(Number(first[6])).toBeCloseTo(318 * Math.SQRT2, 3);
  });
});
