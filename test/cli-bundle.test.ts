// The built command line: `npm run cli` and the tests run out/cli/torquewise.mjs, rebuilt when it is
// missing or older than any source, so a clean clone works and an edit is never tested stale. The
// bundle answers exactly as the source does, and package.json declares it as the `torquewise` bin.
import { afterAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync, statSync, utimesSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, relative } from 'node:path';
import { spawnSync } from 'node:child_process';
import { CLI_BUNDLE, ROOT, bundleInputs, ensureBundle, staleReason } from '../scripts/cli-bundle.mjs';
import { main } from '../src/cli/index';

describe('when the bundle is rebuilt', () => {
  const dir = mkdtempSync(join(tmpdir(), 'tw-bundle-'));
  const bundle = join(dir, 'torquewise.mjs');
  const a = join(dir, 'a.ts');
  const b = join(dir, 'b.ts');
  writeFileSync(a, '');
  writeFileSync(b, '');
  const at = (f: string, s: number) => utimesSync(f, s, s);

  it('missing: not built', () => {
    expect(staleReason(bundle, [a, b])).toBe('not built');
  });
  it('newer than every input: current; an input edited after the build: stale, naming it', () => {
    writeFileSync(bundle, '');
    at(a, 1_000_000);
    at(b, 1_000_000);
    at(bundle, 1_000_010);
    expect(staleReason(bundle, [a, b])).toBe('');
    at(b, 1_000_020);
    expect(staleReason(bundle, [a, b])).toBe(`${b} changed`);
  });
  it('an input that does not exist is not a reason', () => {
    at(b, 1_000_000);
    expect(staleReason(bundle, [a, join(dir, 'absent.json')])).toBe('');
  });
  afterAll(() => rmSync(dir, { recursive: true, force: true }));
  it('the inputs are every file under src, the build config and the dependency pins', () => {
    const rel = bundleInputs().map((f) => relative(ROOT, f).split('\\').join('/'));
    expect(rel).toContain('src/cli/index.ts');
    expect(rel).toContain('src/core/steady-state/envelope.ts');
    expect(rel).toContain('vite.cli.config.ts');
    expect(rel).toContain('package-lock.json');
  });
});

describe('the built bin', () => {
  it('package.json declares out/cli/torquewise.mjs as `torquewise`, and npm run cli goes through the rebuild check', () => {
    const pkg = JSON.parse(readFileSync(join(ROOT, 'package.json'), 'utf8'));
    expect(join(ROOT, pkg.bin.torquewise)).toBe(CLI_BUNDLE);
    expect(pkg.scripts.cli).toBe('node scripts/cli.mjs');
  });

  it('is one executable file with a node shebang, and answers a command exactly as the source does', async () => {
    expect(ensureBundle()).toBe('');
    expect(staleReason()).toBe('');
    expect(readFileSync(CLI_BUNDLE, 'utf8').startsWith('#!/usr/bin/env node\n')).toBe(true);
    if (process.platform !== 'win32') expect(statSync(CLI_BUNDLE).mode & 0o111).toBe(0o111);
    const demo = join(ROOT, 'resources', 'demo-ipm-traction.json');
    for (const argv of [['params', demo, '--json'], ['size', demo], ['point', demo, '--speed', 'fast']]) {
      let out = '';
      let err = '';
      const code = await main(argv, { write: (s: string) => (out += s) }, { write: (s: string) => (err += s) });
      const r = spawnSync(process.execPath, [CLI_BUNDLE, ...argv], { encoding: 'utf8', timeout: 60_000 });
      expect({ code: r.status, out: r.stdout, err: r.stderr }).toEqual({ code, out, err });
    }
  }, 300_000);
});
