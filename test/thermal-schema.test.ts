// The project file's `thermal` section (src/core/project/thermal-schema.ts): its shape (the key
// names of issue 13 of this project, so that other tools can write it), the default of the magnet's
// offset, and every refusal naming its path and what is allowed. The insulation classes in the
// documentation (130 B, 155 F, 180 H) are IEC 60085 (2007), "Electrical insulation - Thermal
// evaluation and designation"; bounds and messages: common practice (no source).
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { messageOf } from './helpers';
import { checkProject, KEYS, MAX_LIST_ENTRIES, parseProject } from '../src/core/project/schema';
import { thermalCapProblem, thermalSchema } from '../src/core/project/thermal-schema';
import { fieldPhrase } from '../src/core/reports/phrases';

const minimal = (): Record<string, any> => ({
  format: 'torquewise-project',
  version: 1,
  name: 'test (invented)',
  motor: { polePairs: 4, Rs: 0.05, Ld: 1e-4, Lq: 1.2e-4, psiM: 0.01, inertia: 1e-4 },
  inverter: { Vdc: 48, Imax: 100, Icont: 50, modulation: 'svpwm' },
});

// the example of the issue, every key given
const ISSUE_EXAMPLE = {
  coolantTemp_C: 40,
  windingCapacity_J_per_K: 900, windingToStator_K_per_W: 0.05,
  statorCapacity_J_per_K: 9000, statorToCoolant_K_per_W: 0.02,
  magnetAboveStator_K: 10,
  windingMax_C: 155, magnetMax_C: 140,
  junctionToCoolant_K_per_W: 0.15, junctionMax_C: 150,
};
const withThermal = (thermal: unknown): Record<string, any> => ({ ...minimal(), thermal });
const refused = (thermal: unknown): string => messageOf(() => parseProject(withThermal(thermal)));
const problems = (thermal: unknown): string[] => checkProject(withThermal(thermal)).map((p) => `${p.path} ${p.message}`);

describe('the thermal section: shape and defaults', () => {
  it('is optional: a file without it parses as before', () => {
    expect(parseProject(minimal()).thermal).toBeUndefined();
  });

  it('the example of the issue is taken as written, key for key', () => {
    expect(parseProject(withThermal(ISSUE_EXAMPLE)).thermal).toEqual(ISSUE_EXAMPLE);
  });

  it('the magnet offset is 0 K when absent; the junction pair may be left out together', () => {
    const { magnetAboveStator_K: _m, junctionToCoolant_K_per_W: _j, junctionMax_C: _x, ...rest } = ISSUE_EXAMPLE;
    expect(parseProject(withThermal(rest)).thermal).toEqual({ ...rest, magnetAboveStator_K: 0 });
  });

  it('a speed-dependent stator-to-coolant resistance (self-ventilated motor) is taken as written', () => {
    const bySpeed = { speed_rpm: [0, 1500, 3000], K_per_W: [0.4, 0.25, 0.18] };
    expect(parseProject(withThermal({ ...ISSUE_EXAMPLE, statorToCoolantBySpeed: bySpeed })).thermal!.statorToCoolantBySpeed).toEqual(bySpeed);
  });
});

