// The project file's `losses` section (src/core/project/loss-schema.ts): its shape, defaults,
// bounds and refusals, and how the resolution passes it on. The section's shape and key names are
// those of issue 12 of this project; the iron-loss form P_fe = kh f psi^beta + ke f² psi² is the
// Steinmetz hysteresis term (Steinmetz, 1892, "On the law of hysteresis") with the classical eddy
// term of the loss separation (Bertotti, 1988, "General properties of power losses in soft
// ferromagnetic materials", IEEE Trans. Magn. 24(1)); bounds and messages: common practice (no source).
import { messageOf } from './helpers';
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { checkProject, DEFAULT_IRON_BETA, KEYS, parseProject, projectSchema } from '../src/core/project/schema';
import { lossesSchema } from '../src/core/project/loss-schema';
import { resolveProject } from '../src/core/project/project';
import { plainMessage } from '../src/core/reports/phrases';

const minimal = (): Record<string, any> => ({
  format: 'torquewise-project',
  version: 1,
  name: 'test (invented)',
  motor: { polePairs: 4, Rs: 0.05, Ld: 1e-4, Lq: 1.2e-4, psiM: 0.01, inertia: 1e-4 },
  inverter: { Vdc: 48, Imax: 100, Icont: 50, modulation: 'svpwm' },
  conditions: { windingTemp_C: 100 },
});

// the example of the issue, every key given
const ISSUE_EXAMPLE = {
  iron: { kh: 0.0, beta: 2, ke: 0.0 },
  windage: { kw: 0.0 },
  inverter: { Vce0: 0.8, rce: 0.002, Vf0: 0.9, rd: 0.0015, EonEoff_J: 0.022, Err_J: 0.006, Vref_V: 300, Iref_A: 200, fsw_Hz: 10000 },
};

const withLosses = (losses: unknown): Record<string, any> => ({ ...minimal(), losses });

describe('the losses section: shape and defaults', () => {
  it('is optional: a file without it parses as before and resolves to no losses ({})', () => {
    expect(parseProject(minimal()).losses).toBeUndefined();
    expect(resolveProject(parseProject(minimal())).losses).toEqual({});
  });

  it('the example of the issue is taken as written, key for key', () => {
    expect(parseProject(withLosses(ISSUE_EXAMPLE)).losses).toEqual(ISSUE_EXAMPLE);
  });

  it('every coefficient may be left out: a loss coefficient is 0 (no loss), beta is 2', () => {
    expect(DEFAULT_IRON_BETA).toBe(2);
    expect(parseProject(withLosses({})).losses).toEqual({});
    expect(parseProject(withLosses({ iron: {} })).losses).toEqual({ iron: { kh: 0, beta: 2, ke: 0 } });
    expect(parseProject(withLosses({ iron: { kh: 45, ke: 0.094 } })).losses!.iron).toEqual({ kh: 45, beta: 2, ke: 0.094 });
    expect(parseProject(withLosses({ iron: { kh: 45, beta: 1.6 } })).losses!.iron).toEqual({ kh: 45, beta: 1.6, ke: 0 });
    expect(parseProject(withLosses({ windage: {} })).losses).toEqual({ windage: { kw: 0 } });
    // conduction only: no switching energy, so no reference point or switching frequency is needed
    expect(parseProject(withLosses({ inverter: { rce: 0.0015 } })).losses!.inverter).toEqual({ Vce0: 0, rce: 0.0015, Vf0: 0, rd: 0, EonEoff_J: 0, Err_J: 0 });
  });

  it('a MOSFET bridge is given with Vce0 0 (on-state resistance only) and its body diode', () => {
    const mosfet = { Vce0: 0, rce: 0.0015, Vf0: 0.7, rd: 0.003, EonEoff_J: 0.0002, Err_J: 0.00002, Vref_V: 48, Iref_A: 100, fsw_Hz: 20000 };
    expect(parseProject(withLosses({ inverter: mosfet })).losses!.inverter).toEqual(mosfet);
  });
});

