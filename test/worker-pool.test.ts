// src/node/worker-pool.ts: jobs on worker threads (and this thread), results in the jobs' order.
import { describe, expect, it } from 'vitest';
import { runWorkerPool } from '../src/node/worker-pool';

// a worker that answers { job, input } with the input squared, and fails on a negative input
const moduleUrl = (src: string): URL => new URL(`data:text/javascript,${encodeURIComponent(src)}`);
const SQUARE = {
  script: moduleUrl(`import { parentPort } from 'node:worker_threads';
parentPort.on('message', (m) => parentPort.postMessage(m.input < 0 ? { job: m.job, ok: false, name: 'RangeError', message: 'negative' } : { job: m.job, ok: true, result: m.input * m.input }));`),
};

describe('runWorkerPool', () => {
  const jobs = Array.from({ length: 23 }, (_, k) => k - 3 * (k % 2 === 0 ? 0 : -1));
  const squares = jobs.map((x) => x * x); // common practice (no source)

  it('results come back in the jobs order, on 1, 2 and 3 workers', async () => {
    for (const n of [1, 2, 3]) expect(await runWorkerPool(SQUARE, null, jobs, n)).toEqual(squares);
  });

  it('this thread takes jobs too when given a local function', async () => {
    const local: number[] = [];
    const r = await runWorkerPool(SQUARE, null, jobs, 2, (x: number) => (local.push(x), x * x));
    expect(r).toEqual(squares);
    expect(local.length).toBeGreaterThan(0);
  });

  it('no jobs: no workers, an empty result', async () => {
    expect(await runWorkerPool(SQUARE, null, [], 4)).toEqual([]);
  });

  it('a worker failure rejects the run with its name and message', async () => {
    await expect(runWorkerPool(SQUARE, null, [1, 2, -1, 4], 2)).rejects.toMatchObject({ name: 'RangeError', message: 'negative' });
  });

  it('a worker that cannot start rejects the run', async () => {
    await expect(runWorkerPool({ script: moduleUrl('throw new TypeError("broken")') }, null, [1], 1)).rejects.toThrow(/broken/);
  });
});
