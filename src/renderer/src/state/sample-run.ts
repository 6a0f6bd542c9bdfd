// A Monte Carlo run shared between several Web Workers: the samples cut into chunks of consecutive
// indices (chunkPlan), each chunk handed to whichever worker is free, the chunks joined in order of
// their first sample when the last arrives (core joinChunks). Every sample draws from its own
// generator seeded by (seed, index), so the joined run is the same whatever the number of workers and
// whichever worker computed which chunk. Progress counts the samples done; cancel terminates every
// worker at once. The view makes the workers (the constructor call with the module URL stays in the
// view, where the bundler finds it) through `make`.
import { useCallback, useEffect, useRef, useState } from 'react';
import { joinChunks, type SampleChunk } from '../../../core/project/tolerance-sample';
import type { MonteCarloSettings } from '../../../core/project/tolerance-schema';
import type { SamplesDone, ToleranceReply, ToleranceRequest } from '../workers/tolerance-protocol';

/** Samples per chunk: small enough to share the work evenly and show progress, large enough that a message costs nothing. */
export const SAMPLES_PER_CHUNK = 25;

/** Most workers a run starts. */
export const MAX_WORKERS = 16;

/** The chunks of a run of `samples` samples, in order. */
export function chunkPlan(samples: number, size = SAMPLES_PER_CHUNK): Array<{ from: number; count: number }> {
  const out: Array<{ from: number; count: number }> = [];
  for (let from = 0; from < samples; from += size) out.push({ from, count: Math.min(size, samples - from) });
  return out;
}

/** The workers a run uses: as asked (at least 1, at most MAX_WORKERS), no more than it has chunks. */
export function workerCount(asked: number, chunks: number): number {
  return Math.max(1, Math.min(Number.isFinite(asked) ? Math.floor(asked) : 1, MAX_WORKERS, chunks));
}

/** The processors the browser reports (1 where it reports none). */
export const hardwareWorkers = (): number => Math.max(1, Math.min(MAX_WORKERS, (typeof navigator !== 'undefined' && navigator.hardwareConcurrency) || 1));

export type SampleRunState =
  | { kind: 'idle' }
  | { kind: 'running'; done: number; total: number; workers: number; started: number }
  | { kind: 'cancelled' }
  | { kind: 'error'; message: string };

export interface SampleRunDone {
  chunk: SampleChunk;
  workers: number;
  wall_ms: number;
  /** the workers' time in the chunks, summed (wall_ms x workers when they never wait) */
  busy_ms: number;
}

export interface SampleRunRequest {
  projectText: string;
  mc: MonteCarloSettings;
  thermal: boolean;
}

export function useSampleRun(onDone: (d: SampleRunDone) => void): {
  run: SampleRunState;
  start: (make: () => Worker, req: SampleRunRequest, workers: number) => void;
  cancel: () => void;
} {
  const pool = useRef<Worker[]>([]);
  const [run, setRun] = useState<SampleRunState>({ kind: 'idle' });
  const done = useRef(onDone);
  done.current = onDone;
  const stop = useCallback(() => {
    for (const w of pool.current) w.terminate();
    pool.current = [];
  }, []);
  useEffect(() => stop, [stop]);

  const start = useCallback((make: () => Worker, req: SampleRunRequest, asked: number) => {
    stop();
    const jobs = chunkPlan(req.mc.samples);
    const n = workerCount(asked, jobs.length);
    const started = performance.now();
    const results: SampleChunk[] = [];
    let next = 0, samplesDone = 0, busy = 0;
    const mine: Worker[] = [];
    pool.current = mine;
    setRun({ kind: 'running', done: 0, total: req.mc.samples, workers: n, started });
    const fail = (message: string) => {
      if (pool.current !== mine) return;
      stop();
      setRun({ kind: 'error', message });
    };
    const feed = (w: Worker) => {
      const job = jobs[next++];
      if (job === undefined) return;
      const msg: ToleranceRequest = { kind: 'samples', projectText: req.projectText, mc: req.mc, thermal: req.thermal, from: job.from, count: job.count };
      w.postMessage(msg);
    };
    for (let i = 0; i < n; i++) {
      const w = make();
      mine.push(w);
      w.onmessage = (ev: MessageEvent<ToleranceReply>) => {
        if (pool.current !== mine) return;
        const m = ev.data;
        if (m.kind === 'error') return fail(m.message);
        if (m.kind !== 'done') return;
        const { chunk, compute_ms } = m as { kind: 'done' } & SamplesDone;
        busy += compute_ms;
        results.push(chunk);
        samplesDone += chunk.count;
        if (results.length === jobs.length) {
          const joined = joinChunks(results);
          stop();
          setRun({ kind: 'idle' });
          done.current({ chunk: joined, workers: n, wall_ms: performance.now() - started, busy_ms: busy });
          return;
        }
        setRun((r) => (r.kind === 'running' ? { ...r, done: samplesDone } : r));
        feed(w);
      };
      w.onerror = (ev) => {
        ev.preventDefault();
        fail(`A tolerance worker failed: ${ev.message || 'unknown error'}`);
      };
      feed(w);
    }
  }, [stop]);

  const cancel = useCallback(() => {
    stop();
    setRun({ kind: 'cancelled' });
  }, [stop]);

  return { run, start, cancel };
}
