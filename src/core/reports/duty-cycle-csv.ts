/**
 * A duty cycle read from a CSV: one row per sample, a header naming the columns, the user saying
 * which column holds the time (s), the speed (rpm) and the torque (N·m); other columns are ignored.
 * The times must be strictly ascending; a cycle logged from another start is moved to start at 0 (the
 * shift said). The result is the project file's `dutyCycle` section.
 */
import { InputError } from '../base/errors';
import { MAX_DUTY_CYCLE_SAMPLES } from '../project/schema';
import { parseCsv } from './csv';

/** The columns of the CSV, by their header names. */
export interface DutyCycleColumns {
  t: string;
  speed: string;
  torque: string;
}

/** A duty cycle as the project file's `dutyCycle` section writes it, and the time subtracted to start it at 0. */
export interface DutyCycleFromCsv {
  section: { label: string; t_s: number[]; speed_rpm: number[]; torque_Nm: number[] };
  /** the first row's time, subtracted from every time (0 when the CSV starts at 0), s */
  shift_s: number;
}

const DECIMAL = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;
const FLAG: Record<keyof DutyCycleColumns, string> = { t: '--t', speed: '--speed', torque: '--torque' };
/** Significant digits of a shifted time (the subtraction's rounding noise dropped; 1 ns in 10 000 s kept). */
const TIME_DIGITS = 13;

/** The CSV text -> the duty cycle, or an InputError naming the column flag or the row. */
export function dutyCycleFromCsv(text: string, columns: DutyCycleColumns, label: string): DutyCycleFromCsv {
  const rows = parseCsv(text.replace(/^\uFEFF/, '')).filter((r) => !(r.length === 1 && r[0]!.trim() === ''));
  if (rows.length < 3) throw new InputError('CSV', `needs a header row naming the columns and at least two rows of samples (it has ${Math.max(0, rows.length - 1)})`);
  const n = rows.length - 1;
  if (n > MAX_DUTY_CYCLE_SAMPLES) throw new InputError('CSV', `has ${n} rows of samples; a duty cycle has at most ${MAX_DUTY_CYCLE_SAMPLES} (resample it more coarsely)`);
  const header = rows[0]!.map((h) => h.trim());
  const col = {} as Record<keyof DutyCycleColumns, number>;
  for (const k of Object.keys(FLAG) as (keyof DutyCycleColumns)[]) {
    const name = columns[k].trim();
    const at = header.indexOf(name);
    if (at < 0) throw new InputError(FLAG[k], `'${name}' is not a column of the CSV header (columns: ${header.map((h) => `'${h}'`).join(', ')})`);
    if (header.indexOf(name, at + 1) >= 0) throw new InputError(FLAG[k], `'${name}' names more than one column of the CSV header`);
    col[k] = at;
  }
  const t_s = new Array<number>(n), speed_rpm = new Array<number>(n), torque_Nm = new Array<number>(n);
  for (let r = 1; r <= n; r++) {
    const cells = rows[r]!;
    const value = (k: keyof DutyCycleColumns): number => {
      const s = (cells[col[k]] ?? '').trim();
      if (!DECIMAL.test(s)) throw new InputError(`CSV row ${r + 1}`, `column '${header[col[k]]}' (${FLAG[k]}) must be a number (got '${s.length > 40 ? s.slice(0, 40) + '…' : s}')`);
      return Number(s);
    };
    const t = value('t');
    if (r > 1 && !(t > t_s[r - 2]!)) {
      throw new InputError(`CSV row ${r + 1}`, `column '${header[col.t]}' (--t) is ${t} s, not after row ${r} (${t_s[r - 2]} s): the times must be strictly ascending`);
    }
    t_s[r - 1] = t;
    speed_rpm[r - 1] = value('speed');
    torque_Nm[r - 1] = value('torque');
  }
  const shift_s = t_s[0]!;
  if (shift_s !== 0) {
    for (let i = 0; i < n; i++) t_s[i] = Number((t_s[i]! - shift_s).toPrecision(TIME_DIGITS));
    for (let i = 1; i < n; i++) {
      if (!(t_s[i]! > t_s[i - 1]!)) throw new InputError(`CSV row ${i + 2}`, `column '${header[col.t]}' (--t): two times too close to tell apart once the cycle is moved to start at 0`);
    }
  }
  return { section: { label, t_s, speed_rpm, torque_Nm }, shift_s };
}
