/**
 * The first key that appears twice in one JSON object of a text. JSON.parse keeps the last value
 * of a repeated key without a word; a project file that gives a key twice is refused instead,
 * since which value was meant is a guess.
 *
 * One pass over a text that JSON.parse has accepted, with an explicit stack (no recursion, so
 * 50 000 levels of nesting cost 50 000 small frames, not the call stack), linear in its length.
 * Keys are compared after their escapes are decoded ("a" and "\u0061" are the same key).
 */

interface Frame {
  isObject: boolean;
  /** keys seen so far (objects; made at the first key) */
  keys: Set<string> | null;
  /** the current key (objects) */
  key: string;
  /** the current index (arrays) */
  index: number;
  /** objects: the next string is a key */
  expectKey: boolean;
}

export interface DuplicateKey {
  /** project path of the repeated key, e.g. "motor.Ld" or "requirements[1].label" */
  path: string;
  key: string;
}

/** A key as a path segment: plain names (and dotted names, as a tolerance's parameter path) as they are, others quoted and, when long, shortened. */
function segment(key: string): string {
  if (key.length <= 60 && /^[A-Za-z0-9_$-]+(\.[A-Za-z0-9_$-]+)*$/.test(key)) return key;
  const short = key.length > 60 ? `${key.slice(0, 40)}… (${key.length} characters)` : key;
  return JSON.stringify(short);
}

function pathOf(stack: readonly Frame[], last: string): string {
  let out = '';
  for (let d = 0; d < stack.length; d++) {
    const f = stack[d]!;
    if (d === stack.length - 1) break;
    out += f.isObject ? `${out ? '.' : ''}${segment(f.key)}` : `[${f.index}]`;
  }
  return `${out ? `${out}.` : ''}${segment(last)}`;
}

/** The first repeated key of an object in `text` (valid JSON), or null. */
export function findDuplicateKey(text: string): DuplicateKey | null {
  const stack: Frame[] = [];
  const n = text.length;
  let i = 0;
  while (i < n) {
    const c = text.charCodeAt(i);
    if (c === 0x22) {
      // a string: find its closing quote, stepping over escapes
      let j = i + 1;
      let escaped = false;
      while (j < n) {
        const d = text.charCodeAt(j);
        if (d === 0x5c) {
          escaped = true;
          j += 2;
          continue;
        }
        if (d === 0x22) break;
        j++;
      }
      const top = stack[stack.length - 1];
      if (top && top.isObject && top.expectKey) {
        const key = escaped ? (JSON.parse(text.slice(i, j + 1)) as string) : text.slice(i + 1, j);
        if (top.keys === null) top.keys = new Set();
        if (top.keys.has(key)) return { path: pathOf(stack, key), key };
        top.keys.add(key);
        top.key = key;
        top.expectKey = false;
      }
      i = j + 1;
      continue;
    }
    if (c === 0x7b || c === 0x5b) {
      stack.push({ isObject: c === 0x7b, keys: null, key: '', index: 0, expectKey: c === 0x7b });
    } else if (c === 0x7d || c === 0x5d) {
      stack.pop();
    } else if (c === 0x2c) {
      const top = stack[stack.length - 1];
      if (top) {
        if (top.isObject) top.expectKey = true;
        else top.index++;
      }
    }
    i++;
  }
  return null;
}
