// Unit conversions of the engine: speeds and sinusoidal amplitudes.
import { describe, expect, it } from 'vitest';
import { peakToRms, radSToRpm, RAD_S_TO_RPM, rmsToPeak, rpmToRadS, RPM_TO_RAD_S, SQRT2, SQRT3 } from '../src/core/base/units';

describe('units', () => {
  it('rpm and rad/s: 60 rpm is one revolution per second, 2 pi rad/s (common practice (no source))', () => {
    expect(rpmToRadS(60)).toBeCloseTo(2 * Math.PI, 14);
    expect(radSToRpm(2 * Math.PI)).toBeCloseTo(60, 12);
    expect(RPM_TO_RAD_S * RAD_S_TO_RPM).toBeCloseTo(1, 15);
    expect(radSToRpm(rpmToRadS(12345.678))).toBeCloseTo(12345.678, 9);
  });

  it('a sinusoid of peak A has rms A/sqrt(2) (common practice (no source))', () => {
    expect(peakToRms(SQRT2)).toBeCloseTo(1, 15);
    expect(rmsToPeak(318)).toBeCloseTo(449.72, 2); // 318 A rms is 449.7 A peak
    expect(peakToRms(rmsToPeak(7.5))).toBeCloseTo(7.5, 14);
    expect(SQRT3 * SQRT3).toBeCloseTo(3, 14);
  });
});
