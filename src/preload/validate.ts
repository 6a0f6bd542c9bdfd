// Shape checks the preload applies before anything is sent to main. Main checks again (it trusts
// nothing from the renderer); these give the page a clear message without a round trip.
// Kept free of imports other than types: the sandboxed preload bundles it.
import type { ExportKind } from '../types/bridge';

const EXPORT_KINDS: readonly ExportKind[] = ['envelope-csv', 'traces-csv', 'plot-png', 'plot-svg', 'datasheet', 'efficiency-csv', 'duty-cycle-csv', 'switching-csv', 'current-table-header', 'tolerance-csv'];

function isObject(x: unknown): x is Record<string, unknown> {
  return typeof x === 'object' && x !== null && !Array.isArray(x);
}
function unknownKey(o: Record<string, unknown>, allowed: string[], what: string): string | null {
  for (const k of Object.keys(o)) if (!allowed.includes(k)) return `${what}.${k} is not a known field`;
  return null;
}
const isPath = (x: unknown): x is string => typeof x === 'string' && x.length > 0 && x.length <= 4096 && !x.includes('\0');
function pathError(x: unknown, field: string): string | null {
  if (typeof x === 'string' && x.includes('\0')) return `${field} must not contain a NUL character`;
  return isPath(x) ? null : `${field} must be a non-empty string`;
}
const isName = (x: unknown): boolean => x === undefined || (typeof x === 'string' && x.length > 0 && x.length <= 255 && !/[\\/\0]/.test(x));

/** null when fine, else the message. */
export function shapeError(call: 'openRecent' | 'save' | 'saveAs' | 'export' | 'recovery.write', x: unknown): string | null {
  switch (call) {
    case 'openRecent':
      return pathError(x, 'openRecent.path');
    case 'save': {
      if (!isObject(x)) return 'save: the request must be an object { path, text }';
      const k = unknownKey(x, ['path', 'text'], 'save');
      if (k) return k;
      const p = pathError(x['path'], 'save.path');
      if (p) return p;
      return typeof x['text'] === 'string' ? null : 'save.text must be a string';
    }
    case 'saveAs': {
      if (!isObject(x)) return 'saveAs: the request must be an object { text, suggestedName? }';
      const k = unknownKey(x, ['text', 'suggestedName'], 'saveAs');
      if (k) return k;
      if (typeof x['text'] !== 'string') return 'saveAs.text must be a string';
      return isName(x['suggestedName']) ? null : 'saveAs.suggestedName must be a file name, not a path';
    }
    case 'export': {
      if (!isObject(x)) return 'export: the request must be an object { kind, data, suggestedName? }';
      const k = unknownKey(x, ['kind', 'data', 'suggestedName'], 'export');
      if (k) return k;
      const kind = x['kind'];
      if (typeof kind !== 'string' || !(EXPORT_KINDS as readonly string[]).includes(kind)) return `export.kind must be one of ${EXPORT_KINDS.join(', ')}`;
      if (kind === 'plot-png' ? !(x['data'] instanceof Uint8Array) : typeof x['data'] !== 'string') return `export.data must be ${kind === 'plot-png' ? 'bytes (Uint8Array)' : 'a string'} for ${kind}`;
      return isName(x['suggestedName']) ? null : 'export.suggestedName must be a file name, not a path';
    }
    case 'recovery.write': {
      if (!isObject(x)) return 'recovery.write: the request must be an object { text, documentPath }';
      const k = unknownKey(x, ['text', 'documentPath'], 'recovery.write');
      if (k) return k;
      if (typeof x['text'] !== 'string') return 'recovery.write.text must be a string';
      return x['documentPath'] === null || isPath(x['documentPath']) ? null : 'recovery.write.documentPath must be a non-empty string or null';
    }
  }
}
