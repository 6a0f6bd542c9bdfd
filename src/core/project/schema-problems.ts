/**
 * The problems of a project file in our own words, each naming its path and what is allowed, e.g.
 * `motor.Ld must be >= 1e-9 H`: zod's issues phrased with the units of KEYS, the header (format,
 * version) and list-length checks made before the schema looks at any entry.
 */
import type { z } from 'zod';
import { CAPPED_LISTS, KEYS, MAX_LIST_ENTRIES, PROJECT_FORMAT, PROJECT_VERSION } from './schema-keys';

export interface ProjectProblem {
  /** project path, e.g. "motor.Ld" or "requirements[2].speed_rpm" ("file" for the whole file) */
  path: string;
  /** what is wrong, without the path, e.g. "must be > 0 H" */
  message: string;
}

/** The message for a file that gives both motor and nameplate (the schema adds it at the path nameplate). */
export const CHOOSE_ONE = 'and motor are both given: choose one, motor (the dq model) or nameplate (datasheet terms), and remove the other';

/** "requirements.2.speed_rpm" style zod path -> "requirements[2].speed_rpm" and its KEYS pattern */
function pathOf(segments: readonly PropertyKey[]): { shown: string; pattern: string } {
  let shown = '';
  let pattern = '';
  for (const s of segments) {
    if (typeof s === 'number') {
      shown += `[${s}]`;
      pattern += '[]';
    } else {
      const k = String(s);
      shown += shown ? `.${k}` : k;
      pattern += pattern ? `.${k}` : k;
    }
  }
  return { shown, pattern };
}

const unitOf = (pattern: string): string => KEYS[pattern]?.unit ?? '';
const withUnit = (text: string, unit: string): string => (unit ? `${text} ${unit}` : text);
const fmtLimit = (x: number | bigint): string => String(x);

function known(prefix: string): string[] {
  const out: string[] = [];
  for (const k of Object.keys(KEYS)) {
    if (prefix === '' ? !k.includes('.') && !k.includes('[') : k.startsWith(`${prefix}.`) && !k.slice(prefix.length + 1).includes('.') && !k.slice(prefix.length + 1).includes('[')) {
      out.push(prefix === '' ? k : k.slice(prefix.length + 1));
    }
  }
  return out;
}

const TYPE_WORD: Record<string, string> = {
  number: 'a number',
  int: 'a whole number',
  string: 'text',
  boolean: 'true or false',
  object: 'an object { ... }',
  array: 'a list [ ... ]',
};

/** Our own phrasing of one zod issue. */
function phrase(iss: z.core.$ZodIssue, input: unknown): ProjectProblem[] {
  const { shown, pattern } = pathOf(iss.path);
  const unit = unitOf(pattern);
  const at = (m: string): ProjectProblem[] => [{ path: shown || 'file', message: m }];
  switch (iss.code) {
    case 'invalid_type': {
      if (iss.expected === 'int') return at('must be a whole number');
      const value = lookup(input, iss.path);
      if (value === undefined) {
        const d = KEYS[pattern];
        return at(d ? `is required (${withUnit(d.doc, unit ? `in ${unit}` : '').trim()})` : 'is required');
      }
      if (iss.expected === 'number' && typeof value === 'number') return at(withUnit('must be a finite number', unit ? `in ${unit}` : ''));
      if (iss.expected === 'number' && value !== null && typeof value === 'object' && !Array.isArray(value) && ('value' in value || 'basis' in value)) return at(withBasisMessage(value as Record<string, unknown>, unit));
      return at(`must be ${TYPE_WORD[iss.expected] ?? iss.expected}${unit && iss.expected === 'number' ? ` in ${unit}` : ''}`);
    }
    case 'too_small':
      if (iss.origin === 'string') return at('must not be empty');
      if (iss.origin === 'array') return at(`must have at least ${fmtLimit(iss.minimum)} entries`);
      return at(withUnit(`must be ${iss.inclusive ? '>=' : '>'} ${fmtLimit(iss.minimum)}`, unit));
    case 'too_big':
      if (iss.origin === 'string') return at(`must be at most ${fmtLimit(iss.maximum)} characters`);
      if (iss.origin === 'array') return at(`must have at most ${fmtLimit(iss.maximum)} entries`);
      return at(withUnit(`must be ${iss.inclusive ? '<=' : '<'} ${fmtLimit(iss.maximum)}`, unit));
    case 'unrecognized_keys':
      return iss.keys.map((key) => {
        const allowed = known(pattern);
        // a runaway key (pasted text) is shown by its start and length, so the message stays one short line
        const k = key.length > 60 ? `${key.slice(0, 40)}… (${key.length} characters)` : key;
        return {
          path: shown ? `${shown}.${k}` : k,
          message: `is not a known key${allowed.length ? ` (known here: ${allowed.join(', ')})` : ''}`,
        };
      });
    case 'invalid_value':
      if (iss.values.length === 1) return at(`must be ${JSON.stringify(iss.values[0])}`);
      return at(`must be one of ${iss.values.map((v) => JSON.stringify(v)).join(', ')}`);
    case 'custom':
      return at(iss.message);
    default:
      return at('is not valid here');
  }
}

