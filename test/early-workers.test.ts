// src/cli/early-workers.ts: the command line's worker script (bundled: the lean worker bundle beside
// the bin when it exists, else the bin itself; from the sources: the bootstrap beside the module) and
// the workers started at the process's entry (held unref'd, taken early ones first, dead ones never
// handed out). Common practice (no source).
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';
import { cliWorkerScript, EarlyWorkers } from '../src/cli/early-workers';

const dir = mkdtempSync(join(tmpdir(), 'tw-early-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const script = (name: string, body: string) => {
  const f = join(dir, name);
  writeFileSync(f, body);
  return { script: pathToFileURL(f) };
};
const waits = script('waits.mjs', "import { parentPort } from 'node:worker_threads';\nparentPort.on('message', () => {});\n");
const quits = script('quits.mjs', 'process.exit(0);\n');

describe('cliWorkerScript', () => {
  it('from the sources: the bootstrap beside the calling module', () => {
    expect(String(cliWorkerScript('file:///x/src/cli/map-prestart.ts', './boot.mjs').script)).toBe('file:///x/src/cli/boot.mjs');
  });
  it('bundled: the lean bundle beside the bin when it exists, else the bin itself', () => {
    const bin = pathToFileURL(join(dir, 'torquewise.mjs')).href;
    expect(String(cliWorkerScript(bin, './boot.mjs').script)).toBe(bin);
    writeFileSync(join(dir, 'efficiency-worker.mjs'), '');
    expect(String(cliWorkerScript(bin, './boot.mjs').script)).toBe(pathToFileURL(join(dir, 'efficiency-worker.mjs')).href);
  });
});

describe('EarlyWorkers', () => {
  it('takes the early workers first and starts the rest; none left after a take', async () => {
    const e = new EarlyWorkers();
    e.start(waits, {}, 2);
    expect(e.alive()).toBe(2);
    const ws = e.take(3, waits, {});
    expect(ws.length).toBe(3);
    expect(e.alive()).toBe(0);
    await Promise.all(ws.map((w) => w.terminate()));
  });
  it('a worker that has exited is not handed out; early workers beyond the need are ended', async () => {
    const dead = new EarlyWorkers();
    dead.start(quits, {}, 1);
    // the exit is seen once the worker's thread has gone
    await new Promise((r) => setTimeout(r, 50));
    for (let i = 0; i < 100 && dead.alive() > 0; i++) await new Promise((r) => setTimeout(r, 20));
    expect(dead.alive()).toBe(0);
    const fresh = dead.take(1, waits, {});
    expect(fresh.length).toBe(1);
    await fresh[0]!.terminate();
    const many = new EarlyWorkers();
    many.start(waits, {}, 2);
    const one = many.take(1, waits, {});
    expect(one.length).toBe(1);
    await one[0]!.terminate();
  });
});
