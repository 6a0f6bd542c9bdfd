// The project file's `dutyCycle` section (src/core/project/duty-cycle-schema.ts): three columns of
// samples (the shape of issue 13 of this project), checked by a tight loop each so that a 30-minute
// cycle sampled at 10 ms (180 000 samples, the size issue 13 asks for) fits the file size limit and
// validates quickly; every refusal names the first bad sample. Bounds and messages: common practice
// (no source).
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { messageOf } from './helpers';
import { checkProject, KEYS, MAX_DUTY_CYCLE_SAMPLES, MAX_PROJECT_BYTES, parseProject } from '../src/core/project/schema';
import { dutyCycleCapProblem, dutyCycleSchema } from '../src/core/project/duty-cycle-schema';
import { fieldPhrase } from '../src/core/reports/phrases';

const minimal = (): Record<string, any> => ({
  format: 'torquewise-project',
  version: 1,
  name: 'test (invented)',
  motor: { polePairs: 4, Rs: 0.05, Ld: 1e-4, Lq: 1.2e-4, psiM: 0.01, inertia: 1e-4 },
  inverter: { Vdc: 48, Imax: 100, Icont: 50, modulation: 'svpwm' },
});
const CYCLE = { label: 'move (invented)', t_s: [0, 0.1, 0.3, 0.4, 1], speed_rpm: [0, 3000, 3000, 0, 0], torque_Nm: [2.5, 2.5, 0.3, -2, 0] };
const withCycle = (dutyCycle: unknown): Record<string, any> => ({ ...minimal(), dutyCycle });
const refused = (d: unknown): string => messageOf(() => parseProject(withCycle(d)));
const problems = (d: unknown): string[] => checkProject(withCycle(d)).map((p) => `${p.path} ${p.message}`);

/** A cycle of n samples 10 ms apart, the values written as a CSV import writes them (a few decimals). */
function bigCycle(n: number): { label: string; t_s: number[]; speed_rpm: number[]; torque_Nm: number[] } {
  const t_s = new Array<number>(n), speed_rpm = new Array<number>(n), torque_Nm = new Array<number>(n);
  for (let i = 0; i < n; i++) {
    t_s[i] = Number((i * 0.01).toFixed(2));
    speed_rpm[i] = Number((3000 + 2500 * Math.sin(i / 3000)).toFixed(1));
    torque_Nm[i] = Number((40 * Math.cos(i / 700)).toFixed(2));
  }
  return { label: 'half an hour at 10 ms (invented)', t_s, speed_rpm, torque_Nm };
}

describe('the dutyCycle section: shape', () => {
  it('is optional; the columns are taken as written; the label is empty when absent', () => {
    expect(parseProject(minimal()).dutyCycle).toBeUndefined();
    expect(parseProject(withCycle(CYCLE)).dutyCycle).toEqual(CYCLE);
    const { label: _l, ...noLabel } = CYCLE;
    expect(parseProject(withCycle(noLabel)).dutyCycle).toEqual({ ...noLabel, label: '' });
  });

  it('two samples are a cycle; negative speed (reverse) and torque (braking) are allowed', () => {
    const d = { t_s: [0, 5], speed_rpm: [-1000, -1000], torque_Nm: [-3, 3] };
    expect(parseProject(withCycle(d)).dutyCycle).toEqual({ ...d, label: '' });
  });
});

