// IPC channel names and the checks main applies to every argument from the renderer before it
// touches a file. A wrong shape gets a sentence naming the field; paths are judged separately
// (see path-grants.ts).
import { CHANNELS, type ExportKind, type ExportRequest, type RecoveryWriteRequest, type SaveAsRequest, type SaveRequest } from '../types/bridge';
import { MAX_PROJECT_BYTES } from '../core/project/schema-keys';

export { CHANNELS };

/**
 * Largest project text or export accepted over IPC, in characters or bytes: a project text as long
 * as a project file may be (the schema's MAX_PROJECT_BYTES, 16 MiB).
 */
export const MAX_TEXT_CHARS = MAX_PROJECT_BYTES;
export const MAX_EXPORT_BYTES = 64 * 1024 * 1024;
/** Longest path accepted. */
export const MAX_PATH_CHARS = 4096;

export const EXPORT_KINDS: readonly ExportKind[] = ['envelope-csv', 'traces-csv', 'plot-png', 'plot-svg', 'datasheet', 'efficiency-csv', 'duty-cycle-csv', 'switching-csv', 'current-table-header', 'tolerance-csv'];

/** Save-dialog filter, default name and content type per export. */
export const EXPORT_FORMATS: Record<ExportKind, { filterName: string; extension: string; binary: boolean; defaultName: string }> = {
  'envelope-csv': { filterName: 'CSV table', extension: 'csv', binary: false, defaultName: 'envelope.csv' },
  'traces-csv': { filterName: 'CSV table', extension: 'csv', binary: false, defaultName: 'load-step-traces.csv' },
  'plot-png': { filterName: 'PNG image', extension: 'png', binary: true, defaultName: 'plot.png' },
  'plot-svg': { filterName: 'SVG image', extension: 'svg', binary: false, defaultName: 'plot.svg' },
  datasheet: { filterName: 'HTML page', extension: 'html', binary: false, defaultName: 'datasheet.html' },
  'efficiency-csv': { filterName: 'CSV table', extension: 'csv', binary: false, defaultName: 'efficiency-map.csv' },
  'duty-cycle-csv': { filterName: 'CSV table', extension: 'csv', binary: false, defaultName: 'duty-cycle.csv' },
  'switching-csv': { filterName: 'CSV table', extension: 'csv', binary: false, defaultName: 'switching-window.csv' },
  'current-table-header': { filterName: 'C header', extension: 'h', binary: false, defaultName: 'current-table.h' },
  'tolerance-csv': { filterName: 'CSV table', extension: 'csv', binary: false, defaultName: 'tolerance-samples.csv' },
};

export type Checked<T> = { ok: true; value: T } | { ok: false; message: string };

const bad = (message: string): { ok: false; message: string } => ({ ok: false, message });

function isPlainObject(x: unknown): x is Record<string, unknown> {
  if (typeof x !== 'object' || x === null || Array.isArray(x)) return false;
  const proto = Object.getPrototypeOf(x) as unknown;
  return proto === Object.prototype || proto === null;
}

function onlyKeys(o: Record<string, unknown>, allowed: string[], what: string): string | null {
  for (const k of Object.keys(o)) if (!allowed.includes(k)) return `${what}.${k} is not a known field`;
  return null;
}

export function checkPath(x: unknown, field: string): Checked<string> {
  if (typeof x !== 'string' || x.length === 0) return bad(`${field} must be a non-empty string`);
  if (x.length > MAX_PATH_CHARS) return bad(`${field} must be at most ${MAX_PATH_CHARS} characters`);
  if (x.includes('\0')) return bad(`${field} must not contain a NUL character`);
  return { ok: true, value: x };
}

function checkText(x: unknown, field: string): Checked<string> {
  if (typeof x !== 'string') return bad(`${field} must be a string`);
  if (x.length > MAX_TEXT_CHARS) return bad(`${field} must be at most ${MAX_TEXT_CHARS} characters`);
  return { ok: true, value: x };
}

function checkSuggestedName(x: unknown, field: string): Checked<string | undefined> {
  if (x === undefined) return { ok: true, value: undefined };
  if (typeof x !== 'string' || x.length === 0 || x.length > 255) return bad(`${field} must be a file name of 1 to 255 characters`);
  if (/[\\/\0]/.test(x) || x === '.' || x === '..') return bad(`${field} must be a file name, not a path`);
  return { ok: true, value: x };
}

export function checkSaveRequest(x: unknown): Checked<SaveRequest> {
  if (!isPlainObject(x)) return bad('save: the request must be an object { path, text }');
  const extra = onlyKeys(x, ['path', 'text'], 'save');
  if (extra) return bad(extra);
  const p = checkPath(x['path'], 'save.path');
  if (!p.ok) return p;
  const t = checkText(x['text'], 'save.text');
  if (!t.ok) return t;
  return { ok: true, value: { path: p.value, text: t.value } };
}

export function checkSaveAsRequest(x: unknown): Checked<SaveAsRequest> {
  if (!isPlainObject(x)) return bad('saveAs: the request must be an object { text, suggestedName? }');
  const extra = onlyKeys(x, ['text', 'suggestedName'], 'saveAs');
  if (extra) return bad(extra);
  const t = checkText(x['text'], 'saveAs.text');
  if (!t.ok) return t;
  const n = checkSuggestedName(x['suggestedName'], 'saveAs.suggestedName');
  if (!n.ok) return n;
  return { ok: true, value: n.value === undefined ? { text: t.value } : { text: t.value, suggestedName: n.value } };
}

export function checkExportRequest(x: unknown): Checked<ExportRequest> {
  if (!isPlainObject(x)) return bad('export: the request must be an object { kind, data, suggestedName? }');
  const extra = onlyKeys(x, ['kind', 'data', 'suggestedName'], 'export');
  if (extra) return bad(extra);
  const kind = x['kind'];
  if (typeof kind !== 'string' || !(EXPORT_KINDS as readonly string[]).includes(kind)) return bad(`export.kind must be one of ${EXPORT_KINDS.join(', ')}`);
  const fmt = EXPORT_FORMATS[kind as ExportKind];
  const data = x['data'];
  if (fmt.binary) {
    if (!(data instanceof Uint8Array)) return bad(`export.data must be bytes (Uint8Array) for ${kind}`);
    if (data.byteLength > MAX_EXPORT_BYTES) return bad(`export.data must be at most ${MAX_EXPORT_BYTES} bytes`);
  } else {
    if (typeof data !== 'string') return bad(`export.data must be a string for ${kind}`);
    if (data.length > MAX_EXPORT_BYTES) return bad(`export.data must be at most ${MAX_EXPORT_BYTES} characters`);
  }
  const n = checkSuggestedName(x['suggestedName'], 'export.suggestedName');
  if (!n.ok) return n;
  const value: ExportRequest = { kind: kind as ExportKind, data: data as string | Uint8Array };
  if (n.value !== undefined) value.suggestedName = n.value;
  return { ok: true, value };
}

export function checkRecoveryWrite(x: unknown): Checked<RecoveryWriteRequest> {
  if (!isPlainObject(x)) return bad('recovery.write: the request must be an object { text, documentPath }');
  const extra = onlyKeys(x, ['text', 'documentPath'], 'recovery.write');
  if (extra) return bad(extra);
  const t = checkText(x['text'], 'recovery.write.text');
  if (!t.ok) return t;
  const dp = x['documentPath'];
  if (dp !== null) {
    const p = checkPath(dp, 'recovery.write.documentPath');
    if (!p.ok) return bad(`${p.message} or null`);
  }
  return { ok: true, value: { text: t.value, documentPath: dp as string | null } };
}
