// CSV text for every table Torquewise writes (the app's exports and the command line's --csv).
// Shafranovich (2005), RFC 4180, "Common Format and MIME Type for Comma-Separated Values (CSV)
// Files": fields separated by commas, records by CRLF; a field holding a comma, a double quote or
// a line break is enclosed in double quotes, and a double quote inside is written twice. Here
// every text cell is quoted, always, so a name from a project file stays one cell whatever it holds.
//
// A spreadsheet runs a cell that starts with =, +, -, @, tab or CR as a formula (OWASP, "CSV
// Injection"): such a text cell is written with a leading single quote, so it is shown as text.
// Numbers are numbers, not text: -1.5 stays -1.5 and is never quoted or prefixed.

/** A cell: text (quoted, neutralised), a number (finite: shortest form at 10 significant digits; else empty), or empty. */
export type CsvCell = string | number | null;

/** Significant digits of a number cell. */
export const CSV_DIGITS = 10;

/** RFC 4180 record separator. */
export const CSV_EOL = '\r\n';

/** First characters a spreadsheet reads as the start of a formula. */
const FORMULA_START = /^[=+\-@\t\r]/;

/** One text cell: neutralised against formula injection, then quoted per RFC 4180. */
export function csvText(text: string): string {
  const safe = FORMULA_START.test(text) ? `'${text}` : text;
  return `"${safe.replace(/"/g, '""')}"`;
}

/** One number cell: empty when not finite (a CSV has no NaN). */
export function csvNumber(x: number): string {
  return Number.isFinite(x) ? String(Number(x.toPrecision(CSV_DIGITS))) : '';
}

export function csvCell(c: CsvCell): string {
  if (c === null) return '';
  return typeof c === 'number' ? csvNumber(c) : csvText(c);
}

/** One record, without its line end. */
export function csvRow(cells: readonly CsvCell[]): string {
  return cells.map(csvCell).join(',');
}

/** A whole table: every record ends with CRLF. */
export function csvDocument(rows: Iterable<readonly CsvCell[]>): string {
  let out = '';
  for (const r of rows) out += csvRow(r) + CSV_EOL;
  return out;
}

/**
 * Read CSV text back into records of raw cell strings (quotes removed, doubled quotes undone).
 * Accepts CRLF or LF record ends; a line break inside quotes belongs to the cell. Used by the tests
 * and the reliability run to check that what was written reads back cell for cell.
 */
export function parseCsv(text: string): string[][] {
  const rows: string[][] = [];
  let row: string[] = [];
  let cell = '';
  let quoted = false;
  let i = 0;
  const n = text.length;
  while (i < n) {
    const ch = text[i]!;
    if (quoted) {
      if (ch === '"') {
        if (text[i + 1] === '"') {
          cell += '"';
          i += 2;
          continue;
        }
        quoted = false;
        i++;
        continue;
      }
      cell += ch;
      i++;
      continue;
    }
    if (ch === '"' && cell === '') {
      quoted = true;
      i++;
    } else if (ch === ',') {
      row.push(cell);
      cell = '';
      i++;
    } else if (ch === '\r' && text[i + 1] === '\n') {
      row.push(cell);
      rows.push(row);
      row = [];
      cell = '';
      i += 2;
    } else if (ch === '\n') {
      row.push(cell);
      rows.push(row);
      row = [];
      cell = '';
      i++;
    } else {
      cell += ch;
      i++;
    }
  }
  if (cell !== '' || row.length > 0) {
    row.push(cell);
    rows.push(row);
  }
  return rows;
}

const NUMBER_CELL = /^-?(\d+\.?\d*|\.\d+)(e[-+]?\d+)?$/i;

/**
 * True when a cell as read back (quotes removed) would start a formula in a spreadsheet: it starts
 * with =, +, -, @, tab or CR and is not a plain number such as -1.5.
 */
export function readsAsFormula(cell: string): boolean {
  return FORMULA_START.test(cell) && !NUMBER_CELL.test(cell);
}
