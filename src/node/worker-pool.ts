// A small pool of Node worker threads: each worker is started once with `workerData`, then given
// jobs as it finishes them, two in flight (so a slow job never holds back the others, and a worker
// never waits for this thread to hand it the next); the
// results come back in the jobs' order. A worker's error or unexpected exit rejects the whole run,
// and every worker is terminated at the end, so the process can exit.
import { Worker } from 'node:worker_threads';

export interface WorkerScript {
  /** the worker's module file (a file: URL of this program's own code, never a project's) */
  script: URL | string;
}

/** What a worker posts back for a job: its result, or a failure's name and message. */
export type WorkerReply<R> = { job: number; ok: true; result: R } | { job: number; ok: false; name: string; message: string };

/** Starts `n` workers of `ws`, each given `workerData`. */
export function startWorkers(ws: WorkerScript, workerData: unknown, n: number): Worker[] {
  const out: Worker[] = [];
  for (let k = 0; k < n; k++) out.push(new Worker(ws.script, { workerData }));
  return out;
}

/**
 * Runs `jobs` on `threads` threads: workers of `ws` (each answers `{ job, input }` messages with a
 * WorkerReply) and, when `local` is given, this thread too (it takes a job whenever it is free,
 * yielding between jobs so the workers' replies are handled), so `threads` workers less one are started.
 */
export function runWorkerPool<J, R>(ws: WorkerScript, workerData: unknown, jobs: readonly J[], threads: number, local?: (input: J) => R): Promise<R[]> {
  const n = Math.max(local ? 0 : 1, Math.min(Math.floor(threads) - (local ? 1 : 0), jobs.length - (local ? 1 : 0)));
  const results: R[] = new Array(jobs.length);
  if (jobs.length === 0) return Promise.resolve(results);
  return new Promise<R[]>((resolvePool, rejectPool) => {
    const workers: Worker[] = [];
    let next = 0, done = 0, failed = false;
    const finish = (e?: Error): void => {
      if (failed) return;
      if (e) failed = true;
      for (const w of workers) void w.terminate();
      if (e) rejectPool(e);
      else resolvePool(results);
    };
    const give = (w: Worker): void => {
      if (next < jobs.length) {
        const job = next++;
        w.postMessage({ job, input: jobs[job] });
      }
    };
    for (const w of startWorkers(ws, workerData, n)) {
      workers.push(w);
      w.on('message', (m: WorkerReply<R>) => {
        if (failed) return;
        if (!m.ok) {
          const e = new Error(m.message);
          e.name = m.name;
          finish(e);
          return;
        }
        results[m.job] = m.result;
        if (++done === jobs.length) finish();
        else give(w);
      });
      w.on('error', (e) => finish(e instanceof Error ? e : new Error(String(e))));
      w.on('exit', (code) => {
        if (done < jobs.length) finish(new Error(`a worker thread exited (code ${code}) before its work was done`));
      });
      // two jobs in flight: the next one waits in the worker while this thread is busy with its own
      give(w);
      give(w);
    }
    if (local) {
      const step = (): void => {
        if (failed || next >= jobs.length) return;
        const job = next++;
        try {
          results[job] = local(jobs[job]!);
        } catch (e) {
          finish(e instanceof Error ? e : new Error(String(e)));
          return;
        }
        if (++done === jobs.length) finish();
        else setImmediate(step);
      };
      setImmediate(step);
    }
  });
}

/** The shared counters of runSharedRows: [0] the next row to claim, [1] the rows done. */
export function rowCounter(): Int32Array {
  return new Int32Array(new SharedArrayBuffer(8));
}

/**
 * A thread's share of runSharedRows: claims rows 0..rows-1 one at a time from `counter` (shared by
 * every thread of the run) and works each, until none is left.
 */
export function claimRows(counter: Int32Array, rows: number, work: (row: number) => void): void {
  for (let row = Atomics.add(counter, 0, 1); row < rows; row = Atomics.add(counter, 0, 1)) {
    work(row);
    Atomics.add(counter, 1, 1);
  }
}

/**
 * Rows 0..rows-1 worked by this thread (`local`, unless absent) and by `workers`, each taking the next
 * row whenever it is free (claimRows): no thread waits while another has work, and a worker that
 * is still starting takes none. Each worker is posted `message` once (which holds `counter`, a
 * rowCounter); it claims rows, writes its results in shared memory and answers
 * `{ ok: true }` when none is left, or a failure (WorkerReply). Resolves once every row is done; a
 * failure, a worker's error or its exit before it answered rejects. The workers are left running
 * (the caller terminates them).
 */
export function runSharedRows(workers: readonly Worker[], message: unknown, counter: Int32Array, rows: number, local?: (row: number) => void): Promise<void> {
  return new Promise<void>((resolveRun, rejectRun) => {
    let settled = false, localDone = local === undefined;
    const answered = new Set<Worker>();
    const offs: Array<() => void> = [];
    const settle = (e?: Error): void => {
      if (settled) return;
      settled = true;
      for (const off of offs) off();
      if (e) rejectRun(e);
      else resolveRun();
    };
    const check = (): void => {
      if (localDone && Atomics.load(counter, 1) >= rows) settle();
      else if (localDone && answered.size === workers.length) settle(new Error(`the rows were left unfinished (${Atomics.load(counter, 1)} of ${rows})`));
    };
    for (const w of workers) {
      const onMessage = (m: { ok: true } | { ok: false; name: string; message: string }): void => {
        if (!m.ok) {
          const e = new Error(m.message);
          e.name = m.name;
          settle(e);
          return;
        }
        answered.add(w);
        check();
      };
      const onError = (e: unknown): void => settle(e instanceof Error ? e : new Error(String(e)));
      const onExit = (code: number): void => {
        if (!answered.has(w)) settle(new Error(`a worker thread exited (code ${code}) before its work was done`));
      };
      w.on('message', onMessage);
      w.on('error', onError);
      w.on('exit', onExit);
      offs.push(() => {
        w.off('message', onMessage);
        w.off('error', onError);
        w.off('exit', onExit);
      });
      w.postMessage(message);
    }
    if (local) {
      try {
        claimRows(counter, rows, local);
      } catch (e) {
        // the rows left are claimed by no one: stop the workers' claims too
        Atomics.store(counter, 0, rows);
        settle(e instanceof Error ? e : new Error(String(e)));
        return;
      }
      localDone = true;
    }
    check();
  });
}
