// The load torque schedule (src/core/simulation/load-schedule.ts): piecewise-linear levels from
// steps and ramps. Common practice (no source): the expected levels follow from the definition.
import { describe, expect, it } from 'vitest';
import { loadSchedule, loadLevel, nextLoadBreak } from '../src/core/simulation/load-schedule';
import { InputError } from '../src/core/base/errors';

describe('load schedule', () => {
  it('a ramp starts from the level in force and a later step overrides a ramp still running', () => {
    const s = loadSchedule([{ t_s: 0.1, torque_Nm: 4 }, { t_s: 0.3, torque_Nm: -2 }], [{ t_s: 0.2, duration_s: 0.4, torque_Nm: 12 }]);
    expect(loadLevel(s, 0.15)).toBe(4);
    // halfway to 0.3 of a ramp 4 -> 12 over 0.4 s: 4 + 8 * 0.05 / 0.4 = 5
    expect(loadLevel(s, 0.25)).toBeCloseTo(5, 12);
    expect(loadLevel(s, 0.31)).toBe(-2);
    expect(loadLevel(s, 1)).toBe(-2);
    expect(nextLoadBreak(s, 0.2)).toBeCloseTo(0.3, 12);
    expect(nextLoadBreak(s, 0.35)).toBe(Infinity);
  });
  it('bad steps, ramps and k name their field', () => {
    expect(() => loadSchedule([{ t_s: -1, torque_Nm: 1 }])).toThrow(/scenario\.loadSteps\[0\]/);
    expect(() => loadSchedule([], [{ t_s: 0, duration_s: 0, torque_Nm: 1 }])).toThrow(/scenario\.loadRamps\[0\]/);
    expect(() => loadSchedule([], [], -1)).toThrow(InputError);
  });
});
