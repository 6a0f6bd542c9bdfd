/**
 * The `dutyCycle` section of a project file: the application's load cycle as three columns of
 * samples, { label?, t_s[], speed_rpm[], torque_Nm[] }, linear in between (equal lengths, at least 2;
 * t_s from 0, strictly ascending). A cycle sampled at 10 ms for half an hour has 180 000 samples, so
 * the columns are checked by one tight loop each rather than element by element through zod, and a
 * problem names the first bad sample, e.g. `dutyCycle.t_s[17] must be > dutyCycle.t_s[16] (0.16 s)`.
 */
import { z } from 'zod';
import { KEYS, keyDoc as doc, MAX_DUTY_CYCLE_SAMPLES } from './schema-keys';

export { MAX_DUTY_CYCLE_SAMPLES };

const COLUMNS = ['t_s', 'speed_rpm', 'torque_Nm'] as const;
type Column = (typeof COLUMNS)[number];
/** Bounds of each column's values (the requirements' speed and torque bounds; about 115 days of time). */
const BOUNDS: Record<Column, readonly [number, number]> = { t_s: [0, 1e7], speed_rpm: [-1e6, 1e6], torque_Nm: [-1e6, 1e6] };

const column = (key: Column) => {
  const path = `dutyCycle.${key}`;
  const { unit, doc: what } = KEYS[path]!;
  return z
    .custom<number[]>((v) => Array.isArray(v), {
      error: (iss) => (iss.input === undefined ? `is required (${what})` : `must be a list [ ... ] of numbers in ${unit}`),
    })
    .describe(doc(path));
};

const shown = (v: unknown): string => {
  const s = typeof v === 'string' ? `'${v}'` : JSON.stringify(v) ?? String(v);
  return s.length > 40 ? `${s.slice(0, 40)}…` : s;
};

/** The first problem of one column (its values' type and bounds; times from 0 and strictly ascending), or none. */
function columnProblem(key: Column, xs: readonly unknown[]): { index: number; message: string } | null {
  const [lo, hi] = BOUNDS[key];
  const unit = KEYS[`dutyCycle.${key}`]!.unit;
  const n = xs.length;
  for (let i = 0; i < n; i++) {
    const x = xs[i];
    if (typeof x !== 'number' || !(x >= lo && x <= hi)) {
      if (typeof x !== 'number') return { index: i, message: `must be a number in ${unit} (it is ${shown(x)})` };
      if (!Number.isFinite(x)) return { index: i, message: `must be a finite number in ${unit}` };
      return { index: i, message: `must be ${x < lo ? `>= ${lo}` : `<= ${hi}`} ${unit}` };
    }
  }
  if (key !== 't_s') return null;
  if (xs[0] !== 0) return { index: 0, message: `must be 0 s: a cycle starts at t = 0 (it is ${xs[0]} s)` };
  const t = xs as readonly number[];
  for (let i = 1; i < n; i++) {
    if (!(t[i]! > t[i - 1]!)) return { index: i, message: `must be > dutyCycle.t_s[${i - 1}] (${t[i - 1]} s): the times must be strictly ascending` };
  }
  return null;
}

export const dutyCycleSchema = z
  .strictObject({
    label: z.string().max(200).default('').describe(doc('dutyCycle.label')),
    t_s: column('t_s'),
    speed_rpm: column('speed_rpm'),
    torque_Nm: column('torque_Nm'),
  })
  .superRefine((d, ctx) => {
    const n = d.t_s.length;
    if (n < 2) {
      ctx.addIssue({ code: 'custom', path: ['t_s'], message: `must have at least 2 entries (a cycle is its samples, linear in between; it has ${n})` });
      return;
    }
    let sameLength = true;
    for (const key of ['speed_rpm', 'torque_Nm'] as const) {
      if (d[key].length !== n) {
        sameLength = false;
        ctx.addIssue({ code: 'custom', path: [key], message: `has ${d[key].length} entries; it must have one per dutyCycle.t_s entry (${n})` });
      }
    }
    if (!sameLength) return;
    for (const key of COLUMNS) {
      const p = columnProblem(key, d[key]);
      if (p) ctx.addIssue({ code: 'custom', path: [key, p.index], message: p.message });
    }
  })
  .describe(doc('dutyCycle'));

/** The `dutyCycle` section with the schema's defaults filled in (label '' when absent). */
export type DutyCycleSection = z.output<typeof dutyCycleSchema>;

/**
 * A duty cycle whose columns are longer than MAX_DUTY_CYCLE_SAMPLES, found by their lengths alone,
 * before any sample is read.
 */
export function dutyCycleCapProblem(json: unknown): { path: string; message: string } | null {
  const o = (x: unknown, k: string): unknown => (x !== null && typeof x === 'object' && !Array.isArray(x) ? (x as Record<string, unknown>)[k] : undefined);
  const d = o(json, 'dutyCycle');
  for (const key of COLUMNS) {
    const x = o(d, key);
    if (Array.isArray(x) && x.length > MAX_DUTY_CYCLE_SAMPLES) return { path: `dutyCycle.${key}`, message: `must have at most ${MAX_DUTY_CYCLE_SAMPLES} entries (it has ${x.length})` };
  }
  return null;
}
