// src/node/worker-pool.ts: jobs on worker threads (and this thread), results in the jobs' order.
import { describe, expect, it } from 'vitest';
import { claimRows, rowCounter, runSharedRows, runWorkerPool, startWorkers } from '../src/node/worker-pool';

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

// a worker that claims rows from the shared counter and writes each row's square, failing at row `failAt`
const SQUARE_ROWS = {
  script: moduleUrl(`import { parentPort } from 'node:worker_threads';
parentPort.on('message', (m) => {
  for (let r = Atomics.add(m.counter, 0, 1); r < m.rows; r = Atomics.add(m.counter, 0, 1)) {
    if (r === m.failAt) { parentPort.postMessage({ ok: false, name: 'RangeError', message: 'row ' + r }); return; }
    m.out[r] = r * r;
    Atomics.add(m.counter, 1, 1);
  }
  parentPort.postMessage({ ok: true });
});`),
};

describe('runSharedRows', () => {
  const ROWS = 40;
  const run = async (workers: number, local: boolean, failAt = -1, localFailAt = -1): Promise<{ out: Float64Array; localRows: number }> => {
    const ws = startWorkers(SQUARE_ROWS, null, workers);
    const out = new Float64Array(new SharedArrayBuffer(8 * ROWS)), counter = rowCounter();
    let localRows = 0;
    const work = (r: number): void => {
      if (r === localFailAt) throw new RangeError('local row');
      localRows++;
      out[r] = r * r;
    };
    try {
      await runSharedRows(ws, { rows: ROWS, out, counter, failAt }, counter, ROWS, local ? work : undefined);
    } finally {
      for (const w of ws) await w.terminate();
    }
    return { out, localRows };
  };
  const squares = Float64Array.from({ length: ROWS }, (_, r) => r * r); // common practice (no source)

  it('every row once, on 1 and 2 workers, with and without this thread', async () => {
    for (const n of [1, 2]) for (const local of [false, true]) expect((await run(n, local)).out).toEqual(squares);
  });

  it('this thread alone when the workers are still starting: done without them', async () => {
    const ws = startWorkers({ script: moduleUrl(`await new Promise((r) => setTimeout(r, 60_000));`) }, null, 1);
    const counter = rowCounter();
    let rows = 0;
    await runSharedRows(ws, {}, counter, 5, () => rows++);
    await ws[0]!.terminate();
    expect(rows).toBe(5);
  });

  it('a worker failure rejects the run with its name and message', async () => {
    await expect(run(1, false, 7)).rejects.toMatchObject({ name: 'RangeError', message: 'row 7' });
  });

  it('a failure on this thread rejects the run', async () => {
    await expect(run(1, true, -1, 0)).rejects.toThrow(/local row/);
  });

  it('claimRows: a thread alone takes every row in order', () => {
    const seen: number[] = [];
    const counter = rowCounter();
    claimRows(counter, 4, (r) => seen.push(r));
    expect(seen).toEqual([0, 1, 2, 3]);
    expect(Array.from(counter)).toEqual([5, 4]);
  });
});
