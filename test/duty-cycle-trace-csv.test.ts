import { describe, expect, it } from 'vitest';
import { parseCsv } from '../src/core/reports/csv';
import { DUTY_CYCLE_TRACE_CSV_HEADER, dutyCycleTraceCsv } from '../src/core/reports/duty-cycle-trace-csv';
import { evaluateDutyCycle } from '../src/core/simulation/duty-cycle';
import { conditions, project, sampledCycle, temperatureModel, THERMAL } from './duty-cycle-fixtures';

describe('duty cycle trace CSV', () => {
  it('one row per instant, numbers reading back to 10 significant digits, the reason outside the envelope named (csv.ts, common practice (no source))', () => {
    const s = sampledCycle([[0, 500, 0], [2, 500, 400], [4, 500, 0]], 0.5, 'a "quoted", label');
    const r = evaluateDutyCycle(s, THERMAL, temperatureModel(), conditions, project.peak, { solve: 'every-instant' })!;
    const rows = parseCsv(dutyCycleTraceCsv(r, ['# a comment, with a comma']));
    expect(rows[0]).toEqual(['# a comment, with a comma']);
    expect(rows[1]).toEqual([...DUTY_CYCLE_TRACE_CSV_HEADER]);
    expect(rows.length).toBe(2 + 9);
    const at = (k: number, c: string) => rows[2 + k]![DUTY_CYCLE_TRACE_CSV_HEADER.indexOf(c as never)]!;
    expect(Number(at(4, 't_s'))).toBe(2);
    expect(at(4, 'outside')).toBe('current');
    expect(at(0, 'outside')).toBe('');
    expect(Number(at(4, 'current_A_peak')) / r.traces.current_A[4]!).toBeCloseTo(1, 9);
    expect(Number(at(8, 'winding_C')) / r.traces.winding_C[8]!).toBeCloseTo(1, 9);
    expect(Number(at(3, 'junction_C')) / r.junction_C[3]!).toBeCloseTo(1, 9);
    expect(at(3, 'solved')).toBe('1');
  });
});
