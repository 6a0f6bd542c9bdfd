// `npm start` where Electron's executable is absent (a machine whose Node is older than Electron's
// installer needs, or with no network at install): one line saying so and how to get it, exit 1,
// nothing started. Where it is present: the dev server starts with the arguments given.
import { afterAll, describe, expect, it } from 'vitest';
import { copyFileSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { spawnSync } from 'node:child_process';
import { ELECTRON_NODE, atLeast, findElectron } from '../scripts/electron-binary.mjs';

const root = resolve(__dirname, '..');
const base = mkdtempSync(join(tmpdir(), 'tw-electron-'));
afterAll(() => rmSync(base, { recursive: true, force: true }));

let n = 0;
/** A project folder with start.mjs and its checker, and a stand-in electron package (no real binary). */
function fakeProject(opts: { pathTxt?: string; exe?: string }): string {
  const dir = join(base, `p${n++}`);
  mkdirSync(join(dir, 'scripts'), { recursive: true });
  for (const f of ['start.mjs', 'electron-binary.mjs']) copyFileSync(join(root, 'scripts', f), join(dir, 'scripts', f));
  const electron = join(dir, 'node_modules', 'electron');
  mkdirSync(join(electron, 'dist'), { recursive: true });
  writeFileSync(join(electron, 'package.json'), JSON.stringify({ name: 'electron', version: '45.5.0', main: 'index.js' }));
  // the real package's entry point downloads when the binary is missing: this one must never be loaded
  writeFileSync(join(electron, 'index.js'), "throw new Error('electron/index.js was loaded');\n");
  if (opts.pathTxt !== undefined) writeFileSync(join(electron, 'path.txt'), opts.pathTxt);
  if (opts.exe !== undefined) writeFileSync(join(electron, 'dist', opts.exe), '');
  // a stand-in dev server that reports its arguments and exits 3
  const ev = join(dir, 'node_modules', 'electron-vite', 'bin');
  mkdirSync(ev, { recursive: true });
  // the real package's exports map exposes only its API and package.json, not the command's file
  writeFileSync(
    join(dir, 'node_modules', 'electron-vite', 'package.json'),
    JSON.stringify({ name: 'electron-vite', version: '6.0.0', exports: { '.': './dist/index.js', './package.json': './package.json' }, bin: { 'electron-vite': 'bin/electron-vite.js' } }),
  );
  writeFileSync(join(ev, 'electron-vite.js'), "console.log('dev server ' + process.argv.slice(2).join(' ')); process.exit(3);\n");
  return dir;
}

function start(dir: string, env: Record<string, string | undefined> = {}, args: string[] = []) {
  const e: Record<string, string | undefined> = { ...process.env, ...env };
  if (!('ELECTRON_EXEC_PATH' in env)) delete e.ELECTRON_EXEC_PATH;
  return spawnSync(process.execPath, [join(dir, 'scripts', 'start.mjs'), ...args], { encoding: 'utf8', env: e as NodeJS.ProcessEnv, timeout: 60_000 });
}

describe('npm start without the Electron binary', () => {
  it('prints one line saying so and how to get it, starts nothing, exits 1', () => {
    const r = start(fakeProject({}));
    expect(r.status).toBe(1);
    expect(r.stdout).toBe('');
    const lines = r.stderr.split('\n');
    expect(lines).toHaveLength(2); // one line and its newline
    expect(lines[1]).toBe('');
    expect(lines[0]).toMatch(/^torquewise: Electron's binary is not installed, so the desktop app cannot start; .*`npx install-electron`, then `npm start`/);
    expect(r.stderr).not.toMatch(/\bat .*:\d+:\d+|Error|https?:\/\/|localhost|dev server/);
  });

  it('the line names the Node.js version Electron needs when this Node is older', () => {
    const old = findElectron({ env: {}, dir: fakeProject({}), nodeVersion: '20.19.0' });
    expect(old).toEqual({ ok: false, message: expect.stringContaining(`needs Node.js ${ELECTRON_NODE} or newer (this is 20.19.0)`) });
    const recent = findElectron({ env: {}, dir: fakeProject({}), nodeVersion: '22.12.0' });
    expect(recent.ok).toBe(false);
    expect(recent.ok === false && recent.message).not.toMatch(/Node\.js/);
  });

  it('path.txt naming an executable that is not there is the same case', () => {
    const r = start(fakeProject({ pathTxt: 'electron' }));
    expect(r.status).toBe(1);
    expect(r.stderr).toMatch(/^torquewise: Electron's binary is not installed/);
  });

  it('no electron package at all: run npm install', () => {
    expect(findElectron({ env: {}, dir: '' })).toEqual({ ok: false, message: 'torquewise: the electron package is not installed, so the desktop app cannot start: run `npm install`.' });
  });

  it('ELECTRON_EXEC_PATH naming nothing: says so by name', () => {
    const missing = join(base, 'no-such-electron');
    const r = start(fakeProject({ pathTxt: 'electron', exe: 'electron' }), { ELECTRON_EXEC_PATH: missing });
    expect(r.status).toBe(1);
    expect(r.stderr).toBe(`torquewise: ELECTRON_EXEC_PATH is '${missing}', which does not exist: unset it or point it at Electron's executable.\n`);
  });
});

describe('npm start with the Electron binary', () => {
  it('finds it as the dev server does (path.txt under dist) and runs electron-vite dev with the arguments, passing its exit code on', () => {
    const dir = fakeProject({ pathTxt: 'electron', exe: 'electron' });
    expect(findElectron({ env: {}, dir: join(dir, 'node_modules', 'electron') })).toEqual({ ok: true, path: join(dir, 'node_modules', 'electron', 'dist', 'electron') });
    const r = start(dir, {}, ['--sourcemap']);
    expect(r.stdout).toBe('dev server dev --sourcemap\n');
    expect(r.status).toBe(3);
  });
  it('ELECTRON_EXEC_PATH naming an executable is taken as it is', () => {
    const exe = join(base, 'my-electron');
    writeFileSync(exe, '');
    expect(findElectron({ env: { ELECTRON_EXEC_PATH: exe }, dir: '' })).toEqual({ ok: true, path: exe });
  });
});

describe('the Node.js version stated', () => {
  it("is the installed electron package's own engines.node, and the README says it", () => {
    const pkg = JSON.parse(readFileSync(join(root, 'node_modules', 'electron', 'package.json'), 'utf8'));
    expect(pkg.engines.node.replace(/^>=\s*/, '')).toBe(ELECTRON_NODE);
    expect(readFileSync(join(root, 'README.md'), 'utf8')).toContain(`Node.js ${ELECTRON_NODE.replace(/\.0$/, '')} or newer`);
  });
});

describe('version comparison', () => {
  it('orders versions part by part, with or without a leading v', () => {
    expect(atLeast('v22.12.0', '22.12.0')).toBe(true);
    expect(atLeast('22.11.9', '22.12.0')).toBe(false);
    expect(atLeast('20.19.0', '22.12.0')).toBe(false);
    expect(atLeast('23.0.0', '22.12.0')).toBe(true);
    expect(atLeast('22.12.1', '22.12.0')).toBe(true);
    expect(atLeast('22.2.0', '22.12.0')).toBe(false);
  });
});
