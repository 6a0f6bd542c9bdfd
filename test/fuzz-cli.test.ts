// A few fuzz cases through the real command line, the built `torquewise` bin (rebuilt first when a
// source is newer; spawning is slow, so only a few): the exit code
// and the output agree with the in-process outcome: finite results -> exit 0 and a JSON document
// with finite numbers; a refusal -> exit 2 and exactly one line `torquewise: <field> <message>`.
import { beforeAll, describe, expect, it } from 'vitest';
import { spawn } from 'node:child_process';
import { mkdtempSync, writeFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import fc from 'fast-check';
import { fuzzCase, runCase, nonFinite, DEMOS, type FuzzCase } from '../trust/fuzz-cases';
import { CLI_BUNDLE, ensureBundle } from '../scripts/cli-bundle.mjs';

beforeAll(() => {
  expect(ensureBundle()).toBe('');
}, 300_000);

function run(args: string[]): Promise<{ code: number | null; stdout: string; stderr: string }> {
  return new Promise((done) => {
    const p = spawn(process.execPath, [CLI_BUNDLE, ...args], { stdio: ['ignore', 'pipe', 'pipe'] });
    let stdout = '';
    let stderr = '';
    p.stdout.on('data', (d) => (stdout += d));
    p.stderr.on('data', (d) => (stderr += d));
    const timer = setTimeout(() => p.kill('SIGKILL'), 90_000);
    p.on('close', (code) => {
      clearTimeout(timer);
      done({ code, stdout, stderr });
    });
  });
}

describe('fuzz cases through the spawned CLI', () => {
  it('a demo and 8 fixed-seed cases: exit 0 with finite JSON, or exit 2 with the same one-line message as in process', async () => {
    const cases: FuzzCase[] = [
      { input: { value: DEMOS['demo-servo-axis'] }, command: 'size', flags: [] },
      ...fc.sample(fuzzCase.filter((c) => c.command !== 'simulate'), { seed: 99, numRuns: 8 }),
    ];
    const dir = mkdtempSync(join(tmpdir(), 'tw-fuzz-cli-'));
    try {
      const jobs = cases.map(async (c: FuzzCase, i) => {
        const text = 'text' in c.input ? c.input.text : JSON.stringify(c.input.value, (_k, v) => (typeof v === 'number' && !Number.isFinite(v) ? (Number.isNaN(v) ? null : v > 0 ? 1e308 * 10 : -1e308 * 10) : v));
        // JSON.stringify writes Infinity as null; what the file holds is what the CLI reads
        const f = join(dir, `case-${i}.json`);
        writeFileSync(f, text);
        const inProcess = await runCase({ input: { text }, command: c.command, flags: c.flags });
        const r = await run([c.command, f, ...c.flags, '--json']);
        return { inProcess, r };
      });
      const results = await Promise.all(jobs);
      let refusals = 0;
      let finite = 0;
      for (const { inProcess, r } of results) {
        expect(inProcess.kind).not.toBe('failure');
        if (inProcess.kind === 'ok') {
          finite++;
          expect(r.code).toBe(0);
          expect(nonFinite(JSON.parse(r.stdout))).toBeNull();
          expect(r.stderr).toBe('');
        } else {
          refusals++;
          expect(r.code).toBe(2);
          expect(r.stdout).toBe('');
          // every problem of the file, one line each, the first being the InputError's message
          const lines = (inProcess as { message: string; lines: string[] }).lines;
          expect(lines[0]).toBe((inProcess as { message: string }).message);
          expect(r.stderr).toBe(lines.map((l) => `torquewise: ${l}\n`).join(''));
        }
      }
      expect(refusals).toBeGreaterThan(0);
      expect(finite).toBeGreaterThan(0);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  }, 180_000);
});
