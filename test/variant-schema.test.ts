import { describe, expect, it } from 'vitest';
import { checkProject, parseProject } from '../src/core/project/schema';
import { overridePathProblem, overridePattern, MAX_VARIANTS } from '../src/core/project/variant-schema';

// An invented small drive (values of no real product).
const file = (variants: unknown): Record<string, unknown> => ({
  format: 'torquewise-project', version: 1, name: 'variants (invented)',
  motor: { polePairs: 4, Rs: 0.05, Ld: 1e-4, Lq: 1.2e-4, psiM: 0.01, inertia: 1e-4 },
  inverter: { Vdc: 48, Imax: 100, Icont: 50, modulation: 'svpwm' },
  requirements: [{ label: 'rated', speed_rpm: 3000, torque_Nm: 1 }],
  variants,
});

describe('the variants section', () => {
  it('list entries of a path are written [n] or .n; either maps to the documented key (common practice (no source))', () => {
    expect(overridePattern('requirements[1].torque_Nm')).toBe('requirements[].torque_Nm');
    expect(overridePattern('requirements.1.torque_Nm')).toBe('requirements[].torque_Nm');
    expect(overridePattern('motor.psiM')).toBe('motor.psiM');
  });

  it('accepts a documented parameter, refuses an unknown one, a fixed one and a malformed one (common practice (no source))', () => {
    expect(overridePathProblem('motor.psiM')).toBeNull();
    expect(overridePathProblem('inverter.Vdc')).toBeNull();
    expect(overridePathProblem('requirements[0].torque_Nm')).toBeNull();
    expect(overridePathProblem('motor.psiX')).toMatch(/is not a parameter of the project file/);
    expect(overridePathProblem('version')).toMatch(/cannot be overridden/);
    expect(overridePathProblem('variants[0].name')).toMatch(/cannot be overridden/);
    expect(overridePathProblem('motor..psiM')).toMatch(/is not a parameter path/);
  });

  it('a file with named variants is valid, and its overrides are kept as written', () => {
    const p = parseProject(file([{ name: 'strong magnet', overrides: { 'motor.psiM': 0.012 } }]));
    expect(p.variants).toEqual([{ name: 'strong magnet', overrides: { 'motor.psiM': 0.012 } }]);
  });

  it('refuses an unknown path naming the variant and the path', () => {
    expect(checkProject(file([{ name: 'a', overrides: { 'motor.psiX': 1 } }]))).toEqual([
      { path: 'variants[0].overrides.motor.psiX', message: expect.stringMatching(/^is not a parameter of the project file/) },
    ]);
  });

  it('refuses two variants of one name, a variant without a name, and more than the cap', () => {
    const twice = checkProject(file([{ name: 'a', overrides: {} }, { name: 'a', overrides: {} }]));
    expect(twice).toEqual([{ path: 'variants[1].name', message: expect.stringMatching(/earlier variant/) }]);
    expect(checkProject(file([{ overrides: {} }]))[0]?.path).toBe('variants[0].name');
    const many = Array.from({ length: MAX_VARIANTS + 1 }, (_, i) => ({ name: `v${i}`, overrides: {} }));
    expect(checkProject(file(many))[0]?.path).toBe('variants');
  });
});
