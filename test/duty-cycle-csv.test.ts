// A duty cycle from a CSV (src/core/reports/duty-cycle-csv.ts): columns chosen by header name, other
// columns ignored, a cycle logged from another start moved to start at 0, and refusals naming the
// flag or the row. CSV syntax: Shafranovich (2005), RFC 4180, "Common Format and MIME Type for
// Comma-Separated Values (CSV) Files"; the rest: common practice (no source).
import { describe, expect, it } from 'vitest';
import { refusal } from './helpers';
import { dutyCycleFromCsv } from '../src/core/reports/duty-cycle-csv';
import { MAX_DUTY_CYCLE_SAMPLES } from '../src/core/project/schema';

const COLS = { t: 'time_s', speed: 'n_rpm', torque: 'T_Nm' };
const refused = (text: string, cols = COLS): string => {
  const e = refusal(() => dutyCycleFromCsv(text, cols, 'x'));
  return e.message;
};

describe('dutyCycleFromCsv', () => {
  it('reads the chosen columns in row order, ignoring others, quoted headers and a byte-order mark', () => {
    const text = '\uFEFFtime_s,"note, free",n_rpm,T_Nm\r\n0,start,0,2.5\r\n0.1,"a, b",3000,2.5\r\n0.35,,-50.5,-1e0\r\n\r\n';
    const r = dutyCycleFromCsv(text, COLS, 'move');
    expect(r).toEqual({ section: { label: 'move', t_s: [0, 0.1, 0.35], speed_rpm: [0, 3000, -50.5], torque_Nm: [2.5, 2.5, -1] }, shift_s: 0 });
  });

  it('a cycle logged from another start is moved to start at 0, the shift said', () => {
    const r = dutyCycleFromCsv('time_s,n_rpm,T_Nm\n12.34,0,1\n12.35,10,1\n13.34,20,0\n', COLS, 'log');
    expect(r.shift_s).toBe(12.34);
    expect(r.section.t_s).toEqual([0, 0.01, 1]); // 12.35 - 12.34 is 0.00999999999999979 before rounding to 13 digits
  });

  it('refuses a missing or repeated column, naming the flag and the header', () => {
    expect(refused('time_s,n_rpm,torque\n0,0,0\n1,1,1\n')).toBe("--torque 'T_Nm' is not a column of the CSV header (columns: 'time_s', 'n_rpm', 'torque')");
    expect(refused('time_s,n_rpm,T_Nm,n_rpm\n0,0,0,0\n1,1,1,1\n')).toBe("--speed 'n_rpm' names more than one column of the CSV header");
  });

  it('refuses a time that does not advance, naming the row (the header is row 1)', () => {
    expect(refused('time_s,n_rpm,T_Nm\n0,0,0\n0.1,1,1\n0.1,2,2\n')).toBe("CSV row 4 column 'time_s' (--t) is 0.1 s, not after row 3 (0.1 s): the times must be strictly ascending");
    expect(refused('time_s,n_rpm,T_Nm\n0,0,0\n0.2,1,1\n0.1,2,2\n')).toBe("CSV row 4 column 'time_s' (--t) is 0.1 s, not after row 3 (0.2 s): the times must be strictly ascending");
  });

  it('refuses NaN, an empty cell, text and a hexadecimal number, naming the row and the column', () => {
    expect(refused('time_s,n_rpm,T_Nm\n0,0,0\n1,NaN,1\n')).toBe("CSV row 3 column 'n_rpm' (--speed) must be a number (got 'NaN')");
    expect(refused('time_s,n_rpm,T_Nm\n0,0,0\n1,1,\n')).toBe("CSV row 3 column 'T_Nm' (--torque) must be a number (got '')");
    expect(refused('time_s,n_rpm,T_Nm\n0,0,0\n1,1,Infinity\n')).toBe("CSV row 3 column 'T_Nm' (--torque) must be a number (got 'Infinity')");
    expect(refused('time_s,n_rpm,T_Nm\n0x0,0,0\n1,1,1\n')).toBe("CSV row 2 column 'time_s' (--t) must be a number (got '0x0')");
  });

  it('refuses fewer than two samples and more than the cap', () => {
    expect(refused('time_s,n_rpm,T_Nm\n0,0,0\n')).toBe('CSV needs a header row naming the columns and at least two rows of samples (it has 1)');
    const many = ['time_s,n_rpm,T_Nm', ...Array.from({ length: MAX_DUTY_CYCLE_SAMPLES + 1 }, (_, i) => `${i},0,0`)].join('\n');
    expect(refused(many)).toBe(`CSV has ${MAX_DUTY_CYCLE_SAMPLES + 1} rows of samples; a duty cycle has at most ${MAX_DUTY_CYCLE_SAMPLES} (resample it more coarsely)`);
  });
});
