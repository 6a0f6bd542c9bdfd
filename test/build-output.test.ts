// Builds the app once with electron-vite and checks what Electron will load: a CommonJS preload
// (a sandboxed preload cannot load ES modules), the main bundle and every path it loads, and
// the renderer page with its Content-Security-Policy meta tag.
// It builds into a fresh temporary folder with the project's own config (electron-vite's
// --outDir keeps the main/preload/renderer layout), so tests that read out/ at the same time
// never see a half-written build.
import { execFileSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { APP_PAGE_URL, resolveAppPath, serveAppRequest } from '../src/main/app-protocol';
import { cspHeader, cspMeta, parseCsp } from '../src/main/csp';
import { PRELOAD_FROM_MAIN, RENDERER_FROM_MAIN } from '../src/main/paths';

const root = resolve(__dirname, '..');
const out = mkdtempSync(join(tmpdir(), 'tw-build-'));
const mainDir = join(out, 'main');

afterAll(() => rmSync(out, { recursive: true, force: true }));

beforeAll(() => {
  try {
    execFileSync('npx', ['electron-vite', 'build', '--outDir', out], { cwd: root, stdio: 'pipe', timeout: 120_000, env: { ...process.env, NODE_ENV: 'production' } });
  } catch (e) {
    const err = e as { stderr?: Buffer; stdout?: Buffer };
    const tail = `${err.stdout?.toString() ?? ''}\n${err.stderr?.toString() ?? ''}`.replace(/\x1b\[[0-9;]*m/g, '').split('\n').filter((l) => l.trim()).slice(0, 12).join('\n');
    throw new Error(`electron-vite build failed:\n${tail}`);
  }
}, 130_000);

describe('built preload (preload/index.cjs)', () => {
  const file = join(out, 'preload', 'index.cjs');
  const src = () => readFileSync(file, 'utf8');
  it('exists', () => {
    expect(existsSync(file)).toBe(true);
  });
  it('has no ES module syntax and compiles as a CommonJS function body', () => {
    const s = src();
    expect(s).not.toMatch(/^\s*import\s*[\w{*'"]/m);
    expect(s).not.toMatch(/^\s*export\s+(\{|\*|default|const|let|var|function|class|async)/m);
    expect(s).not.toMatch(/import\.meta|\bimport\s*\(/);
    expect(() => new Function('require', 'module', 'exports', s)).not.toThrow();
  });
  it('requires only electron', () => {
    const reqs = [...src().matchAll(/require\(\s*["']([^"']+)["']\s*\)/g)].map((m) => m[1]);
    expect(new Set(reqs)).toEqual(new Set(['electron']));
  });
  it('run with a stand-in electron, exposes exactly one object, window.torquewise, with the bridge members', () => {
    const exposed: Array<[string, Record<string, unknown>]> = [];
    const fakeElectron = {
      contextBridge: { exposeInMainWorld: (k: string, v: Record<string, unknown>) => exposed.push([k, v]) },
      ipcRenderer: { invoke: async () => null, on: () => undefined, removeListener: () => undefined },
    };
    const mod = { exports: {} };
    new Function('require', 'module', 'exports', src())((id: string) => {
      if (id !== 'electron') throw new Error(`unexpected require(${id})`);
      return fakeElectron;
    }, mod, mod.exports);
    expect(exposed.map(([k]) => k)).toEqual(['torquewise']);
    expect(Object.keys(exposed[0]![1]).sort()).toEqual(['export', 'initialFile', 'onMenu', 'open', 'openRecent', 'recent', 'recovery', 'save', 'saveAs']);
    expect(Object.values(exposed[0]![1]).some((v) => v === fakeElectron.ipcRenderer)).toBe(false);
  });
});

describe('built main (main/index.js)', () => {
  const file = join(mainDir, 'index.js');
  it('exists and imports only electron, Node built-ins and shipped dependencies', () => {
    const shipped = Object.keys((JSON.parse(readFileSync(join(root, 'package.json'), 'utf8')) as { dependencies: Record<string, string> }).dependencies);
    expect(existsSync(file)).toBe(true);
    const s = readFileSync(file, 'utf8');
    const specs = [...s.matchAll(/^\s*import\s[^'"]*?from\s*["']([^"']+)["']|^\s*import\s*["']([^"']+)["']/gm)].map((m) => m[1] ?? m[2]);
    expect(specs.length).toBeGreaterThan(0);
    for (const spec of specs) expect(spec === 'electron' || /^node:/.test(spec!) || shipped.includes(spec!.split('/')[0]!), spec).toBe(true);
  });
  it('uses the preload and renderer paths, and both exist relative to out/main', () => {
    const s = readFileSync(file, 'utf8');
    for (const rel of [PRELOAD_FROM_MAIN, RENDERER_FROM_MAIN]) {
      expect(s).toContain(JSON.stringify(rel));
      expect(existsSync(resolve(mainDir, rel)), rel).toBe(true);
    }
  });
});

describe('built renderer (renderer/index.html)', () => {
  it('carries the app Content-Security-Policy in a meta tag', () => {
    const html = readFileSync(join(out, 'renderer', 'index.html'), 'utf8');
    const m = html.match(/<meta\s+http-equiv=["']Content-Security-Policy["']\s+content=(?:"([^"]*)"|'([^']*)')/i);
    expect(m, 'no CSP meta tag').not.toBeNull();
    // src/main/csp.ts is the single definition; the page must carry exactly its meta form:
    expect(parseCsp((m![1] ?? m![2])!), `expected content="${cspMeta()}"`).toEqual(parseCsp(cspMeta()));
  });
  it('loads its scripts from its own folder only', () => {
    const html = readFileSync(join(out, 'renderer', 'index.html'), 'utf8');
    const srcs = [...html.matchAll(/<(?:script|link)[^>]+(?:src|href)=["']([^"']+)["']/g)].map((x) => x[1]!);
    expect(srcs.length).toBeGreaterThan(0);
    for (const s of srcs) {
      expect(s, s).not.toMatch(/^(https?:)?\/\//);
      if (s.startsWith('data:')) continue; // inline (e.g. an empty icon), nothing fetched
      expect(existsSync(resolve(out, 'renderer', s)), s).toBe(true);
    }
  });
  it('every path the page loads through app://torquewise/ resolves inside the build output and is served with the CSP header', async () => {
    const dir = join(out, 'renderer');
    const html = readFileSync(join(dir, 'index.html'), 'utf8');
    const srcs = [...html.matchAll(/<(?:script|link)[^>]+(?:src|href)=["']([^"']+)["']/g)].map((x) => x[1]!).filter((s) => !s.startsWith('data:'));
    // and the files the scripts fetch by a relative URL (the simulation worker, chunks)
    for (const f of srcs.filter((s) => s.endsWith('.js'))) {
      for (const m of readFileSync(resolve(dir, f), 'utf8').matchAll(/["'`](\.{0,2}\/?assets\/[\w.-]+\.js)["'`]|["'`]\.\/([\w.-]+\.js)["'`]/g)) srcs.push((m[1] ?? `assets/${m[2]}`)!);
    }
    expect(srcs.length).toBeGreaterThan(1);
    for (const s of new Set([APP_PAGE_URL, ...srcs.map((x) => new URL(x, APP_PAGE_URL).href)])) {
      const r = resolveAppPath(s, dir);
      expect(r.ok, s).toBe(true);
      if (!r.ok) continue;
      expect(r.path.startsWith(resolve(dir) + '/'), s).toBe(true);
      const res = await serveAppRequest({ url: s, method: 'GET' }, dir, cspHeader());
      expect([s, res.status]).toEqual([s, 200]);
      expect(res.headers['content-security-policy']).toBe(cspHeader());
    }
  });
});

describe('the normal build writes to out/', () => {
  it('the config sends each target to out/<target> and package.json starts out/main/index.js', () => {
    const cfg = readFileSync(join(root, 'electron.vite.config.ts'), 'utf8');
    for (const t of ['main', 'preload', 'renderer']) expect(cfg).toContain(`outDir: 'out/${t}'`);
    expect(cfg).toContain("formats: ['cjs'], fileName: () => 'index.cjs'");
    const pkg = JSON.parse(readFileSync(join(root, 'package.json'), 'utf8')) as { main: string };
    expect(pkg.main).toBe('./out/main/index.js');
  });
});