/** A {value, basis} object where a plain number belongs: where a basis is accepted, and what the number means here. */
function withBasisMessage(v: Record<string, unknown>, unit: string): string {
  if (unit === 'A') {
    const x = v['value'];
    const asPeak = typeof x === 'number' && Number.isFinite(x) && v['basis'] === 'rms' ? ` (${x} A rms = ${Number((x * Math.SQRT2).toPrecision(4))} A peak)` : '';
    return `must be a plain number in A peak${asPeak}: a current with a basis {value, basis} ("rms" or "peak") is accepted only in nameplate.ratedCurrent and nameplate.peakCurrent; everywhere else a current is a number in A peak`;
  }
  return `must be a plain number${unit ? ` in ${unit}` : ''}: {value, basis} objects belong to the nameplate section only`;
}

function lookup(root: unknown, path: readonly PropertyKey[]): unknown {
  let x: unknown = root;
  for (const s of path) {
    if (x === null || typeof x !== 'object') return undefined;
    x = (x as Record<PropertyKey, unknown>)[s as string];
  }
  return x;
}

/** A version or format check before the schema, so a newer file gets a plain message. */
export function headerProblem(json: unknown): ProjectProblem | null {
  if (json === null || typeof json !== 'object' || Array.isArray(json)) return { path: 'file', message: 'must be a JSON object { ... }' };
  const o = json as Record<string, unknown>;
  if (o.format !== PROJECT_FORMAT) {
    return { path: 'format', message: `must be "${PROJECT_FORMAT}" (this is not a Torquewise project file)` };
  }
  if (typeof o.version === 'number' && Number.isInteger(o.version) && o.version > PROJECT_VERSION) {
    return { path: 'version', message: `is ${o.version}: the file was written by a newer Torquewise (version ${o.version}); this one reads version ${PROJECT_VERSION}` };
  }
  if (o.version !== PROJECT_VERSION) return { path: 'version', message: `must be ${PROJECT_VERSION}` };
  return null;
}

/**
 * A list longer than MAX_LIST_ENTRIES, found by its length alone (no entry is read): checked
 * before the schema looks at any entry, and by the app before it lays a file out in its form.
 */
export function listCapProblem(json: unknown): ProjectProblem | null {
  for (const path of CAPPED_LISTS) {
    let x: unknown = json;
    for (const k of path) x = x !== null && typeof x === 'object' && !Array.isArray(x) ? (x as Record<string, unknown>)[k] : undefined;
    if (Array.isArray(x) && x.length > MAX_LIST_ENTRIES) return { path: path.join('.'), message: `must have at most ${MAX_LIST_ENTRIES} entries (it has ${x.length})` };
  }
  return null;
}

/**
 * The problems of one section in the order of its keys (stable; other sections' problems keep their
 * places): a section check that runs alongside the keys' own (motor: the constant terms or the flux
 * map) adds its problems last, and a missing motor.Ld is listed where the key stands.
 */
function inKeyOrder(problems: ProjectProblem[], section: string): ProjectProblem[] {
  const order = Object.keys(KEYS).filter((k) => k.startsWith(`${section}.`)).map((k) => k.slice(section.length + 1)).filter((k) => !/[.[]/.test(k));
  const rank = (path: string): number => {
    const i = order.indexOf(path.slice(section.length + 1).split(/[.[]/)[0]!);
    return i < 0 ? order.length : i;
  };
  const slots = problems.map((p, i) => (p.path.startsWith(`${section}.`) ? i : -1)).filter((i) => i >= 0);
  const sorted = slots.map((i) => problems[i]!).map((p, k) => ({ p, k })).sort((a, b) => rank(a.p.path) - rank(b.p.path) || a.k - b.k).map((x) => x.p);
  const out = [...problems];
  slots.forEach((slot, k) => (out[slot] = sorted[k]!));
  return out;
}

/**
 * The problems of zod's issues in our words; giving both motor and nameplate leads (zod runs the
 * file-level check only when the sections themselves are valid, and the rest follows from it).
 */
export function problemsOf(issues: readonly z.core.$ZodIssue[], json: unknown): ProjectProblem[] {
  const out = inKeyOrder(issues.flatMap((iss) => phrase(iss, json)), 'motor');
  const o = json as Record<string, unknown>;
  if (o['motor'] !== undefined && o['nameplate'] !== undefined && !out.some((p) => p.path === 'nameplate' && p.message === CHOOSE_ONE)) {
    out.unshift({ path: 'nameplate', message: CHOOSE_ONE });
  }
  return out;
}
