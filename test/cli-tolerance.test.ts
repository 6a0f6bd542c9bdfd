// `corners` and `tolerance-sample` (src/cli/commands/corners.ts, tolerance-sample.ts) and the samples
// across worker threads (src/cli/tolerance-workers.ts): the documents' keys, the same samples
// whatever the number of threads (each drawn from its own (seed, index)), from the sources and
// from the built CLI; bad input refused naming the field. Common practice (no source).
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { runCli } from './cli-run';
import { CLI_BUNDLE, ensureBundle } from '../scripts/cli-bundle.mjs';
import { parseCsv } from '../src/core/reports/csv';
import { loadProjectText } from '../src/core/project/project';
import { tolerancesOf } from '../src/core/project/tolerance-apply';
import { toleranceSamplesThreaded } from '../src/cli/tolerance-workers';
import { linearSpm } from './tolerance-fixtures';

const demo = (name: string) => join(resolve(__dirname, '..'), 'resources', `demo-${name}.json`);
const dir = mkdtempSync(join(tmpdir(), 'tw-tol-'));
const results = (out: string) => {
  const d = JSON.parse(out);
  delete d.wall_s;
  delete d.cpu_s;
  delete d.threads;
  return d;
};

describe('corners --json', () => {
  it('prints minImax_A, minVdc_V and corners [{ parameters, requirements [{ label, met, margins }] }]', async () => {
    const r = await runCli('corners', demo('servo-axis'), '--json');
    expect(r.err).toBe('');
    expect(r.code).toBe(0);
    const d = JSON.parse(r.out);
    expect(Object.keys(d)).toEqual(expect.arrayContaining(['minImax_A', 'minVdc_V', 'corners']));
    expect(d.corners).toHaveLength(64);
    expect(Object.keys(d.corners[0].parameters)).toEqual(['motor.Rs', 'motor.psiM', 'motor.Ld', 'motor.Lq', 'inverter.Vdc', 'inverter.Imax']);
    expect(Object.keys(d.corners[0].requirements[0])).toEqual(['label', 'met', 'margins']);
    expect(Object.keys(d.corners[0].requirements[0].margins)).toEqual(expect.arrayContaining(['torque_Nm', 'current_A', 'voltage_V']));
    // the least Imax over all corners is the worst corner's
    expect(d.minImax_A).toBe(Math.max(...d.corners.map((c: { minImax_A: number }) => c.minImax_A)));
  }, 60_000);

  it('text: the corners, the binding corner and the least Imax and Vdc', async () => {
    const r = await runCli('corners', demo('spm-48v'));
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/64 corners of 6 toleranced parameters \(every combination of the band ends\)/);
    expect(r.out).toMatch(/binding corner: motor\.Rs /);
    expect(r.out).toMatch(/least Imax meeting every point at every corner: [\d.]+ A pk/);
  }, 60_000);

  it('a file without tolerances is refused, saying how to give them (exit 2)', async () => {
    const f = join(dir, 'plain.json');
    writeFileSync(f, JSON.stringify(linearSpm()));
    const r = await runCli('corners', f);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/tolerances is required by corners: give bands by parameter path/);
    const s = await runCli('tolerance-sample', f);
    expect(s.err).toMatch(/tolerances is required by tolerance-sample/);
  });
});

