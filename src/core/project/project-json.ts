/**
 * Project text -> its JSON value, as every reader takes it (app, worker, CLI): syntax errors placed
 * by line and column, a key given twice in one object refused by its path.
 */
import { InputError } from '../base/errors';
import { findDuplicateKey } from './json-duplicates';

/** Where a JSON.parse message puts the error: "at position N" (V8) or "line L column C". */
function lineColumn(text: string, message: string): { line: number; column: number } | null {
  const lc = /line (\d+) column (\d+)/.exec(message);
  if (lc) return { line: Number(lc[1]), column: Number(lc[2]) };
  const pos = /position (\d+)/.exec(message);
  const at = pos ? Math.min(Number(pos[1]), text.length) : /end of JSON input/.test(message) ? text.length : firstBadOffset(text);
  let line = 1;
  let col = 1;
  for (let i = 0; i < at; i++) {
    if (text.charCodeAt(i) === 10) {
      line++;
      col = 1;
    } else col++;
  }
  return { line, column: col };
}

/**
 * Where a text stops being a valid JSON prefix, when the parser does not say: the longest prefix
 * whose only fault is that it ends early (the parser ran off its end). Bisection, at most ~log2(length) parses.
 */
function firstBadOffset(text: string): number {
  const endsEarly = (n: number): boolean => {
    try {
      JSON.parse(text.slice(0, n));
      return true;
    } catch (e) {
      if (!(e instanceof Error)) return false;
      if (/end of JSON input/.test(e.message)) return true;
      const at = /position (\d+)/.exec(e.message);
      return at !== null && Number(at[1]) >= n; // ran off the end of the prefix

    }
  };
  let lo = 0;
  let hi = text.length;
  for (let k = 0; k < 64 && hi - lo > 1; k++) {
    const mid = (lo + hi) >> 1;
    if (endsEarly(mid)) lo = mid;
    else hi = mid;
  }
  return lo;
}

/**
 * Project text -> its JSON value, as every reader takes it (app, worker, CLI): a leading byte-order
 * mark is ignored; a syntax error is InputError('file', 'is not valid JSON: ... at line L column C');
 * a key given twice in one object is InputError naming its path (JSON.parse would keep the last).
 */
export function parseProjectJson(source: string): unknown {
  // a UTF-8 byte-order mark, as some editors write it, is not JSON: drop it
  const text = source.charCodeAt(0) === 0xfeff ? source.slice(1) : source;
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (e) {
    const raw = e instanceof Error ? e.message : String(e);
    const where = lineColumn(text, raw);
    // keep the engine's reason, drop its own position wording and any echo of the text
    const reason = raw.replace(/\s*\(line \d+ column \d+\)/, '').replace(/\s*(at|in JSON at) position \d+.*$/, '').replace(/,\s*(\.\.\.)?"[\s\S]*$/, '').replace(/\r?\n/g, '\\n').trim();
    // an invisible character (NUL, a second byte-order mark) shown by its code point
    const lead = (reason || 'unexpected input').replace(/[\u0000-\u001f\u007f-\u009f\ufeff]/g, (c) => `U+${c.charCodeAt(0).toString(16).toUpperCase().padStart(4, '0')}`);
    throw new InputError('file', `is not valid JSON: ${lead}${where ? ` at line ${where.line} column ${where.column}` : ''}`);
  }
  const dup = findDuplicateKey(text);
  if (dup) throw new InputError(dup.path, 'is given twice in one object; give each key once (which of the values was meant is a guess)');
  return json;
}
