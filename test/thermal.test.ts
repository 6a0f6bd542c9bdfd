import { describe, expect, it } from 'vitest';
import { COPPER_ALPHA_20, NDFEB_ALPHA_BR, SMCO_ALPHA_BR, fluxAt, machineAt, resistanceAt } from '../src/core/machine/thermal';

describe('copper resistance', () => {
  it('uses 0.00393 /K at 20 °C', () => {
    // IEC 60028, International standard of resistance for copper (annealed copper, alpha_20 = 0.00393 /K)
    expect(COPPER_ALPHA_20).toBe(0.00393);
  });

  it('worked numbers: 0.1 ohm at 20 °C is 0.13144 ohm at 100 °C and 0.09214 ohm at 0 °C', () => {
    // R(T) = R20 (1 + 0.00393 (T - 20)), IEC 60028
    expect(resistanceAt(0.1, 100)).toBeCloseTo(0.13144, 12);
    expect(resistanceAt(0.1, 0)).toBeCloseTo(0.09214, 12);
    expect(resistanceAt(0.1, 20)).toBe(0.1);
  });

  it('round trip through the inverse scaling', () => {
    const R20 = 0.42;
    const hot = resistanceAt(R20, 135);
    expect(hot / (1 + COPPER_ALPHA_20 * (135 - 20))).toBeCloseTo(R20, 14);
  });
});

describe('magnet flux', () => {
  it('NdFeB -0.0012 /K, SmCo -0.0004 /K', () => {
    // typical datasheet values, from memory
    expect(NDFEB_ALPHA_BR).toBe(-0.0012);
    expect(SMCO_ALPHA_BR).toBe(-0.0004);
  });

  it('worked numbers: 0.05 Wb at 20 °C is 0.0452 Wb at 100 °C with NdFeB', () => {
    // psi(T) = psi20 (1 + alpha (T - 20)) = 0.05 (1 - 0.096), conventions page
    expect(fluxAt(0.05, 100)).toBeCloseTo(0.0452, 12);
    expect(fluxAt(0.05, 100, SMCO_ALPHA_BR)).toBeCloseTo(0.0484, 12);
    expect(fluxAt(0.05, -20)).toBeCloseTo(0.0524, 12);
  });
});

describe('machineAt', () => {
  it('scales Rs by winding and psiM by magnet temperature, leaves L and p alone', () => {
    const m20 = { polePairs: 4, Rs: 0.2, Ld: 1e-3, Lq: 2e-3, psiM: 0.1 };
    const hot = machineAt(m20, 120, 80, -0.001);
    expect(hot.Rs).toBeCloseTo(0.2 * (1 + 0.00393 * 100), 14);
    expect(hot.psiM).toBeCloseTo(0.1 * (1 - 0.06), 14);
    expect(hot.Ld).toBe(1e-3);
    expect(hot.Lq).toBe(2e-3);
    expect(hot.polePairs).toBe(4);
    expect(m20.Rs).toBe(0.2); // input untouched
  });
});
