import { visible } from './terminal';

/**
 * Plain fixed-width table for terminals, as lines: header row with units, right-aligned numbers.
 * Text cells (labels from a file) are made visible before they are measured, so columns stay aligned.
 */
export function table(header: readonly string[], rows: ReadonlyArray<ReadonlyArray<string | number>>, digits = 4): string[] {
  const cells = rows.map((r) => r.map((c) => (typeof c === 'number' ? fmt(c, digits) : visible(c))));
  const width = header.map((h, j) => Math.max(h.length, ...cells.map((r) => (r[j] ?? '').length)));
  const line = (r: readonly string[]) => r.map((c, j) => c.padStart(width[j]!)).join('  ');
  return [line(header), line(width.map((w) => '-'.repeat(w))), ...cells.map(line)];
}

export function fmt(x: number, digits = 4): string {
  if (!Number.isFinite(x)) return String(x);
  if (x === 0) return '0';
  const a = Math.abs(x);
  if (a >= 1e6 || a < 1e-3) return x.toExponential(digits - 1);
  return Number(x.toPrecision(digits)).toString();
}

/** A number for a table cell, or '-' where the quantity is not defined (null). */
export const orDash = (x: number | null, digits = 4): string => (x === null ? '-' : fmt(x, digits));
