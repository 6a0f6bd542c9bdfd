// src/cli/tolerance-prestart.ts: which command lines start their tolerance-sample workers at the
// process's entry, and a run on a worker started so (it reads, loads and warms up on the project file
// before the run is posted) gives the single-thread samples bit for bit (each sample seeded by
// (seed, index): issue 16, "results are identical whatever the number of workers").
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadProjectText } from '../src/core/project/project';
import { tolerancesOf } from '../src/core/project/tolerance-apply';
import { prestartedToleranceWorkers, prestartToleranceWorkers, tolerancePrestartPlan, toleranceWorkerScript } from '../src/cli/tolerance-prestart';
import { toleranceSamplesThreaded } from '../src/cli/tolerance-workers';

const demo = (name: string) => join(__dirname, '..', 'resources', `demo-${name}.json`);

describe('tolerancePrestartPlan', () => {
  it('tolerance-sample with --threads N > 1: N - 1 workers, each to read the file and warm up', () => {
    expect(tolerancePrestartPlan(['tolerance-sample', 'p.json', '--threads', '3', '--thermal'])).toEqual({
      workers: 2,
      data: { task: 'torquewise-tolerance-sample', projectPath: 'p.json', warm: { thermal: true } },
    });
    expect(tolerancePrestartPlan(['tolerance-sample', 'p.json', '--threads', '2'])!.data.warm).toEqual({ thermal: false });
  });
  it('none for one thread, another command, help, no file or a bad value (the command reports it)', () => {
    for (const argv of [
      ['tolerance-sample', 'p.json'],
      ['tolerance-sample', 'p.json', '--threads', '1'],
      ['efficiency', 'p.json', '--threads', '2'],
      ['tolerance-sample', 'p.json', '--threads', '2', '--help'],
      ['tolerance-sample', '--threads', '2'],
      ['tolerance-sample', 'p.json', '--threads', 'two'],
      ['tolerance-sample', 'p.json', '--threads', '2', '--threads', '3'],
    ]) expect(tolerancePrestartPlan(argv)).toBeNull();
  });
  it('from the sources the worker is the tsx bootstrap beside the module', () => {
    expect(String(toleranceWorkerScript().script)).toMatch(/^file:.*\/src\/cli\/tolerance-worker-source\.mjs$/);
  });
});

describe('a worker started at the process entry', () => {
  it('is taken by the run and computes every sample (this thread none): the 1-thread samples bit for bit', async () => {
    const text = readFileSync(demo('ipm-traction'), 'utf8');
    const file = loadProjectText(text).file;
    const mc = { ...tolerancesOf(file)!.monteCarlo, samples: 120 };
    const one = await toleranceSamplesThreaded(text, file, mc, 1, { thermal: false });
    prestartToleranceWorkers(['tolerance-sample', demo('ipm-traction'), '--threads', '2']);
    expect(prestartedToleranceWorkers()).toBe(1);
    const two = await toleranceSamplesThreaded(text, file, mc, 1, { thermal: false, workersOnly: true });
    expect(prestartedToleranceWorkers()).toBe(0);
    expect(two).toEqual(one);
    expect(two.count).toBe(120);
    expect(Array.from(two.met).some((m) => m === 0)).toBe(true);
  }, 120_000);
});

describe('this thread and a worker started with the run', () => {
  it('2 threads give the 1-thread samples bit for bit, with the S1 check', async () => {
    const text = readFileSync(demo('spm-48v'), 'utf8');
    const file = loadProjectText(text).file;
    const mc = { ...tolerancesOf(file)!.monteCarlo, samples: 75 };
    const one = await toleranceSamplesThreaded(text, file, mc, 1, { thermal: true });
    const two = await toleranceSamplesThreaded(text, file, mc, 2, { thermal: true });
    expect(two).toEqual(one);
  }, 120_000);
});
