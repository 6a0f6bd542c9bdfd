// The project format's constants and the key documentation (src/core/project/schema-keys.ts).
// Units as SI and the project file's own conventions: common practice (no source).
import { describe, expect, it } from 'vitest';
import { CAPPED_LISTS, KEYS, keyDoc, MAX_LIST_ENTRIES, MAX_PROJECT_BYTES, PROJECT_FORMAT, PROJECT_VERSION } from '../src/core/project/schema-keys';
import * as schema from '../src/core/project/schema';

describe('schema keys', () => {
  it('the format constants: name, version 1, 16 MiB, 1000 entries per list', () => {
    expect(PROJECT_FORMAT).toBe('torquewise-project');
    expect(PROJECT_VERSION).toBe(1);
    expect(MAX_PROJECT_BYTES).toBe(16_777_216);
    expect(MAX_LIST_ENTRIES).toBe(1000);
    expect(CAPPED_LISTS.map((p) => p.join('.'))).toEqual(['requirements', 'scenario.speedSteps', 'scenario.torqueSteps', 'scenario.loadSteps', 'scenario.loadRamps']);
  });

  it('every capped list says its cap in its documentation', () => {
    for (const p of CAPPED_LISTS) expect(KEYS[p.join('.')]!.doc).toContain('at most 1000');
  });

  it('keyDoc: meaning with the unit in brackets, or the meaning alone; an unknown key is a defect', () => {
    expect(keyDoc('motor.Ld')).toBe('d-axis inductance per phase [H]');
    expect(keyDoc('inverter.Vdc')).toBe('DC-bus voltage [V]');
    expect(keyDoc('conditions.magnetTempCoeff')).toBe('remanence coefficient, -0.003..0.001, default -0.0012 (sintered NdFeB; SmCo about -0.0004) [/K]');
    expect(keyDoc('version')).toBe('file format version, 1');
    expect(() => keyDoc('motor.nothing')).toThrow(/no KEYS entry for motor\.nothing/);
  });

  it('the schema describes its numbers from KEYS and re-exports the constants unchanged', () => {
    expect(schema.KEYS).toBe(KEYS);
    expect(schema.MAX_PROJECT_BYTES).toBe(MAX_PROJECT_BYTES);
    expect(schema.projectSchema.shape.inverter.shape.Vdc.description).toBe('DC-bus voltage [V]');
  });
});