describe('the dutyCycle section: refusals name the first bad sample', () => {
  it('times not from 0, not strictly ascending', () => {
    expect(refused({ ...CYCLE, t_s: [0.5, 1, 2, 3, 4] })).toBe('dutyCycle.t_s[0] must be 0 s: a cycle starts at t = 0 (it is 0.5 s)');
    expect(refused({ ...CYCLE, t_s: [0, 0.1, 0.1, 0.4, 1] })).toBe('dutyCycle.t_s[2] must be > dutyCycle.t_s[1] (0.1 s): the times must be strictly ascending');
    expect(refused({ ...CYCLE, t_s: [0, 0.1, 0.3, 0.2, 1] })).toBe('dutyCycle.t_s[3] must be > dutyCycle.t_s[2] (0.3 s): the times must be strictly ascending');
  });

  it('a sample that is not a number, or out of bounds', () => {
    expect(refused({ ...CYCLE, torque_Nm: [2.5, 2.5, 'x', -2, 0] })).toBe("dutyCycle.torque_Nm[2] must be a number in N·m (it is 'x')");
    expect(refused({ ...CYCLE, speed_rpm: [0, 3000, null, 0, 0] })).toBe('dutyCycle.speed_rpm[2] must be a number in rpm (it is null)');
    expect(refused({ ...CYCLE, speed_rpm: [0, 3000, 3000, Number.NaN, 0] })).toBe('dutyCycle.speed_rpm[3] must be a finite number in rpm');
    expect(refused({ ...CYCLE, torque_Nm: [2.5, 2.5, 0.3, -2, 2e6] })).toBe('dutyCycle.torque_Nm[4] must be <= 1000000 N·m');
    expect(refused({ ...CYCLE, speed_rpm: [0, -2e6, 0, 0, 0] })).toBe('dutyCycle.speed_rpm[1] must be >= -1000000 rpm');
    expect(refused({ ...CYCLE, t_s: [0, 0.1, 0.3, 0.4, Infinity] })).toBe('dutyCycle.t_s[4] must be a finite number in s');
  });

  it('columns of unequal lengths, fewer than 2 samples, a column that is not a list or missing', () => {
    expect(refused({ ...CYCLE, speed_rpm: [0, 3000] })).toBe('dutyCycle.speed_rpm has 2 entries; it must have one per dutyCycle.t_s entry (5)');
    expect(refused({ t_s: [0], speed_rpm: [0], torque_Nm: [0] })).toBe('dutyCycle.t_s must have at least 2 entries (a cycle is its samples, linear in between; it has 1)');
    expect(refused({ ...CYCLE, torque_Nm: 5 })).toBe('dutyCycle.torque_Nm must be a list [ ... ] of numbers in N·m');
    expect(problems({ t_s: [0, 1] })).toEqual([
      'dutyCycle.speed_rpm is required (mechanical speed at each sample, rpm; negative = reverse)',
      'dutyCycle.torque_Nm is required (shaft torque at each sample, N·m; negative = braking when the speed is positive)',
    ]);
    expect(refused({ ...CYCLE, t: [0, 1] })).toMatch(/^dutyCycle\.t is not a known key \(known here: label, t_s, speed_rpm, torque_Nm\)$/);
  });

  it('one problem per column, each the first of its column', () => {
    expect(problems({ ...CYCLE, t_s: [0, 0.1, 0.1, 0.05, 1], torque_Nm: [2.5, 'a', 'b', -2, 0] })).toEqual([
      'dutyCycle.t_s[2] must be > dutyCycle.t_s[1] (0.1 s): the times must be strictly ascending',
      "dutyCycle.torque_Nm[1] must be a number in N·m (it is 'a')",
    ]);
  });

  it('a column longer than the cap is refused by its length before any sample is read', () => {
    const long = new Array(MAX_DUTY_CYCLE_SAMPLES + 1).fill('x');
    const p = withCycle({ t_s: [0, 1], speed_rpm: long, torque_Nm: [0, 1] });
    const cap = { path: 'dutyCycle.speed_rpm', message: `must have at most ${MAX_DUTY_CYCLE_SAMPLES} entries (it has ${MAX_DUTY_CYCLE_SAMPLES + 1})` };
    expect(dutyCycleCapProblem(p)).toEqual(cap);
    expect(checkProject(p)).toEqual([cap]);
    expect(messageOf(() => parseProject(p))).toBe(`dutyCycle.speed_rpm ${cap.message}`);
  });
});

describe('the dutyCycle section: a 30-minute cycle at 10 ms', () => {
  it('180 000 samples fit the file size limit and validate in well under 100 ms; a bad last sample is found', () => {
    const d = bigCycle(180_000);
    const text = JSON.stringify(withCycle(d));
    expect(text.length).toBeLessThan(MAX_PROJECT_BYTES / 3); // about 3.7 MB (measured)
    const json = JSON.parse(text);
    parseProject(json); // warm up
    let best = Infinity;
    for (let k = 0; k < 3; k++) {
      const t0 = performance.now();
      const p = parseProject(json);
      best = Math.min(best, performance.now() - t0);
      expect(p.dutyCycle!.t_s).toHaveLength(180_000);
    }
    expect(best).toBeLessThan(100); // measured about 2 ms
    json.dutyCycle.t_s[179_999] = json.dutyCycle.t_s[179_998];
    expect(messageOf(() => parseProject(json))).toBe('dutyCycle.t_s[179999] must be > dutyCycle.t_s[179998] (1799.98 s): the times must be strictly ascending');
  });
});

describe('the dutyCycle section: any JSON', () => {
  it('never throws and speaks plainly, whatever the section holds', () => {
    const col = fc.oneof(fc.jsonValue(), fc.array(fc.oneof(fc.double(), fc.jsonValue()), { maxLength: 6 }), fc.array(fc.double({ min: 0, max: 10, noNaN: true }), { maxLength: 6 }));
    fc.assert(
      fc.property(fc.oneof(fc.jsonValue(), fc.record({ label: fc.jsonValue(), t_s: col, speed_rpm: col, torque_Nm: col }, { requiredKeys: [] })), (v) => {
        for (const p of checkProject(withCycle(v))) {
          expect(p.message).not.toMatch(/invalid_|ZodError|Expected|received|union/i);
          expect(p.path).toMatch(/^dutyCycle/);
        }
      }),
      { numRuns: 300 },
    );
  });
});

describe('the dutyCycle section: documentation', () => {
  it('every key has its unit and meaning, and words', () => {
    expect(KEYS['dutyCycle.t_s']!.unit).toBe('s');
    expect(KEYS['dutyCycle.speed_rpm']!.unit).toBe('rpm');
    expect(KEYS['dutyCycle.torque_Nm']!.unit).toBe('N·m');
    expect(KEYS['dutyCycle']!.doc).toContain(`2 to ${MAX_DUTY_CYCLE_SAMPLES} samples`);
    expect(dutyCycleSchema.shape.t_s.description).toBe('time of each sample, s: the first 0, strictly ascending [s]');
    expect(fieldPhrase('dutyCycle.t_s.17')).toBe('duty cycle time 18');
    expect(fieldPhrase('dutyCycle.torque_Nm')).toBe('duty cycle torques');
  });
});
