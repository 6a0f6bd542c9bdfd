import { describe, expect, it } from 'vitest';
import { defaultedInputFindings } from '../src/core/project/defaulted-inputs';
import { parseProject } from '../src/core/project/schema';

describe('defaulted inputs said as findings', () => {
  it('a missing magnet temperature and remanence coefficient are named by field; given ones are not', () => {
    const f = defaultedInputFindings({ conditions: { windingTemp_C: 120 } });
    expect(f.map((x) => [x.code, x.field, x.severity])).toEqual([
      ['magnet-temp-assumed', 'conditions.magnetTemp_C', 'info'],
      ['magnet-coeff-assumed', 'conditions.magnetTempCoeff', 'info'],
    ]);
    expect(defaultedInputFindings({ conditions: { windingTemp_C: 120, magnetTemp_C: 100, magnetTempCoeff: -0.001 } })).toEqual([]);
    expect(defaultedInputFindings(null)).toEqual([]);
    // without a conditions section the resolution's own 'conditions-assumed' finding says it all
    expect(defaultedInputFindings({ motor: {} })).toEqual([]);
    // the defaults these findings speak of are the schema's
    const p = parseProject({
      format: 'torquewise-project', version: 1, name: 'x',
      motor: { polePairs: 4, Rs: 0.1, Ld: 1e-3, Lq: 1e-3, psiM: 0.05, inertia: 1e-3 },
      inverter: { Vdc: 48, Imax: 50, Icont: 30, modulation: 'svpwm' },
      conditions: { windingTemp_C: 100 },
      requirements: [],
    });
    expect(p.conditions?.magnetTemp_C).toBe(20);
    expect(p.conditions?.magnetTempCoeff).toBe(-0.0012);
  });
});
