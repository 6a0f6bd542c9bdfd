// The tolerance-sample workers started at the process's entry (src/cli/bin-prestart.ts), as the
// efficiency map's are (map-prestart.ts): before the rest of the command line is evaluated and before
// the project is read and validated, each worker reads and loads the project file itself and warms up
// on throwaway samples while the main thread catches up, so that its start and compilation overlap
// the main thread's own instead of delaying the samples. This module imports little (argument
// parsing and the worker start), so that it runs first in the bundle.
import type { Worker } from 'node:worker_threads';
import { numberFlag, parseArgs } from './args';
import type { WorkerScript } from '../node/worker-pool';
import { cliWorkerScript, EarlyWorkers } from './early-workers';

/** The workerData that marks a tolerance-sample worker. */
export const TOLERANCE_WORKER_TASK = 'torquewise-tolerance-sample';

export interface ToleranceWorkerData {
  task: typeof TOLERANCE_WORKER_TASK;
  /** the project file, read and loaded by the worker ahead of its samples (used only if its text is the run's) */
  projectPath?: string;
  /** warm up on throwaway samples while the run is not yet posted (with the S1 check when the run has it) */
  warm?: { thermal: boolean };
}

/**
 * The script a worker runs: bundled, the lean worker bundle beside this one (scripts/cli-bundle.mjs,
 * src/cli/efficiency-worker.ts serves both tasks) or, without it, this very file; from the sources, a
 * fixed bootstrap that loads src/cli/bin.ts through tsx.
 */
export function toleranceWorkerScript(): WorkerScript {
  return cliWorkerScript(import.meta.url, './tolerance-worker-source.mjs');
}

/**
 * What a command line starts early: for `tolerance-sample FILE --threads N` with N > 1, N - 1 workers
 * and their data; null for any other command line, one thread, help, or a bad value (the command reports it).
 */
export function tolerancePrestartPlan(argv: readonly string[]): { workers: number; data: ToleranceWorkerData } | null {
  try {
    const a = parseArgs(argv);
    if (a.command !== 'tolerance-sample' || a.file === undefined || a.flags.has('help')) return null;
    const threads = numberFlag(a, 'threads', { min: 1, max: 64, integer: true }) ?? 1;
    if (threads <= 1) return null;
    return { workers: threads - 1, data: { task: TOLERANCE_WORKER_TASK, projectPath: a.file, warm: { thermal: a.flags.has('thermal') } } };
  } catch {
    return null;
  }
}

/** Workers this process started at its entry for its tolerance-sample command, not yet taken. */
const early = new EarlyWorkers();

/** Starts the workers of tolerancePrestartPlan now. They hold no process open (unref) until the run takes them. */
export function prestartToleranceWorkers(argv: readonly string[]): void {
  const plan = tolerancePrestartPlan(argv);
  if (plan !== null) early.start(toleranceWorkerScript(), plan.data, plan.workers);
}

/** Workers started early and still alive, not yet taken. */
export function prestartedToleranceWorkers(): number {
  return early.alive();
}

/** `n` workers for a run: those started early (still alive) first, then new ones; the early ones left over are ended. */
export function takeToleranceWorkers(n: number): Worker[] {
  return early.take(n, toleranceWorkerScript(), { task: TOLERANCE_WORKER_TASK } satisfies ToleranceWorkerData);
}
