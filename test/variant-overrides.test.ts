import { describe, expect, it } from 'vitest';
import { applyOverrides, resolveVariants } from '../src/core/project/variant-overrides';
import { loadProjectJson } from '../src/core/project/project';
import { InputError } from '../src/core/base/errors';

// An invented small drive (values of no real product).
const base = (): Record<string, any> => ({
  format: 'torquewise-project', version: 1, name: 'variants (invented)',
  motor: { polePairs: 4, Rs: 0.05, Ld: 1e-4, Lq: 1.2e-4, psiM: 0.01, inertia: 1e-4 },
  inverter: { Vdc: 48, Imax: 100, Icont: 50, modulation: 'svpwm' },
  conditions: { windingTemp_C: 20, coldTemp_C: 20 },
  requirements: [{ label: 'rated', speed_rpm: 3000, torque_Nm: 1 }, { label: 'peak', speed_rpm: 1000, torque_Nm: 2 }],
});

const refusal = (f: () => unknown): InputError => {
  try {
    f();
  } catch (e) {
    if (e instanceof InputError) return e;
    throw e;
  }
  throw new Error('not refused');
};

describe('applyOverrides', () => {
  it('sets each path, copies only what it changes, and leaves the file as it was (common practice (no source))', () => {
    const f = base();
    const v: Record<string, any> = applyOverrides(f, { 'motor.psiM': 0.02, 'requirements[1].torque_Nm': 3, 'inverter.deviceDrop': 0.5 }, 'variants[0].overrides');
    expect(v.motor.psiM).toBe(0.02);
    expect(v.requirements[1].torque_Nm).toBe(3);
    expect(v.inverter.deviceDrop).toBe(0.5);
    expect(f.motor.psiM).toBe(0.01);
    expect(f.requirements[1].torque_Nm).toBe(2);
    expect(f.inverter.deviceDrop).toBeUndefined();
    expect(v.conditions).toBe(f.conditions); // untouched sections are shared, not copied
  });

  it('refuses, naming the path: an unknown parameter, a section the file lacks, a list entry it lacks', () => {
    expect(refusal(() => applyOverrides(base(), { 'motor.psiX': 1 }, 'variants[0].overrides')).field).toBe('variants[0].overrides.motor.psiX');
    const e = refusal(() => applyOverrides(base(), { 'nameplate.R.value': 1 }, 'variants[2].overrides'));
    expect(e.field).toBe('variants[2].overrides.nameplate.R.value');
    expect(e.problems[0]!.message).toMatch(/names nameplate, which the file does not have/);
    expect(refusal(() => applyOverrides(base(), { 'requirements[5].torque_Nm': 1 }, 'w')).problems[0]!.message).toMatch(/requirements\[5\], which the file does not have/);
  });
});

describe('resolveVariants', () => {
  it('a psiM override reaches the resolved machine at 20 °C and hot, by the same ratio (common practice (no source))', () => {
    const f = { ...base(), variants: [{ name: 'strong magnet', overrides: { 'motor.psiM': 0.013 } }] };
    const [v] = resolveVariants(loadProjectJson(f).file);
    const p0 = loadProjectJson(base()).resolved;
    expect(v!.name).toBe('strong magnet');
    expect(v!.project.machine20.psiM).toBe(0.013);
    expect(v!.project.hot.psiM / p0.hot.psiM).toBeCloseTo(1.3, 12);
    expect(v!.project.file.variants).toBeUndefined();
  });

  it('a file without variants has none; a variant that makes the file invalid is refused naming the variant and its override', () => {
    expect(resolveVariants(base())).toEqual([]);
    const f = { ...base(), variants: [{ name: 'ok', overrides: {} }, { name: 'high Icont', overrides: { 'inverter.Icont': 500 } }] };
    const e = refusal(() => resolveVariants(f));
    expect(e.field).toBe('variants[1].overrides.inverter.Icont');
    expect(e.problems[0]!.message).toMatch(/^\(variant 'high Icont'\) must be <= inverter.Imax/);
  });
});
