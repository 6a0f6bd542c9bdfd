import { describe, expect, it } from 'vitest';
import { sensorlessValidity } from '../src/core/control/sensorless-validity';
import { correctionGains, correctionWeight } from '../src/core/control/sensorless-active-flux';
import type { SensorlessAngle } from '../src/core/control/angle-spec';

// The region where the observer is not valid: below 5 % of the rated back-EMF (common practice, no
// source; we psiM is proportional to speed) and where the current model's weight |W| exceeds 1/2
// (the correction's steady weight, checked here against the discrete loop at a short period).
const spec: SensorlessAngle = { source: 'sensorless', bandwidth_Hz: 100, handoverSpeed_rpm: 300, fluxError_pct: 0, resistanceError_pct: 0, inductanceError_pct: 0 };
const spm = { polePairs: 5, Rs: 0.012, Ld: 4.5e-5, Lq: 4.5e-5, psiM: 0.0095 };

describe('sensorless validity finding', () => {
  it('5 % of rated back-EMF at 5 % of rated speed; |W| = 1/2 at the correction speed (the weight of the discrete loop at Ts = 1e-6)', () => {
    const v = sensorlessValidity(spec, spm, 3000);
    expect(v.backEmfSpeed_rpm).toBeCloseTo(150, 9);
    const we = (v.correctionSpeed_rpm * 2 * Math.PI * 5) / 60;
    const { kp, ki } = correctionGains(10);
    const W = new Float64Array(2);
    correctionWeight(kp, ki, we, 1e-6, W);
    expect(Math.hypot(W[0]!, W[1]!)).toBeCloseTo(0.5, 4);
    expect(v.minSpeed_rpm).toBe(Math.max(150, v.correctionSpeed_rpm));
    expect(v.finding.severity).toBe('info');
    expect(v.finding.message).toMatch(/not valid below \d+ rpm.*hands over above it/);
  });
  it('a hand-over inside the region is a warning naming the field and the speed to reach', () => {
    const v = sensorlessValidity({ ...spec, handoverSpeed_rpm: 50 }, spm, 3000);
    expect(v.finding.severity).toBe('warning');
    expect(v.finding.field).toBe('control.angle.handoverSpeed_rpm');
    expect(v.finding.message).toContain(`at least ${v.minSpeed_rpm.toFixed(0)} rpm`);
  });
});
