// The runtime layering of the source tree, checked on every import statement:
//   src/core      common: pure TypeScript, no Node, DOM, Electron or React (also type-checked
//                 with lib ES2022 only and no @types, see tsconfig.core.json)
//   src/renderer  browser: core, react, plotly; never Node or Electron
//   src/cli       node: core and Node; never Electron, React or the renderer
//   src/main      electron-main: core, Node, Electron; never the renderer or React
//   src/preload   electron sandbox: electron only (and core types)
import { readFileSync } from 'node:fs';
import { join, relative, resolve, dirname, sep } from 'node:path';
import { sourceFiles } from './helpers';
import { describe, expect, it } from 'vitest';

const root = resolve(__dirname, '..');

const files = sourceFiles;

function imports(file: string): string[] {
  const src = readFileSync(file, 'utf8');
  const re = /(?:import|export)\s[^'"]*?from\s*['"]([^'"]+)['"]|import\s*\(\s*['"]([^'"]+)['"]\s*\)|import\s+['"]([^'"]+)['"]|require\(\s*['"]([^'"]+)['"]\s*\)/g;
  const out: string[] = [];
  for (let m = re.exec(src); m; m = re.exec(src)) out.push((m[1] ?? m[2] ?? m[3] ?? m[4])!);
  return out;
}

const NODE_BUILTINS = /^(node:|fs$|fs\/|path$|os$|child_process$|crypto$|url$|util$|worker_threads$|stream$|events$|http$|https$|net$|zlib$|buffer$|process$)/;

function layerOf(abs: string): string {
  const rel = relative(join(root, 'src'), abs).split(sep);
  return rel[0]!;
}

interface Rule { forbidPackages: RegExp[]; allowLayers: string[] }
const RULES: Record<string, Rule> = {
  core: { forbidPackages: [NODE_BUILTINS, /^electron/, /^react/, /^plotly/], allowLayers: ['core', 'types'] },
  renderer: { forbidPackages: [NODE_BUILTINS, /^electron/], allowLayers: ['core', 'renderer', 'types'] },
  cli: { forbidPackages: [/^electron/, /^react/, /^plotly/], allowLayers: ['core', 'cli', 'types', 'node'] },
  node: { forbidPackages: [/^electron/, /^react/, /^plotly/], allowLayers: ['core', 'node', 'types'] },
  main: { forbidPackages: [/^react/, /^plotly/], allowLayers: ['core', 'main', 'node', 'types'] },
  preload: { forbidPackages: [NODE_BUILTINS, /^react/, /^plotly/], allowLayers: ['preload', 'core', 'types'] },
};

describe('source layering by runtime', () => {
  const all = files(join(root, 'src'));
  it('finds the source tree', () => {
    expect(all.some((f) => f.includes(`${sep}core${sep}`))).toBe(true);
  });
  for (const file of all) {
    const layer = layerOf(file);
    const rule = RULES[layer];
    if (!rule) continue;
    it(`${relative(root, file)} imports only what ${layer} may`, () => {
      for (const spec of imports(file)) {
        if (spec.startsWith('.')) {
          const target = resolve(dirname(file), spec);
          const tl = layerOf(target);
          expect(rule.allowLayers, `${spec} reaches layer ${tl}`).toContain(tl);
        } else {
          for (const bad of rule.forbidPackages) expect(bad.test(spec), `${layer} must not import ${spec}`).toBe(false);
        }
      }
    });
  }
  it('only src/main and src/preload import electron', () => {
    const offenders = all.filter((f) => !['main', 'preload'].includes(layerOf(f)) && imports(f).some((s) => /^electron/.test(s)));
    expect(offenders).toEqual([]);
  });
});

// Inside src/core, areas in import order: a file may import its own area and the areas before it,
// never one after it (the machine model knows nothing of drives, a solver nothing of the project
// file, the project nothing of reports).
//   base <- mathematics <- machine <- drive <- steady-state, control <- simulation <- project <- reports
// steady-state and control stand side by side: control may use steady-state (its reference table
// is built from the operating-point solver), steady-state never control.
const AREAS = ['base', 'mathematics', 'machine', 'drive', 'steady-state', 'control', 'simulation', 'project', 'reports'] as const;
function areaOf(abs: string): string | null {
  const rel = relative(join(root, 'src', 'core'), abs).split(sep);
  return rel.length >= 2 && !rel[0]!.startsWith('..') ? rel[0]! : null;
}
/** The project file's modules: no solver (machine to simulation) may import them. */
const PROJECT_MODULES = /[\\/]core[\\/]project[\\/]/;

describe('core areas in import order', () => {
  const coreFiles = files(join(root, 'src', 'core'));
  it('every core file sits in a known area', () => {
    const stray = coreFiles.filter((f) => !AREAS.includes(areaOf(f) as (typeof AREAS)[number])).map((f) => relative(root, f));
    expect(stray).toEqual([]);
  });
  for (const file of coreFiles) {
    const area = areaOf(file);
    const rank = AREAS.indexOf(area as (typeof AREAS)[number]);
    if (rank < 0) continue;
    it(`${relative(root, file)} imports only its own and earlier areas`, () => {
      for (const spec of imports(file)) {
        if (!spec.startsWith('.')) continue;
        const target = resolve(dirname(file), spec);
        const ta = areaOf(target);
        expect(ta, `${spec} leaves src/core`).not.toBeNull();
        const tr = AREAS.indexOf(ta as (typeof AREAS)[number]);
        expect(tr <= rank, `${area} must not import ${ta} (${spec})`).toBe(true);
        if (area !== 'project' && area !== 'reports') expect(PROJECT_MODULES.test(target), `a solver must not import the project (${spec})`).toBe(false);
      }
    });
  }
  it('no file in src/core is longer than 400 lines', () => {
    const long = coreFiles.map((f) => [relative(root, f), readFileSync(f, 'utf8').split('\n').length] as const).filter(([, n]) => n > 400);
    expect(long).toEqual([]);
  });
});