describe('the losses section: refusals name the path and say what is allowed', () => {
  const refused = (losses: unknown): string => messageOf(() => parseProject(withLosses(losses)));

  it('a negative coefficient', () => {
    expect(refused({ iron: { kh: -1 } })).toBe('losses.iron.kh must be >= 0 W/(Hz·Wb^beta)');
    expect(refused({ iron: { ke: -0.1 } })).toBe('losses.iron.ke must be >= 0 W/(Hz²·Wb²)');
    expect(refused({ windage: { kw: -1e-9 } })).toBe('losses.windage.kw must be >= 0 W·s³/rad³');
    expect(refused({ inverter: { rce: -0.001 } })).toBe('losses.inverter.rce must be >= 0 ohm');
    expect(refused({ inverter: { Vf0: -0.7 } })).toBe('losses.inverter.Vf0 must be >= 0 V');
    expect(refused({ inverter: { Err_J: -0.005, Vref_V: 300, Iref_A: 200, fsw_Hz: 1e4 } })).toBe('losses.inverter.Err_J must be >= 0 J');
  });

  it('beta outside 1 to 3', () => {
    expect(refused({ iron: { kh: 1, beta: 0.5 } })).toBe('losses.iron.beta must be >= 1');
    expect(refused({ iron: { kh: 1, beta: 3.5 } })).toBe('losses.iron.beta must be <= 3');
  });

  it('a reference current, reference voltage or switching frequency of 0', () => {
    const inv = { ...ISSUE_EXAMPLE.inverter };
    expect(refused({ inverter: { ...inv, Iref_A: 0 } })).toBe('losses.inverter.Iref_A must be > 0 A');
    expect(refused({ inverter: { ...inv, Vref_V: 0 } })).toBe('losses.inverter.Vref_V must be > 0 V');
    expect(refused({ inverter: { ...inv, fsw_Hz: 0 } })).toBe('losses.inverter.fsw_Hz must be > 0 Hz');
  });

  it('a switching energy without its reference point or switching frequency', () => {
    expect(checkProject(withLosses({ inverter: { EonEoff_J: 0.02 } }))).toEqual([
      { path: 'losses.inverter.Vref_V', message: 'is required when losses.inverter.EonEoff_J is above 0 (the DC voltage the switching energies were measured at, in V)' },
      { path: 'losses.inverter.Iref_A', message: 'is required when losses.inverter.EonEoff_J is above 0 (the current the switching energies were measured at, in A peak)' },
      { path: 'losses.inverter.fsw_Hz', message: 'is required when losses.inverter.EonEoff_J is above 0 (the switching frequency, in Hz)' },
    ]);
    expect(refused({ inverter: { Err_J: 0.005, Vref_V: 300, Iref_A: 200 } })).toBe('losses.inverter.fsw_Hz is required when losses.inverter.Err_J is above 0 (the switching frequency, in Hz)');
    // in words for a screen: the paths become the inputs they name
    expect(plainMessage('is required when losses.inverter.Err_J is above 0')).toBe('is required when the diode reverse-recovery energy is above 0');
  });

  it('an unknown key or part, naming it and the known ones', () => {
    expect(refused({ iron: { kh: 1, kx: 2 } })).toBe('losses.iron.kx is not a known key (known here: kh, beta, ke)');
    expect(refused({ copper: { k: 1 } })).toBe('losses.copper is not a known key (known here: iron, windage, inverter)');
    expect(refused({ inverter: { Vce: 0.8 } })).toBe('losses.inverter.Vce is not a known key (known here: Vce0, rce, Vf0, rd, EonEoff_J, Err_J, Vref_V, Iref_A, fsw_Hz)');
    expect(refused({ windage: { kw: 1e-8, B: 0.001 } })).toBe('losses.windage.B is not a known key (known here: kw)');
  });

  it('values beyond any drive, and values of the wrong kind', () => {
    expect(refused({ inverter: { ...ISSUE_EXAMPLE.inverter, fsw_Hz: 1e7 } })).toBe('losses.inverter.fsw_Hz must be <= 1000000 Hz');
    expect(refused({ inverter: { Vce0: 50 } })).toBe('losses.inverter.Vce0 must be <= 10 V');
    expect(refused({ windage: { kw: 2 } })).toBe('losses.windage.kw must be <= 1 W·s³/rad³');
    expect(refused({ iron: { kh: '45' } })).toBe('losses.iron.kh must be a number in W/(Hz·Wb^beta)');
    expect(refused({ iron: [45, 2, 0.1] })).toBe('losses.iron must be an object { ... }');
    expect(refused(7)).toBe('losses must be an object { ... }');
  });

  it('several problems are listed at once, in file order', () => {
    expect(checkProject(withLosses({ iron: { kh: -1, beta: 9 }, inverter: { ...ISSUE_EXAMPLE.inverter, Iref_A: 0 } }))).toEqual([
      { path: 'losses.iron.kh', message: 'must be >= 0 W/(Hz·Wb^beta)' },
      { path: 'losses.iron.beta', message: 'must be <= 3' },
      { path: 'losses.inverter.Iref_A', message: 'must be > 0 A' },
    ]);
  });

  it('never throws and speaks plainly, whatever the section holds', () => {
    const part = fc.oneof(fc.jsonValue(), fc.dictionary(fc.constantFrom('kh', 'beta', 'ke', 'kw', 'Vce0', 'rce', 'EonEoff_J', 'Err_J', 'Vref_V', 'Iref_A', 'fsw_Hz'), fc.jsonValue()));
    fc.assert(
      fc.property(fc.oneof(fc.jsonValue(), fc.record({ iron: part, windage: part, inverter: part }, { requiredKeys: [] })), (v) => {
        for (const p of checkProject(withLosses(v))) {
          expect(p.message).not.toMatch(/invalid_|ZodError|Expected|received|union|NaN/i);
          expect(p.path).toMatch(/^losses/);
        }
      }),
      { numRuns: 300 },
    );
  });
});

