// The window's source arranged by purpose (src/renderer/src): app/ (the window), state/ (the app's
// state and what it computes), workers/ (off-thread runs), components/ (shared pieces), views/<name>/
// (one view each). Checked on every relative import (type-only ones too):
//   - no file reaches itself again through its imports (no cycles);
//   - a view never imports another view (what two views share lives in components/ or state/);
//   - components/ and state/ never import views/ or app/;
//   - workers/ import only src/core and workers/.
import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import { dirname, join, relative, resolve, sep } from 'node:path';
import { describe, expect, it } from 'vitest';

const root = resolve(__dirname, '..');
const rendererRoot = join(root, 'src', 'renderer', 'src');

function walk(dir: string): string[] {
  const out: string[] = [];
  for (const name of readdirSync(dir)) {
    const p = join(dir, name);
    if (statSync(p).isDirectory()) out.push(...walk(p));
    else if (/\.(ts|tsx)$/.test(name) && !name.endsWith('.d.ts')) out.push(p);
  }
  return out;
}

function importSpecs(file: string): string[] {
  const src = readFileSync(file, 'utf8');
  const re = /(?:import|export)\s[^'"]*?from\s*['"]([^'"]+)['"]|import\s*\(\s*['"]([^'"]+)['"]\s*\)|import\s+['"]([^'"]+)['"]/g;
  const out: string[] = [];
  for (let m = re.exec(src); m; m = re.exec(src)) out.push((m[1] ?? m[2] ?? m[3])!);
  return out;
}

/** A relative import's file: the path as written, or with .ts, .tsx, /index.ts(x) added. */
function resolveSpec(from: string, spec: string): string {
  const base = resolve(dirname(from), spec);
  for (const c of [base, `${base}.ts`, `${base}.tsx`, join(base, 'index.ts'), join(base, 'index.tsx')]) if (existsSync(c) && statSync(c).isFile()) return c;
  return base;
}

/** The relative imports of every file, as absolute paths. */
function importGraph(files: string[]): Map<string, string[]> {
  const g = new Map<string, string[]>();
  for (const f of files) g.set(f, importSpecs(f).filter((s) => s.startsWith('.')).map((s) => resolveSpec(f, s)));
  return g;
}

/** One cycle of the graph (a list of nodes, the first repeated at the end), or null. */
function findCycle(g: Map<string, string[]>): string[] | null {
  const state = new Map<string, 1 | 2>(); // 1: on the current path, 2: done
  const path: string[] = [];
  const visit = (n: string): string[] | null => {
    state.set(n, 1);
    path.push(n);
    for (const m of g.get(n) ?? []) {
      if (!g.has(m)) continue;
      const s = state.get(m);
      if (s === 1) return [...path.slice(path.indexOf(m)), m];
      if (s === undefined) {
        const c = visit(m);
        if (c) return c;
      }
    }
    path.pop();
    state.set(n, 2);
    return null;
  };
  for (const n of g.keys()) {
    if (state.has(n)) continue;
    const c = visit(n);
    if (c) return c;
  }
  return null;
}

/** The part of src/renderer/src a file is in: 'app', 'state', 'workers', 'components', 'views/<name>', or null outside. */
function partOf(abs: string): string | null {
  const rel = relative(rendererRoot, abs).split(sep);
  if (rel[0] === '..' || rel.length < 2) return null;
  return rel[0] === 'views' ? `views/${rel[1]}` : rel[0]!;
}

const files = walk(rendererRoot);
const graph = importGraph(files);
const rel = (f: string) => relative(root, f).split(sep).join('/');

describe('renderer layout', () => {
  it('finds the parts of the window source', () => {
    // common practice (no source): a layout check that finds no files checks nothing
    const parts = new Set(files.map(partOf));
    for (const p of ['app', 'state', 'workers', 'components', 'views/envelope', 'views/datasheet', 'views/tuning', 'views/load-steps', 'views/inputs']) expect(parts.has(p), p).toBe(true);
  });

  it('the cycle finder finds a cycle of three and none in a chain', () => {
    // common practice (no source): depth-first search with an on-path mark finds a back edge
    const cyc = findCycle(new Map([['a', ['b']], ['b', ['c']], ['c', ['a']], ['d', ['a']]]));
    expect(cyc).toEqual(['a', 'b', 'c', 'a']);
    expect(findCycle(new Map([['a', ['b']], ['b', ['c']], ['c', []]]))).toBeNull();
  });

  it('every relative import names a file that exists', () => {
    // common practice (no source): an import the checks cannot follow would escape them
    const missing: string[] = [];
    for (const [f, deps] of graph) for (const d of deps) if (!existsSync(d) || !statSync(d).isFile()) missing.push(`${rel(f)} -> ${rel(d)}`);
    expect(missing).toEqual([]);
  });

  it('no import cycles between files', () => {
    // common practice (no source): an acyclic module graph loads in one order
    const c = findCycle(graph);
    expect(c?.map(rel) ?? null).toBeNull();
  });

  it('a view never imports another view', () => {
    // common practice (no source)
    const bad: string[] = [];
    for (const [f, deps] of graph) {
      const p = partOf(f);
      if (!p?.startsWith('views/')) continue;
      for (const d of deps) {
        const q = partOf(d);
        if (q?.startsWith('views/') && q !== p) bad.push(`${rel(f)} -> ${rel(d)}`);
      }
    }
    expect(bad).toEqual([]);
  });

  it('components/ and state/ never import views/ or app/', () => {
    // common practice (no source)
    const bad: string[] = [];
    for (const [f, deps] of graph) {
      const p = partOf(f);
      if (p !== 'components' && p !== 'state') continue;
      for (const d of deps) {
        const q = partOf(d);
        if (q === 'app' || q?.startsWith('views/')) bad.push(`${rel(f)} -> ${rel(d)}`);
      }
    }
    expect(bad).toEqual([]);
  });

  it('workers/ import only src/core and workers/', () => {
    // common practice (no source): a worker bundle carries the engine, never the window's code
    const core = join(root, 'src', 'core') + sep;
    const bad: string[] = [];
    for (const [f, deps] of graph) {
      if (partOf(f) !== 'workers') continue;
      for (const d of deps) if (!d.startsWith(core) && partOf(d) !== 'workers') bad.push(`${rel(f)} -> ${rel(d)}`);
      for (const s of importSpecs(f)) if (!s.startsWith('.')) bad.push(`${rel(f)} -> package ${s}`);
    }
    expect(bad).toEqual([]);
  });
});
