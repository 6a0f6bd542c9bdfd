// Format versions: older files migrate step by step, newer files open read-only with a message.
import { describe, expect, it } from 'vitest';
import { migrateProject, MIGRATIONS, DEFAULT_MIGRATE_OPTIONS, type MigrationStep } from '../src/core/project/migrate';
import { loadProjectText } from '../src/core/project/project';
import { PROJECT_VERSION } from '../src/core/project/schema';
import { DEMOS } from '../trust/fuzz-cases';
import { refusal } from './helpers';

type Json = Record<string, any>;
const demo = (): Json => structuredClone(DEMOS['demo-spm-48v']) as Json;

// Two invented format changes, to exercise the mechanism: v1 -> v2 renames inverter.Vdc to
// inverter.busVoltage, v2 -> v3 moves it back and drops a key that v3 no longer has.
const STEPS: MigrationStep[] = [
  {
    from: 1, to: 2, note: 'inverter.Vdc renamed inverter.busVoltage',
    apply: (j) => {
      const inv = { ...(j['inverter'] as Json) };
      inv['busVoltage'] = inv['Vdc'];
      delete inv['Vdc'];
      return { ...j, inverter: inv };
    },
  },
  {
    from: 2, to: 3, note: 'inverter.busVoltage is inverter.Vdc again; note dropped',
    apply: (j) => {
      const inv = { ...(j['inverter'] as Json) };
      inv['Vdc'] = inv['busVoltage'];
      delete inv['busVoltage'];
      const out: Json = { ...j, inverter: inv };
      delete out['note'];
      return out;
    },
  },
];

describe('format version 1 is current', () => {
  it('has no steps yet and reads version 1 unchanged', () => {
    expect(PROJECT_VERSION).toBe(1);
    expect(MIGRATIONS).toEqual([]);
    expect(DEFAULT_MIGRATE_OPTIONS.current).toBe(1);
    const j = demo();
    const m = migrateProject(j);
    expect(m).toEqual({ json: j, fromVersion: 1, readOnly: false, findings: [] });
    const p = loadProjectText(JSON.stringify(j));
    expect(p.readOnly).toBeUndefined();
    expect(p.findings.map((f) => f.code)).not.toContain('migrated-format');
  });
});

describe('older versions migrate step by step', () => {
  it('v1 -> v3 applies both steps in order, records the notes, and does not change its input', () => {
    const j = demo();
    const before = JSON.stringify(j);
    const m = migrateProject(j, { steps: STEPS, current: 3 });
    expect(JSON.stringify(j)).toBe(before);
    expect(m.fromVersion).toBe(1);
    expect(m.readOnly).toBe(false);
    expect(m.json['version']).toBe(3);
    expect((m.json['inverter'] as Json)['Vdc']).toBe(48);
    expect((m.json['inverter'] as Json)['busVoltage']).toBeUndefined();
    expect(m.json['note']).toBeUndefined();
    expect(m.findings).toHaveLength(1);
    expect(m.findings[0]!.code).toBe('migrated-format');
    expect(m.findings[0]!.message).toBe('Read from project format version 1 and brought to version 3: inverter.Vdc renamed inverter.busVoltage; inverter.busVoltage is inverter.Vdc again; note dropped. Saving writes version 3.');
  });

  it('v2 -> v3 applies only the last step', () => {
    const j = { ...demo(), version: 2 } as Json;
    j.inverter = { ...j.inverter, busVoltage: 60 };
    delete j.inverter.Vdc;
    const m = migrateProject(j, { steps: STEPS, current: 3 });
    expect((m.json['inverter'] as Json)['Vdc']).toBe(60);
    expect(m.findings[0]!.message).toMatch(/^Read from project format version 2 and brought to version 3: inverter\.busVoltage is/);
  });

  it('a gap in the steps is refused naming the version', () => {
    const e = refusal(() => migrateProject(demo(), { steps: [STEPS[1]!], current: 3 }));
    expect(e.message).toBe('version is 1: no migration from version 1 to 2 is known; this Torquewise reads version 3');
  });

  it('a version that is not a whole number >= 1 is refused', () => {
    for (const v of [0, -1, 1.5, '1', null, undefined, NaN, Infinity]) {
      const e = refusal(() => migrateProject({ ...demo(), version: v }));
      expect(e.field).toBe('version');
      expect(e.message).toBe('version must be 1');
    }
    expect(refusal(() => migrateProject({ ...demo(), version: 0 }, { steps: STEPS, current: 3 })).message).toBe('version must be a whole number from 1 to 3');
  });

  it('not a project at all: format and shape are named', () => {
    expect(refusal(() => migrateProject([])).field).toBe('file');
    expect(refusal(() => migrateProject({ ...demo(), format: 'other' })).field).toBe('format');
  });
});

describe('newer versions open read-only with a message', () => {
  it('a version-7 file that this version understands opens read-only with a warning', () => {
    const p = loadProjectText(JSON.stringify({ ...demo(), version: 7 }));
    expect(p.readOnly).toBe(true);
    const f = p.findings[0]!;
    expect(f.code).toBe('newer-format');
    expect(f.severity).toBe('warning');
    expect(f.message).toMatch(/^This file was written in project format version 7; this Torquewise reads version 1\. It is shown read-only/);
    // its content is read as far as this version knows it
    expect(p.inverter.Vdc).toBe(48);
  });

  it('a newer file with keys this version does not know is refused naming the version and the key', () => {
    const j = { ...demo(), version: 2 } as Json;
    j.inverter = { ...j.inverter, dcLinkCapacitance: 1e-3 };
    const e = refusal(() => loadProjectText(JSON.stringify(j)));
    expect(e.field).toBe('version');
    expect(e.message).toMatch(/^version is 2: the file was written by a newer Torquewise; this one reads version 1 and cannot read it \(inverter\.dcLinkCapacitance is not a known key/);
  });

  it('migrating a newer file does not change its input and keeps its version out of the copy', () => {
    const j = { ...demo(), version: 5 };
    const m = migrateProject(j);
    expect(j.version).toBe(5);
    expect(m.json['version']).toBe(1);
    expect(m.fromVersion).toBe(5);
  });
});
