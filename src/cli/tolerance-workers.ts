// Monte Carlo samples of a tolerance study across worker threads (src/node/worker-pool.ts runWorkerPool):
// the samples are cut into chunks of consecutive indices, each chunk computed by whichever thread is
// free (this one too); every sample draws from its own generator seeded by (seed, index), so the
// joined result is the same bit for bit whatever the number of threads. In the built CLI (one file)
// a worker is that file itself, started with workerData naming its task (src/cli/bin.ts hands it to
// toleranceWorkerMain); run from the TypeScript sources (tests, tsx) a worker loads src/cli/bin.ts through tsx.
import { parentPort, workerData } from 'node:worker_threads';
import { loadProjectText } from '../core/project/project';
import { toleranceParameters, type ToleranceParameter } from '../core/project/tolerance-apply';
import { joinChunks, runSampleChunk, type SampleChunk } from '../core/project/tolerance-sample';
import type { MonteCarloSettings } from '../core/project/tolerance-schema';
import type { ProjectFile } from '../core/project/schema';
import { runWorkerPool, type WorkerScript } from '../node/worker-pool';

/** The workerData that marks a tolerance-sample worker. */
export const TOLERANCE_WORKER_TASK = 'torquewise-tolerance-sample';

/** Samples per chunk handed to a thread: small enough to share the work evenly, large enough that a message costs nothing. */
export const SAMPLES_PER_CHUNK = 25;

interface ToleranceWorkerData {
  task: typeof TOLERANCE_WORKER_TASK;
  projectText: string;
  mc: MonteCarloSettings;
  thermal: boolean;
}

interface ChunkJob {
  from: number;
  count: number;
}

/** True when this thread was started as a tolerance-sample worker. */
export function isToleranceWorker(): boolean {
  return parentPort !== null && (workerData as Partial<ToleranceWorkerData> | null)?.task === TOLERANCE_WORKER_TASK;
}

/** The script a worker runs: from the sources a bootstrap that loads src/cli/bin.ts through tsx; bundled, the bundle itself. */
export function toleranceWorkerScript(): WorkerScript {
  const here = import.meta.url;
  return { script: /\.ts$/.test(here) ? new URL('./tolerance-worker-source.mjs', here) : new URL(here) };
}

/** A worker's loop: load the project once, then answer each chunk with its samples. */
export function toleranceWorkerMain(): void {
  const port = parentPort;
  if (port === null) return;
  const d = workerData as ToleranceWorkerData;
  let study: { file: ProjectFile; params: ToleranceParameter[] } | undefined;
  port.on('message', (m: { job: number; input: ChunkJob }) => {
    try {
      if (study === undefined) {
        const file = loadProjectText(d.projectText).file;
        study = { file, params: toleranceParameters(file) };
      }
      const result = runSampleChunk(study.file, study.params, d.mc, m.input.from, m.input.count, { thermal: d.thermal });
      port.postMessage({ job: m.job, ok: true, result });
    } catch (e) {
      port.postMessage({ job: m.job, ok: false, name: e instanceof Error ? e.name : 'Error', message: e instanceof Error ? e.message : String(e) });
    }
  });
}

/**
 * The samples 0..mc.samples-1 of the project: in this thread when threads <= 1, else shared in chunks
 * between this thread and threads - 1 workers (each given the project's text). The same result for any `threads`.
 */
export async function toleranceSamplesThreaded(projectText: string, file: ProjectFile, mc: MonteCarloSettings, threads: number, opts: { thermal: boolean }): Promise<SampleChunk> {
  const params = toleranceParameters(file);
  const jobs: ChunkJob[] = [];
  for (let from = 0; from < mc.samples; from += SAMPLES_PER_CHUNK) jobs.push({ from, count: Math.min(SAMPLES_PER_CHUNK, mc.samples - from) });
  const local = (j: ChunkJob): SampleChunk => runSampleChunk(file, params, mc, j.from, j.count, opts);
  if (threads <= 1 || jobs.length < 2) return joinChunks(jobs.map(local));
  const data: ToleranceWorkerData = { task: TOLERANCE_WORKER_TASK, projectText, mc, thermal: opts.thermal };
  return joinChunks(await runWorkerPool<ChunkJob, SampleChunk>(toleranceWorkerScript(), data, jobs, threads, local));
}