describe('the losses section: documentation', () => {
  it('every key has its unit and meaning in KEYS, and the schema describes itself from them', () => {
    expect(projectSchema.shape.losses.unwrap()).toBe(lossesSchema);
    expect(KEYS['losses.iron.kh']).toEqual({ unit: 'W/(Hz·Wb^beta)', doc: expect.stringContaining('default 0 (no hysteresis loss)') });
    expect(KEYS['losses.iron.ke']!.unit).toBe('W/(Hz²·Wb²)');
    expect(KEYS['losses.iron.beta']!.doc).toContain('default 2');
    expect(KEYS['losses.windage.kw']!.unit).toBe('W·s³/rad³');
    expect(KEYS['losses.inverter.Iref_A']!.doc).toContain('A peak');
    expect(KEYS['losses.inverter.Vce0']!.doc).toContain('0 for a MOSFET');
    // an absent part or coefficient is said to be a zero loss
    expect(KEYS['losses']!.doc).toContain('absent is zero');
    for (const part of ['iron', 'windage', 'inverter']) expect(KEYS[`losses.${part}`]!.doc).toMatch(/absent = (no|a lossless)/);
    for (const k of ['kh', 'ke']) expect(KEYS[`losses.iron.${k}`]!.doc).toContain('default 0 (no');
    for (const k of ['Vce0', 'rce', 'Vf0', 'rd', 'EonEoff_J', 'Err_J']) expect(KEYS[`losses.inverter.${k}`]!.doc).toContain('default 0');
  });
});

describe('the resolution passes the section on', () => {
  it('as a plain object with the same keys and the defaults filled in, nothing else', () => {
    const file = parseProject(withLosses({ iron: { kh: 45, ke: 0.094 }, inverter: ISSUE_EXAMPLE.inverter }));
    const rp = resolveProject(file);
    expect(rp.losses).toEqual({ iron: { kh: 45, beta: 2, ke: 0.094 }, inverter: ISSUE_EXAMPLE.inverter });
    expect(Object.keys(rp.losses)).toEqual(['iron', 'inverter']);
    // its own copy: changing the resolved coefficients leaves the file as read
    rp.losses.iron!.kh = 1;
    expect(file.losses!.iron!.kh).toBe(45);
  });

  it('changes nothing else of the resolved project', () => {
    const a = resolveProject(parseProject(minimal()));
    const b = resolveProject(parseProject(withLosses(ISSUE_EXAMPLE)));
    const { losses: _la, file: _fa, models: _ma, ...restA } = a;
    const { losses: _lb, file: _fb, models: _mb, ...restB } = b;
    expect(restB).toEqual(restA);
  });
});
