import { describe, expect, it } from 'vitest';
import { point } from '../src/core/steady-state/point-of-current';
import { machineModel } from '../src/core/machine/linear-dq';

describe('operating point of a current', () => {
  it('voltage and torque by hand (Krause, Wasynczuk and Sudhoff (2002), Analysis of Electric Machinery and Drive Systems, ch. 5)', () => {
    // invented machine; at id = -100, iq = 200, 250 rad/s mechanical (we = 1000 rad/s):
    // vd = 0.03·(-100) - 1000·0.6e-3·200 = -123, vq = 0.03·200 + 1000·(0.25e-3·(-100) + 0.05) = 31
    // T = 1.5·4·200·(0.05 + (0.25e-3 - 0.6e-3)·(-100)) = 102 N·m
    const m = machineModel({ polePairs: 4, Rs: 0.03, Ld: 0.25e-3, Lq: 0.6e-3, psiM: 0.05 });
    const p = point(m, 250, -100, 200, 'field-weakening');
    expect(p.vd).toBeCloseTo(-123, 10);
    expect(p.vq).toBeCloseTo(31, 10);
    expect(p.voltage).toBeCloseTo(Math.hypot(123, 31), 10);
    expect(p.torque).toBeCloseTo(102, 10);
    expect(p.current).toBeCloseTo(Math.hypot(100, 200), 10);
    expect(p.region).toBe('field-weakening');
    expect(p.feasible).toBe(true);
    expect(p.limitedBy).toBe('none');
  });
});