describe('the thermal section: refusals name the path and say what is allowed', () => {
  it('a capacity or a resistance of 0 or below', () => {
    expect(refused({ ...ISSUE_EXAMPLE, windingCapacity_J_per_K: 0 })).toBe('thermal.windingCapacity_J_per_K must be > 0 J/K');
    expect(refused({ ...ISSUE_EXAMPLE, statorCapacity_J_per_K: -5 })).toBe('thermal.statorCapacity_J_per_K must be > 0 J/K');
    expect(refused({ ...ISSUE_EXAMPLE, windingToStator_K_per_W: 0 })).toBe('thermal.windingToStator_K_per_W must be > 0 K/W');
    expect(refused({ ...ISSUE_EXAMPLE, statorToCoolant_K_per_W: -0.02 })).toBe('thermal.statorToCoolant_K_per_W must be > 0 K/W');
    expect(refused({ ...ISSUE_EXAMPLE, junctionToCoolant_K_per_W: 0 })).toBe('thermal.junctionToCoolant_K_per_W must be > 0 K/W');
  });

  it('a temperature that is not a finite number, or out of range', () => {
    expect(refused({ ...ISSUE_EXAMPLE, coolantTemp_C: '40' })).toBe('thermal.coolantTemp_C must be a number in °C');
    expect(refused({ ...ISSUE_EXAMPLE, coolantTemp_C: null })).toBe('thermal.coolantTemp_C must be a number in °C');
    expect(refused({ ...ISSUE_EXAMPLE, coolantTemp_C: 300 })).toBe('thermal.coolantTemp_C must be <= 250 °C');
    expect(refused({ ...ISSUE_EXAMPLE, windingMax_C: 1e308 * 10 })).toBe('thermal.windingMax_C must be a finite number in °C');
    expect(refused({ ...ISSUE_EXAMPLE, magnetAboveStator_K: 500 })).toBe('thermal.magnetAboveStator_K must be <= 200 K');
  });

  it('a limit at or below the coolant', () => {
    expect(refused({ ...ISSUE_EXAMPLE, windingMax_C: 40 })).toBe("thermal.windingMax_C must be > thermal.coolantTemp_C (40 °C): the winding's limit at or below the coolant can never be kept");
    expect(refused({ ...ISSUE_EXAMPLE, magnetMax_C: 30 })).toBe("thermal.magnetMax_C must be > thermal.coolantTemp_C (40 °C): the magnet's limit at or below the coolant can never be kept");
    expect(refused({ ...ISSUE_EXAMPLE, junctionMax_C: 25 })).toBe("thermal.junctionMax_C must be > thermal.coolantTemp_C (40 °C): the junction's limit at or below the coolant can never be kept");
  });

  it('the junction resistance without its limit, or the limit without the resistance', () => {
    const { junctionMax_C: _x, ...noMax } = ISSUE_EXAMPLE;
    const { junctionToCoolant_K_per_W: _j, ...noR } = ISSUE_EXAMPLE;
    expect(refused(noMax)).toBe('thermal.junctionMax_C is required when thermal.junctionToCoolant_K_per_W is given (the junction temperature limit of the switches, °C); or leave both out');
    expect(refused(noR)).toBe('thermal.junctionToCoolant_K_per_W is required when thermal.junctionMax_C is given (junction-to-coolant resistance of one switch position, K/W); or leave both out');
  });

  it('a missing key is named with its unit and meaning; an unknown key lists the known ones', () => {
    const { windingCapacity_J_per_K: _w, ...noCw } = ISSUE_EXAMPLE;
    expect(refused(noCw)).toBe('thermal.windingCapacity_J_per_K is required (heat capacity of the winding node (copper and insulation), > 0 in J/K)');
    expect(refused({ ...ISSUE_EXAMPLE, ambient_C: 25 })).toMatch(/^thermal\.ambient_C is not a known key \(known here: coolantTemp_C, windingCapacity_J_per_K, .*junctionMax_C\)$/);
  });

  it('the speed table: ascending speeds, positive resistances, equal lengths, at least 2 entries', () => {
    const t = (speed_rpm: unknown, K_per_W: unknown) => problems({ ...ISSUE_EXAMPLE, statorToCoolantBySpeed: { speed_rpm, K_per_W } });
    expect(t([0, 1000, 1000], [0.3, 0.2, 0.1])).toEqual(['thermal.statorToCoolantBySpeed.speed_rpm[2] must be > speed_rpm[1] (1000 rpm): the speeds must be strictly ascending']);
    expect(t([0, 1000], [0.3, 0])).toEqual(['thermal.statorToCoolantBySpeed.K_per_W[1] must be > 0 K/W']);
    expect(t([-10, 1000], [0.3, 0.2])).toEqual(['thermal.statorToCoolantBySpeed.speed_rpm[0] must be >= 0 rpm']);
    expect(t([0, 1000, 2000], [0.3, 0.2])).toEqual(['thermal.statorToCoolantBySpeed.K_per_W has 2 entries; it must have one per speed_rpm entry (3)']);
    expect(t([0], [0.3])).toEqual(['thermal.statorToCoolantBySpeed.speed_rpm must have at least 2 entries', 'thermal.statorToCoolantBySpeed.K_per_W must have at least 2 entries']);
  });

  it('a speed table longer than the list cap is refused by its length before any entry is read', () => {
    const long = Array.from({ length: 1_000_000 }, () => 'x');
    const p = withThermal({ ...ISSUE_EXAMPLE, statorToCoolantBySpeed: { speed_rpm: long, K_per_W: [1, 2] } });
    const cap = { path: 'thermal.statorToCoolantBySpeed.speed_rpm', message: `must have at most ${MAX_LIST_ENTRIES} entries (it has 1000000)` };
    expect(thermalCapProblem(p)).toEqual(cap);
    expect(checkProject(p)).toEqual([cap]);
    expect(thermalCapProblem(minimal())).toBeNull();
  });

  it('several problems are listed together', () => {
    expect(problems({ ...ISSUE_EXAMPLE, windingCapacity_J_per_K: 0, statorToCoolant_K_per_W: 0 })).toEqual([
      'thermal.windingCapacity_J_per_K must be > 0 J/K',
      'thermal.statorToCoolant_K_per_W must be > 0 K/W',
    ]);
  });
});

describe('the thermal section: any JSON', () => {
  it('never throws and speaks plainly, whatever the section holds', () => {
    const value = fc.oneof(fc.jsonValue(), fc.double(), fc.array(fc.oneof(fc.double(), fc.jsonValue()), { maxLength: 5 }));
    const keys = [...Object.keys(ISSUE_EXAMPLE), 'statorToCoolantBySpeed'];
    fc.assert(
      fc.property(fc.oneof(fc.jsonValue(), fc.dictionary(fc.constantFrom(...keys), value)), (v) => {
        for (const p of checkProject(withThermal(v))) {
          expect(p.message).not.toMatch(/invalid_|ZodError|Expected|received|union|NaN/i);
          expect(p.path).toMatch(/^thermal/);
        }
      }),
      { numRuns: 300 },
    );
  });
});

describe('the thermal section: documentation', () => {
  it('every key has its unit and meaning, the schema describes itself from them, and every key has words', () => {
    expect(KEYS['thermal']!.doc).toContain('a node is one body at one temperature with a heat capacity');
    expect(KEYS['thermal.windingCapacity_J_per_K']!.unit).toBe('J/K');
    expect(KEYS['thermal.statorToCoolant_K_per_W']!.unit).toBe('K/W');
    expect(KEYS['thermal.windingMax_C']!.doc).toContain('155 F');
    expect(KEYS['thermal.magnetAboveStator_K']!.doc).toContain('default 0');
    expect(thermalSchema.shape.coolantTemp_C.description).toContain('[°C]');
    for (const k of Object.keys(KEYS).filter((k) => k.startsWith('thermal'))) expect(fieldPhrase(k.replace(/\[\]/g, '.0')), k).not.toMatch(/\.[A-Za-z]/);
    expect(fieldPhrase('thermal.windingMax_C')).toBe('winding temperature limit');
  });
});
