// Monte Carlo samples of a tolerance study across worker threads. The samples are cut into chunks of
// consecutive indices, claimed one at a time through a counter in shared memory by this thread and by
// the workers (src/node/worker-pool.ts runSharedRows), each writing its samples in place into the run's
// arrays in shared memory: no thread waits for another, and a worker not yet ready takes no chunk.
// Every sample draws from its own generator seeded by (seed, index), so the result is the same bit for
// bit whatever the number of threads and whichever thread computed which chunk. The process's entry
// starts the workers first (src/cli/tolerance-prestart.ts): each reads and loads the project file and
// warms up while the main thread does the same. In the built CLI (one file) a worker is that file
// itself, started with workerData naming its task (src/cli/bin.ts hands it to toleranceWorkerMain);
// run from the TypeScript sources (tests, tsx) a worker loads src/cli/bin.ts through tsx.
import { parentPort, receiveMessageOnPort, workerData, type MessagePort } from 'node:worker_threads';
import { loadProjectText } from '../core/project/project';
import { toleranceParameters, tolerancesOf, type ToleranceParameter } from '../core/project/tolerance-apply';
import { emptySampleChunk, writeSamples, type SampleChunk } from '../core/project/tolerance-sample';
import type { MonteCarloSettings } from '../core/project/tolerance-schema';
import type { ProjectFile } from '../core/project/schema';
import { readProjectText } from '../node/project-file';
import { claimRows, rowCounter, runSharedRows } from '../node/worker-pool';
import { TOLERANCE_WORKER_TASK, takeToleranceWorkers, type ToleranceWorkerData } from './tolerance-prestart';
export { TOLERANCE_WORKER_TASK, prestartToleranceWorkers, toleranceWorkerScript } from './tolerance-prestart';

/** Samples per chunk claimed by a thread: small enough that the threads end together, large enough that a claim costs nothing. */
export const SAMPLES_PER_CHUNK = 10;

/** What a worker is posted: the run (project, settings), its arrays in shared memory and the shared chunk counter. */
export interface ToleranceWorkerJob {
  projectText: string;
  mc: MonteCarloSettings;
  thermal: boolean;
  /** samples 0..mc.samples-1, the arrays in shared memory */
  out: SampleChunk;
  /** rowCounter(): chunks claimed, chunks done */
  counter: Int32Array;
}

interface Study {
  text: string;
  file: ProjectFile;
  params: ToleranceParameter[];
}

/** True when this thread was started as a tolerance-sample worker. */
export function isToleranceWorker(): boolean {
  return parentPort !== null && (workerData as Partial<ToleranceWorkerData> | null)?.task === TOLERANCE_WORKER_TASK;
}

const chunks = (samples: number): number => Math.ceil(samples / SAMPLES_PER_CHUNK);

/** Chunk i of a run of `samples` samples written into `out`. */
function writeChunk(s: Study, mc: MonteCarloSettings, thermal: boolean, out: SampleChunk, i: number): void {
  const from = i * SAMPLES_PER_CHUNK;
  writeSamples(s.file, s.params, mc, from, Math.min(SAMPLES_PER_CHUNK, mc.samples - from), { thermal }, out);
}

function study(text: string): Study {
  const file = loadProjectText(text).file;
  return { text, file, params: toleranceParameters(file) };
}

async function preload(path: string): Promise<Study | undefined> {
  try {
    return study(await readProjectText(path));
  } catch {
    return undefined; // the main thread reports what is wrong with the file
  }
}

/** Longest warm-up, ms: a worker started early has about this long before its run is due. */
const WARM_MS = 400;

/**
 * Warm-up while the run is not yet posted: throwaway samples of the file's bands (indices far beyond
 * any run), so that the sizing's code is compiled when the run comes (a cold thread computes its first
 * samples several times slower). Stops as soon as a message waits (returned), or after WARM_MS.
 */
function warmUp(port: MessagePort, s: Study, thermal: boolean): ToleranceWorkerJob | undefined {
  const mc = tolerancesOf(s.file)?.monteCarlo;
  if (mc === undefined) return undefined;
  const until = performance.now() + WARM_MS;
  const out = emptySampleChunk(0, 1, s.params.length, s.file.requirements.length);
  for (let k = 0; performance.now() < until; k++) {
    const m = receiveMessageOnPort(port);
    if (m !== undefined) return m.message as ToleranceWorkerJob;
    out.from = 2 ** 40 + k;
    writeSamples(s.file, s.params, mc, out.from, 1, { thermal }, out);
  }
  return undefined;
}

