// The editable project: a JSON tree plus the exact text the user typed in each field.
// Typed text is never lost: a field that does not parse as a number keeps its text in the tree
// (the schema then names it), and the form always shows what was typed.

export type Json = null | boolean | number | string | Json[] | { [k: string]: Json };
export type Path = string; // dotted, array indices as numbers: "requirements.0.speed_rpm"

export interface Draft {
  /** the project tree as it would be saved (numbers where the text parsed, else the raw text) */
  tree: Json;
  /** what the user typed, by path, for fields edited since the tree was loaded */
  texts: Record<Path, string>;
}

export const split = (path: Path): string[] => (path === '' ? [] : path.split('.'));

/** Schema paths may come as "a[0].b" or "a.0.b"; normalise to dotted. */
export const normalisePath = (p: string | Array<string | number>): Path =>
  (Array.isArray(p) ? p.join('.') : p).replace(/\[(\d+)\]/g, '.$1').replace(/^\./, '');

export function getAt(tree: Json, path: Path): Json | undefined {
  let cur: Json | undefined = tree;
  for (const k of split(path)) {
    if (cur === null || typeof cur !== 'object') return undefined;
    cur = Array.isArray(cur) ? cur[Number(k)] : (cur as Record<string, Json>)[k];
  }
  return cur;
}

function clone<T extends Json>(x: T): T {
  return JSON.parse(JSON.stringify(x)) as T;
}

/** A copy of `tree` with `value` at `path` (undefined deletes the key), creating objects on the way. */
export function setAt(tree: Json, path: Path, value: Json | undefined): Json {
  const root = clone(tree ?? {});
  const keys = split(path);
  let cur: any = root;
  for (let i = 0; i < keys.length - 1; i++) {
    const k = keys[i]!;
    const next = cur[Array.isArray(cur) ? Number(k) : k];
    if (next === null || typeof next !== 'object') cur[k] = /^\d+$/.test(keys[i + 1]!) ? [] : {};
    cur = cur[Array.isArray(cur) ? Number(k) : k];
  }
  const last = keys[keys.length - 1]!;
  if (value === undefined) {
    if (Array.isArray(cur)) cur.splice(Number(last), 1);
    else delete cur[last];
  } else if (Array.isArray(cur)) cur[Number(last)] = value;
  else cur[last] = value;
  return root;
}

/** What a numeric field's text means in the tree: a number when it parses, else the text itself. */
export function parseNumberText(text: string): number | string | undefined {
  const t = text.trim();
  if (t === '') return undefined;
  const n = Number(t);
  return Number.isFinite(n) ? n : text;
}

export function editNumber(d: Draft, path: Path, text: string, optional: boolean): Draft {
  const v = parseNumberText(text);
  const value = v === undefined ? (optional ? undefined : '') : v;
  return { tree: setAt(d.tree, path, value), texts: { ...d.texts, [path]: text } };
}

export function editValue(d: Draft, path: Path, value: Json | undefined): Draft {
  const texts = { ...d.texts };
  delete texts[path];
  return { tree: setAt(d.tree, path, value), texts };
}

/** Replace a whole subtree (rows added or removed): forget typed texts below it (the tree keeps them). */
export function editSubtree(d: Draft, path: Path, value: Json | undefined): Draft {
  const texts: Record<Path, string> = {};
  for (const [k, v] of Object.entries(d.texts)) if (!(k === path || k.startsWith(path + '.'))) texts[k] = v;
  return { tree: setAt(d.tree, path, value), texts };
}

/** The text a field shows: what was typed, else the tree's value. */
export function textOf(d: Draft, path: Path): string {
  const t = d.texts[path];
  if (t !== undefined) return t;
  const v = getAt(d.tree, path);
  return v === undefined || v === null ? '' : String(v);
}

export const newDraft = (tree: Json): Draft => ({ tree, texts: {} });
