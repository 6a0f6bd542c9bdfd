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
    for (let k = 0; k < n; k++) {
      const w = new Worker(ws.script, { workerData });
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