/** A worker's loop: for each run posted, claim its chunks and write them, then answer. */
export function toleranceWorkerMain(): void {
  const port = parentPort;
  if (port === null) return;
  const d = workerData as ToleranceWorkerData;
  const serve = (m: ToleranceWorkerJob, pre: Study | undefined): void => {
    try {
      const s = pre !== undefined && pre.text === m.projectText ? pre : study(m.projectText);
      claimRows(m.counter, chunks(m.mc.samples), (i) => writeChunk(s, m.mc, m.thermal, m.out, i));
      port.postMessage({ ok: true });
    } catch (e) {
      port.postMessage({ ok: false, name: e instanceof Error ? e.name : 'Error', message: e instanceof Error ? e.message : String(e) });
    }
  };
  if (d.projectPath === undefined) {
    port.on('message', (m: ToleranceWorkerJob) => serve(m, undefined));
    return;
  }
  void preload(d.projectPath).then((pre) => {
    let first: ToleranceWorkerJob | undefined;
    try {
      if (pre !== undefined && d.warm !== undefined) first = warmUp(port, pre, d.warm.thermal);
    } catch {
      // a warm-up that fails changes nothing: the run reports its own failures
    }
    if (first !== undefined) serve(first, pre);
    port.on('message', (m: ToleranceWorkerJob) => serve(m, pre));
  });
}

/** The run's samples in memory of its own (not shared), for the caller to keep. */
function own(c: SampleChunk): SampleChunk {
  return { ...c, values: new Float64Array(c.values), margins: new Float64Array(c.margins), met: new Uint8Array(c.met) };
}

/** How often the samples done are read while this thread waits for the workers, ms. */
const PROGRESS_POLL_MS = 200;

/**
 * The samples 0..mc.samples-1 of the project: in this thread when threads <= 1, else shared in chunks
 * between this thread and threads - 1 workers (each given the project's text; `workersOnly`: `threads`
 * workers, this thread computing none). The same result for any `threads`. `onSamples(done, total)`
 * is told the samples done by every thread: after each chunk this thread computes, and every
 * PROGRESS_POLL_MS while it waits for the workers.
 */
export async function toleranceSamplesThreaded(projectText: string, file: ProjectFile, mc: MonteCarloSettings, threads: number, opts: { thermal: boolean; workersOnly?: boolean; onSamples?: (done: number, total: number) => void }): Promise<SampleChunk> {
  const s: Study = { text: projectText, file, params: toleranceParameters(file) };
  const n = chunks(mc.samples);
  const local = opts.workersOnly !== true;
  const tell = opts.onSamples;
  const samplesOf = (chunksDone: number): number => Math.min(mc.samples, chunksDone * SAMPLES_PER_CHUNK);
  if (local && (threads <= 1 || n < 2)) {
    const out = emptySampleChunk(0, mc.samples, s.params.length, file.requirements.length);
    for (let i = 0; i < n; i++) {
      writeChunk(s, mc, opts.thermal, out, i);
      tell?.(samplesOf(i + 1), mc.samples);
    }
    return out;
  }
  const workers = takeToleranceWorkers(local ? Math.min(threads - 1, n - 1) : Math.max(1, Math.min(threads, n)));
  const out = emptySampleChunk(0, mc.samples, s.params.length, file.requirements.length, (b) => new SharedArrayBuffer(b));
  const counter = rowCounter();
  const job: ToleranceWorkerJob = { projectText, mc, thermal: opts.thermal, out, counter };
  // the chunks done by every thread (counter[1]); the one this thread has just written counts too
  const poll = tell ? setInterval(() => tell(samplesOf(Atomics.load(counter, 1)), mc.samples), PROGRESS_POLL_MS) : undefined;
  const mine = (i: number): void => {
    writeChunk(s, mc, opts.thermal, out, i);
    tell?.(samplesOf(Atomics.load(counter, 1) + 1), mc.samples);
  };
  try {
    await runSharedRows(workers, job, counter, n, local ? mine : undefined);
  } finally {
    if (poll !== undefined) clearInterval(poll);
    for (const w of workers) void w.terminate();
  }
  return own(out);
}
