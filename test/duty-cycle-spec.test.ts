import { describe, expect, it } from 'vitest';
import { isInputError } from '../src/core/base/errors';
import { assertDutyCycle, cycleInstants, rmsTorque } from '../src/core/simulation/duty-cycle-spec';
import { cycleOf } from './duty-cycle-fixtures';

const bad = (f: () => unknown): string => {
  try { f(); } catch (e) { if (isInputError(e)) return e.message; throw e; }
  return 'no error';
};

describe('duty cycle specification', () => {
  it('names the field and what is allowed', () => {
    expect(bad(() => assertDutyCycle(cycleOf([[0, 0, 0]])))).toMatch(/^dutyCycle\.t_s must hold at least two samples/);
    expect(bad(() => assertDutyCycle({ ...cycleOf([[0, 0, 0], [1, 0, 0]]), speed_rpm: new Float64Array(3) }))).toMatch(/^dutyCycle\.speed_rpm must hold one value per sample/);
    expect(bad(() => assertDutyCycle(cycleOf([[0, 0, 0], [1, Number.NaN, 0]])))).toMatch(/^dutyCycle\.speed_rpm\[1\] must be a finite number/);
    expect(bad(() => assertDutyCycle(cycleOf([[0, 0, 0], [2, 0, 0], [2, 0, 1]])))).toMatch(/^dutyCycle\.t_s\[2\] must be later than the sample before/);
    expect(bad(() => cycleInstants(cycleOf([[0, 0, 0], [1, 0, 0]]), 0))).toMatch(/^step must be a positive number/);
  });

  it('evaluation instants: the samples, or every step with linear interpolation and the last sample kept (common practice (no source))', () => {
    const s = cycleOf([[0, 0, 0], [1, 1000, 10], [3, 1000, -10]]);
    expect(Array.from(cycleInstants(s).t_s)).toEqual([0, 1, 3]);
    const x = cycleInstants(s, 0.4);
    expect(x.t_s.length).toBe(9);
    expect(x.t_s[8]).toBe(3);
    expect(x.speed_rpm[1]).toBeCloseTo(400, 12);
    expect(x.torque_Nm[1]).toBeCloseTo(4, 12);
    expect(x.torque_Nm[5]).toBeCloseTo(0, 12); // t = 2: halfway from 10 to -10
    expect(x.torque_Nm[7]).toBeCloseTo(-8, 12); // t = 2.8
  });

  it('RMS torque of a trapezoid profile against its closed-form integral T^2 (t_ramp/3 + t_hold + t_ramp/3) (integral of a squared linear function, common practice (no source))', () => {
    // 0 -> 120 N·m in 2 s, held 5 s, down in 3 s, zero for 10 s
    const s = cycleOf([[0, 0, 0], [2, 1000, 120], [7, 1000, 120], [10, 0, 0], [20, 0, 0]]);
    const exact = Math.sqrt((120 * 120 * (2 / 3 + 5 + 3 / 3)) / 20);
    expect(Math.abs(rmsTorque(s) - exact)).toBeLessThan(1e-12 * exact);
    // through zero: -50 -> 50 over 4 s, integral 4 (50^2)/3
    expect(rmsTorque(cycleOf([[0, 0, -50], [4, 0, 50]]))).toBeCloseTo(50 / Math.sqrt(3), 12);
  });
});
