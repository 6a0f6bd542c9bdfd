import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { defaultTableStep, envelopeTable, parseTableStep } from '../src/core/steady-state/envelope-table';
import { computeEnvelope } from '../src/core/steady-state/envelope';
import { mtpaTorque } from '../src/core/steady-state/mtpa';
import { loadProjectText } from '../src/core/project/project';
import { isInputError } from '../src/core/base/errors';

const servo = loadProjectText(readFileSync(join(__dirname, '..', 'resources', 'demo-servo-axis.json'), 'utf8'));

describe('envelope table at round speeds', () => {
  it('defaults to a 1-2-5 step giving 9 to 21 rows', () => {
    expect(defaultTableStep(6300)).toBe(500); // 6300/20 = 315 -> 500: rows 0..6000, 13
    expect(defaultTableStep(12960)).toBe(1000);
    expect(defaultTableStep(2000)).toBe(100);
    for (const top of [137, 999, 1000, 4321, 6825, 12960, 77777]) {
      const rows = Math.floor(top / defaultTableStep(top)) + 1;
      expect(rows).toBeGreaterThanOrEqual(9);
      expect(rows).toBeLessThanOrEqual(21);
    }
  });
  it('gives each corner the peak and continuous torque at every step, solved by the engine', () => {
    const rows = envelopeTable(servo.hot, servo.peak, servo.continuous, 6300, 500);
    expect(rows.map((r) => r.speed_rpm)).toEqual([0, 500, 1000, 1500, 2000, 2500, 3000, 3500, 4000, 4500, 5000, 5500, 6000]);
    // standstill: MTPA torque at the current limit (no voltage limit at zero speed), both limits
    expect(rows[0]!.peakMotoring_Nm).toBeCloseTo(mtpaTorque(servo.hot, servo.peak.Imax), 6);
    expect(rows[0]!.continuousMotoring_Nm).toBeCloseTo(mtpaTorque(servo.hot, servo.continuous.Imax), 6);
    expect(rows[0]!.peakGenerating_Nm).toBeCloseTo(-mtpaTorque(servo.hot, servo.peak.Imax), 6);
    expect(rows[0]!.peakMotoring_kW).toBe(0);
    // at 3000 rpm the table agrees with an envelope sampled there (3000 rpm is sample 30 of 0..6300 in 63 steps of 100)
    const env = computeEnvelope(servo.hot, servo.peak, { points: 64, speedMax: (6300 * Math.PI) / 30 });
    expect(rows[6]!.peakMotoring_Nm).toBeCloseTo(env.torque[30]!, 8);
    expect(rows[6]!.peakMotoring_kW).toBeCloseTo(env.power[30]! / 1000, 8);
    // the continuous curve ends at 5551 rpm hot (its maximum speed): none at 6000 rpm, some at 5500
    expect(rows[12]!.continuousMotoring_Nm).toBeNull();
    expect(rows[12]!.continuousMotoring_kW).toBeNull();
    expect(rows[11]!.continuousMotoring_Nm!).toBeGreaterThan(0);
  });
  it('refuses a step that is not positive or gives too many rows, naming the field', () => {
    for (const step of [0, -5, NaN]) {
      try {
        envelopeTable(servo.hot, servo.peak, servo.continuous, 6300, step, '--step');
        expect.unreachable();
      } catch (e) {
        expect(isInputError(e)).toBe(true);
        expect((e as Error).message).toMatch(/^--step must be a speed step > 0 rpm/);
      }
    }
    expect(() => envelopeTable(servo.hot, servo.peak, servo.continuous, 6300, 1, '--step')).toThrow(/--step gives more than 500 rows .* use a step >= 13 rpm/);
  });
  it('reads a typed step: blank for the default, a positive number of rpm, else says what is allowed', () => {
    expect(parseTableStep('  ', 6300)).toEqual({ step: undefined });
    expect(parseTableStep('250', 6300)).toEqual({ step: 250 });
    expect(parseTableStep('0', 6300)).toEqual({ message: "must be a speed step > 0 rpm (got '0'), or blank for the default" });
    expect(parseTableStep('0x10', 6300)).toHaveProperty('message');
    expect(parseTableStep('10', 6300)).toEqual({ message: 'gives more than 500 rows; use a step >= 13 rpm' });
  });
});
