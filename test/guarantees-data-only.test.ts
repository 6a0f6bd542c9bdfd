// Project files are data only: nothing in a file is run, fetched or loaded. Checked two ways:
// the source tree holds no construct that runs or fetches text (with two named exceptions), and
// every command over a project full of URLs and script text touches no network or eval.
import { sourceFiles } from './helpers';
import { describe, expect, it, afterEach } from 'vitest';
import { readFileSync } from 'node:fs';
import { join, relative, resolve } from 'node:path';
import { runCase, DEMOS, COMMAND_NAMES } from '../trust/fuzz-cases';
import { loadProjectText } from '../src/core/project/project';
import { InputError } from '../src/core/base/errors';

const root = resolve(__dirname, '..');
const files = sourceFiles;

const FORBIDDEN: Array<[string, RegExp]> = [
  ['eval', /\beval\s*\(/],
  ['new Function', /\bnew\s+Function\b/],
  ['dynamic import', /\bimport\s*\(\s*[^'"\s]/],
  ['require of a computed name', /\brequire\s*\(\s*[^'"\s)]/],
  ['fetch', /\bfetch\s*\(/],
  ['XMLHttpRequest', /\bXMLHttpRequest\b/],
  ['WebSocket', /\bWebSocket\b/],
  ['EventSource', /\bEventSource\b/],
  ['importScripts', /\bimportScripts\b/],
  ['innerHTML', /\.(inner|outer)HTML\s*=/],
  ['dangerouslySetInnerHTML', /dangerouslySetInnerHTML/],
  ['openExternal', /\bopenExternal\b/],
];
// the places that load code, none from a project file:
const ALLOWED: Array<[string, RegExp]> = [
  ['src/renderer/src/views/load-steps/LoadStepsView.tsx', /new Worker\(new URL\('\.\.\/\.\.\/workers\/sim-worker\.ts', import\.meta\.url\)/], // the bundled simulation worker
  ['src/renderer/src/views/efficiency/EfficiencyView.tsx', /new Worker\(new URL\('\.\.\/\.\.\/workers\/efficiency-worker\.ts', import\.meta\.url\)/], // the bundled efficiency-map worker
  ['src/renderer/src/views/datasheet/DatasheetEfficiency.tsx', /new Worker\(new URL\('\.\.\/\.\.\/workers\/efficiency-worker\.ts', import\.meta\.url\)/], // the same bundled efficiency-map worker, for the datasheet's map
  ['src/renderer/src/views/envelope/EnvelopeView.tsx', /new Worker\(new URL\('\.\.\/\.\.\/workers\/thermal-worker\.ts', import\.meta\.url\)/], // the bundled thermal worker (S1 curve)
  ['src/renderer/src/views/duty-cycle/DutyCycleView.tsx', /new Worker\(new URL\('\.\.\/\.\.\/workers\/thermal-worker\.ts', import\.meta\.url\)/], // the bundled thermal worker (duty cycle)
  ['src/renderer/src/views/compare/CompareView.tsx', /new Worker\(new URL\('\.\.\/\.\.\/workers\/compare-worker\.ts', import\.meta\.url\)/], // the bundled comparison worker (design variants)
  ['src/renderer/src/views/tolerances/TolerancesView.tsx', /new Worker\(new URL\('\.\.\/\.\.\/workers\/tolerance-worker\.ts', import\.meta\.url\)/], // the bundled tolerance worker (corners, and each Monte Carlo chunk)
  ['src/renderer/src/views/tuning/CurrentTableCard.tsx', /new Worker\(new URL\('\.\.\/\.\.\/workers\/current-table-worker\.ts', import\.meta\.url\)/], // the bundled current-table worker (firmware table export)
  ['src/node/worker-pool.ts', /new Worker\(ws\.script, \{ workerData \}\)/], // the CLI's map threads: the bundle itself, or src/cli/efficiency-worker-source.mjs (src/cli/efficiency-workers.ts)
  ['src/main/index.ts', /\.loadURL\(devServerUrl\)/], // the loopback dev server, development builds only
  ['src/main/index.ts', /\.loadURL\(APP_PAGE_URL\)/], // the built page, app://torquewise/index.html (src/main/app-protocol.ts)
];
// HTML built from text this program made, never from a file: plotly's own SVG of a plot, placed in a
// detached copy of the Datasheet view for the HTML export (the CSP forbids inline script anyway)
const HTML_ALLOWED: Array<[string, RegExp]> = [['src/renderer/src/components/image-export.ts', /slot\.outerHTML = `<div class="plot-image">\$\{svg\}<\/div>`/]];

describe('no code runs from a project file', () => {
  const all = files(join(root, 'src'));
  it('finds the source tree', () => {
    expect(all.length).toBeGreaterThan(40);
  });
  it('the source holds no eval, Function, computed import/require, network call or HTML injection', () => {
    const hits: string[] = [];
    for (const f of all) {
      const rel = relative(root, f).split('\\').join('/');
      const lines = readFileSync(f, 'utf8').split('\n');
      lines.forEach((line, i) => {
        if (/^\s*(\/\/|\*)/.test(line)) return;
        if (HTML_ALLOWED.some(([file, re]) => file === rel && re.test(line))) return;
        for (const [what, re] of FORBIDDEN) if (re.test(line)) hits.push(`${rel}:${i + 1} ${what}: ${line.trim()}`);
      });
    }
    expect(hits).toEqual([]);
  });
  it('the only code loaders are the bundled worker, the built page (app scheme) and the development server, each at one known place', () => {
    const loaders: string[] = [];
    for (const f of all) {
      const rel = relative(root, f).split('\\').join('/');
      const src = readFileSync(f, 'utf8');
      for (const m of src.matchAll(/new Worker\([^\n]*|\.loadURL\([^\n]*|\.loadFile\([^\n]*/g)) loaders.push(`${rel}: ${m[0]}`);
    }
    const unexpected = loaders.filter((l) => !ALLOWED.some(([file, re]) => l.startsWith(`${file}: `) && re.test(l)));
    expect(unexpected).toEqual([]);
    expect(loaders.length).toBeGreaterThanOrEqual(2);
  });
});

describe('a project full of URLs and script text is only data', () => {
  const saved = { fetch: globalThis.fetch, eval: globalThis.eval };
  afterEach(() => {
    globalThis.fetch = saved.fetch;
    globalThis.eval = saved.eval;
  });

  it('every command runs without calling fetch or eval, and the text stays text', async () => {
    const calls: string[] = [];
    globalThis.fetch = ((u: unknown) => {
      calls.push(`fetch ${String(u)}`);
      throw new Error('no network');
    }) as typeof fetch;
    globalThis.eval = ((s: unknown) => {
      calls.push(`eval ${String(s)}`);
      throw new Error('no eval');
    }) as typeof eval;
    const j = structuredClone(DEMOS['demo-servo-axis']) as Record<string, any>;
    j.name = 'https://example.invalid/x.js <script>alert(1)</script> ${process.exit(1)}';
    j.note = "javascript:alert(1); require('child_process').exec('false'); file:///etc/passwd";
    j.requirements[0].label = '<img src=x onerror=alert(1)>';
    for (const command of COMMAND_NAMES) {
      const flags = command === 'point' ? ['--speed', '1000', '--torque', '1'] : [];
      const r = await runCase({ input: { value: j }, command, flags });
      expect(r.kind).toBe('ok');
    }
    expect(calls).toEqual([]);
    const p = loadProjectText(JSON.stringify(j));
    expect(p.name).toBe(j.name);
  });

  it('a __proto__ key is refused as an unknown key and pollutes nothing', () => {
    const text = JSON.stringify(DEMOS['demo-spm-48v']).replace('"motor":{', '"motor":{"__proto__":{"polluted":1},');
    expect(() => loadProjectText(text)).toThrow(InputError);
    expect(() => loadProjectText(text)).toThrow(/^motor\.__proto__ is not a known key/);
    expect(({} as Record<string, unknown>)['polluted']).toBeUndefined();
  });
});
