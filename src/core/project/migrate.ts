/**
 * Project format versions. A file of an older version is brought up to the current one step by
 * step (each step a pure function of the parsed JSON, version n -> n + 1, with a note for the
 * user); a file of a newer version is read as far as this version understands it, read-only, with
 * a message. Version 1 is the first format, so there are no steps yet: the next format change adds
 * one to MIGRATIONS and raises PROJECT_VERSION in schema-keys.ts.
 */
import type { Finding } from '../base/finding';
import { InputError } from '../base/errors';
import { PROJECT_FORMAT, PROJECT_VERSION } from './schema-keys';

export interface MigrationStep {
  from: number;
  /** always from + 1 */
  to: number;
  /** what the step changes, shown to the user, e.g. "inverter.Idc was renamed inverter.Icont" */
  note: string;
  /** a new object for the next version; must not change its input */
  apply(json: Readonly<Record<string, unknown>>): Record<string, unknown>;
}

/** The steps between format versions, oldest first (none yet: version 1 is the first format). */
export const MIGRATIONS: readonly MigrationStep[] = [];

export interface MigrateOptions {
  steps: readonly MigrationStep[];
  /** the version this build writes and reads */
  current: number;
}

export const DEFAULT_MIGRATE_OPTIONS: Readonly<MigrateOptions> = { steps: MIGRATIONS, current: PROJECT_VERSION };

export interface Migrated {
  /** the project at the current version (for a newer file: its content under the current version number) */
  json: Record<string, unknown>;
  /** the version the file was written in */
  fromVersion: number;
  /** a newer file: show it, never write it back over itself */
  readOnly: boolean;
  /** what was done, for the project's findings */
  findings: Finding[];
}

/**
 * Bring a parsed project file to the current format version. Throws InputError('version', ...) for
 * a version that is not a whole number, or an older one without a path of steps. The input is not
 * changed. Other keys are left to the schema.
 */
export function migrateProject(json: unknown, options: Partial<MigrateOptions> = {}): Migrated {
  const o: MigrateOptions = { ...DEFAULT_MIGRATE_OPTIONS, ...options };
  if (json === null || typeof json !== 'object' || Array.isArray(json)) throw new InputError('file', 'must be a JSON object { ... }');
  const src = json as Record<string, unknown>;
  if (src['format'] !== PROJECT_FORMAT) throw new InputError('format', `must be "${PROJECT_FORMAT}" (this is not a Torquewise project file)`);
  const v = src['version'];
  if (typeof v !== 'number' || !Number.isInteger(v) || v < 1) throw new InputError('version', o.current === 1 ? 'must be 1' : `must be a whole number from 1 to ${o.current}`);
  if (v === o.current) return { json: src, fromVersion: v, readOnly: false, findings: [] };
  if (v > o.current) {
    return {
      json: { ...src, version: o.current },
      fromVersion: v,
      readOnly: true,
      findings: [{
        code: 'newer-format',
        severity: 'warning',
        field: 'version',
        message: `This file was written in project format version ${v}; this Torquewise reads version ${o.current}. It is shown read-only, as far as this version understands it: save a copy to keep changes, the file itself is not changed.`,
      }],
    };
  }
  let cur: Record<string, unknown> = src;
  let at = v;
  const notes: string[] = [];
  // at most one step per version between the file's and the current one
  for (let guard = 0; at < o.current && guard <= o.current; guard++) {
    const step = o.steps.find((s) => s.from === at);
    if (!step || step.to !== at + 1) throw new InputError('version', `is ${v}: no migration from version ${at} to ${at + 1} is known; this Torquewise reads version ${o.current}`);
    cur = { ...step.apply(cur), version: step.to };
    notes.push(step.note);
    at = step.to;
  }
  return {
    json: cur,
    fromVersion: v,
    readOnly: false,
    findings: [{
      code: 'migrated-format',
      severity: 'info',
      field: 'version',
      message: `Read from project format version ${v} and brought to version ${o.current}: ${notes.join('; ')}. Saving writes version ${o.current}.`,
    }],
  };
}