describe('tolerance-sample', () => {
  it('1 and 2 threads give identical documents (sources: workers load src/cli/bin.ts through tsx)', async () => {
    const one = await runCli('tolerance-sample', demo('spm-48v'), '--samples', '120', '--threads', '1', '--json');
    const two = await runCli('tolerance-sample', demo('spm-48v'), '--samples', '120', '--threads', '2', '--json');
    expect(one.err).toBe('');
    expect(two.err).toBe('');
    expect(JSON.parse(two.out).threads).toBe(2);
    const d = results(two.out);
    expect(d).toEqual(results(one.out));
    expect(d.samples).toBe(120);
    expect(d.requirements).toHaveLength(5);
    expect(Object.keys(d.requirements[0].sensitivity)).toEqual(['motor.Rs', 'motor.psiM', 'motor.Ld', 'motor.Lq', 'inverter.Vdc', 'thermal.coolantTemp_C']);
    expect(d.requirements[0].margin.histogram.counts.reduce((a: number, b: number) => a + b, 0)).toBe(120);
  }, 120_000);

  it('the library call: 3 threads, 1 thread and other chunkings give the same samples', async () => {
    const text = readFileSync(demo('servo-axis'), 'utf8');
    const file = loadProjectText(text).file;
    const mc = { ...tolerancesOf(file)!.monteCarlo, samples: 90 };
    const a = await toleranceSamplesThreaded(text, file, mc, 1, { thermal: false });
    const b = await toleranceSamplesThreaded(text, file, mc, 3, { thermal: false });
    expect(b).toEqual(a);
    // the progress told along the way (common practice, no source): never decreasing, never above the
    // total, ending at every sample; and the samples are the same with it
    for (const threads of [1, 3]) {
      const told: number[] = [];
      const c = await toleranceSamplesThreaded(text, file, mc, threads, { thermal: false, onSamples: (done, total) => { expect(total).toBe(90); told.push(done); } });
      expect(c).toEqual(a);
      expect(told.length).toBeGreaterThan(0);
      for (let i = 1; i < told.length; i++) expect(told[i]!).toBeGreaterThanOrEqual(told[i - 1]!);
      expect(Math.max(...told)).toBe(90);
      if (threads === 1) expect(told).toEqual([10, 20, 30, 40, 50, 60, 70, 80, 90]);
    }
  }, 120_000);

  it('--csv: one row per sample, its values, margins and verdicts; --seed changes the draws', async () => {
    const csv = join(dir, 's.csv');
    const r = await runCli('tolerance-sample', demo('servo-axis'), '--samples', '30', '--csv', csv);
    expect(r.code).toBe(0);
    const rows = parseCsv(readFileSync(csv, 'utf8'));
    expect(rows[0]![0]).toMatch(/^# torquewise tolerance samples/);
    expect(rows[1]!.slice(0, 3)).toEqual(['sample', 'motor.Rs (ohm)', 'motor.psiM (Wb)']);
    expect(rows).toHaveLength(32);
    const a = JSON.parse((await runCli('tolerance-sample', demo('servo-axis'), '--samples', '30', '--seed', '2', '--json')).out);
    const b = JSON.parse((await runCli('tolerance-sample', demo('servo-axis'), '--samples', '30', '--json')).out);
    expect(a.requirements[1].margin.mean).not.toBe(b.requirements[1].margin.mean);
  }, 60_000);

  it('bad options are refused naming them', async () => {
    expect((await runCli('tolerance-sample', demo('servo-axis'), '--samples', '0')).err).toMatch(/--samples must be >= 1/);
    expect((await runCli('tolerance-sample', demo('servo-axis'), '--seed', '-1')).err).toMatch(/--seed must be >= 0/);
  });
});

describe('the built CLI (out/cli/torquewise.mjs): its workers run the lean worker bundle beside it, started at the process entry', () => {
  it('1 and 2 threads identical, and equal to the sources', async () => {
    expect(ensureBundle()).toBe('');
    const argv = ['tolerance-sample', demo('servo-axis'), '--samples', '200', '--json'];
    const two = spawnSync(process.execPath, [CLI_BUNDLE, ...argv, '--threads', '2'], { encoding: 'utf8', timeout: 120_000 });
    const one = spawnSync(process.execPath, [CLI_BUNDLE, ...argv, '--threads', '1'], { encoding: 'utf8', timeout: 120_000 });
    expect({ code: two.status, err: two.stderr }).toEqual({ code: 0, err: '' });
    expect(one.status).toBe(0);
    expect(results(two.stdout)).toEqual(results(one.stdout));
    const src = await runCli(...argv, '--threads', '1');
    expect(results(two.stdout)).toEqual(results(src.out));
  }, 300_000);
});
