import { describe, expect, it } from 'vitest';
import { stepSchedule, scheduleValue } from '../src/core/control/step-schedule';

// common practice (no source): a piecewise-constant reference, each step in force from its time on
describe('step schedule', () => {
  const s = stepSchedule(5, [{ t: 0.3, v: -2 }, { t: 0.1, v: 7 }]);
  it('sorts the steps by time', () => {
    expect(Array.from(s.times)).toEqual([0.1, 0.3]);
    expect(Array.from(s.values)).toEqual([7, -2]);
  });
  it('holds the initial value before the first step and each step from its time on', () => {
    expect(scheduleValue(s, 0)).toBe(5);
    expect(scheduleValue(s, 0.1)).toBe(7);
    expect(scheduleValue(s, 0.29)).toBe(7);
    expect(scheduleValue(s, 0.3)).toBe(-2);
    expect(scheduleValue(s, 99)).toBe(-2);
  });
});
