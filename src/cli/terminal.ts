// Text for a terminal. Names, labels, keys and paths come from files and command lines; printed
// raw, a control character could move the cursor or clear the screen, a newline (or U+2028/U+2029)
// could fake a line of output, and a bidirectional control could show text in another order than
// it has. Every printer of the CLI goes through `visible` (one line) or `terminalText` (lines).

/**
 * The characters escaped: C0 controls (tab, newline and carriage return included), DEL, C1
 * controls, the line and paragraph separators U+2028/U+2029, and the bidirectional marks and
 * controls (U+061C, U+200E, U+200F, U+202A..U+202E, U+2066..U+2069).
 */
const UNSAFE = /[\u0000-\u001f\u007f-\u009f\u061c\u200e\u200f\u2028\u2029\u202a-\u202e\u2066-\u2069]/g;

const escape = (c: string): string => `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`;

/** One line for a terminal: every unsafe character written as a \u escape. Idempotent (an escape is plain ASCII). */
export function visible(s: string): string {
  return s.replace(UNSAFE, escape);
}

/** Lines for a terminal: each made visible (so no entry can add, end or reorder lines), joined, with a final newline. */
export function terminalText(lines: readonly string[]): string {
  return lines.map(visible).join('\n') + '\n';
}

/**
 * A JSON document for a terminal: JSON.stringify escapes the C0 controls but writes the others raw;
 * here they become \u escapes too. Only string contents can hold them, and there a \u escape means
 * the same character: the parsed document is unchanged.
 */
export function terminalJson(doc: unknown): string {
  return JSON.stringify(doc).replace(UNSAFE, escape) + '\n';
}
