import { describe, expect, it } from 'vitest';
import { rpmText, sig3, speedError, speedErrorRange } from '../src/renderer/src/components/trace-scales';

describe('load-step trace scales', () => {
  it('speed error is reference minus speed', () => {
    expect(Array.from(speedError(Float64Array.from([3000, 3000, 3000]), Float64Array.from([3000, 2975, 2990])))).toEqual([0, 25, 10]);
  });

  it('the error axis zooms around the dips: a 25 rpm dip fills the plot whatever the run speed', () => {
    expect(speedErrorRange([{ dip_rpm: 25 }])).toEqual([-10, 35]);
    expect(speedErrorRange([{ dip_rpm: 10 }, { dip_rpm: null }, { dip_rpm: 25 }])).toEqual([-10, 35]);
    expect(speedErrorRange([])).toBeNull();
    expect(speedErrorRange([{ dip_rpm: null }])).toBeNull();
  });

  it('figures to meaningful digits', () => {
    expect(rpmText(2999.87)).toBe('3000');
    expect(rpmText(24.96)).toBe('25.0');
    expect(rpmText(0.123)).toBe('0.12');
    expect(sig3(15.7512)).toBe('15.8');
    expect(sig3(0.045678)).toBe('0.0457');
    expect(sig3(12345.6)).toBe('12346');
    expect(sig3(0)).toBe('0');
  });
});
