// The efficiency map's workers started at the process's entry (src/cli/bin-prestart.ts), before the
// rest of the command line is even evaluated: on two cores the main thread needs 150-250 ms from the
// process's start to the map, a worker 60-90 ms to start and evaluate the bundle and 15-40 ms more to
// read and load the project; started with the map instead, a worker joined it 100+ ms late. This
// module imports little (argument parsing and the worker start), so that it runs first in the bundle.
import type { Worker } from 'node:worker_threads';
import { numberFlag, parseArgs, stringFlag, type ParsedArgs } from './args';
import type { Corner } from './efficiency-grid';
import type { WorkerScript } from '../node/worker-pool';
import { cliWorkerScript, EarlyWorkers } from './early-workers';

/** The workerData that marks an efficiency-map worker. */
export const MAP_WORKER_TASK = 'torquewise-efficiency-map';

export interface MapWorkerData {
  task: typeof MAP_WORKER_TASK;
  /** the project file, read and loaded by the worker ahead of its map (used only if its text is the map's) */
  projectPath?: string;
  /** the command line's map, for the worker to warm up on while it waits (efficiency-workers.ts) */
  warm?: { corner: Corner; minLoss: boolean; torquePoints: number };
}

/**
 * The script a worker runs: bundled, the lean worker bundle beside this one (scripts/cli-bundle.mjs)
 * or, without it, this very file; from the sources, a fixed bootstrap that loads src/cli/bin.ts through tsx.
 */
export function workerScript(): WorkerScript {
  return cliWorkerScript(import.meta.url, './efficiency-worker-source.mjs');
}

/**
 * Threads by default: one, whatever the grid. Measured on two cores (traction demo, 2 threads against
 * 1): 0.7-0.8x at 100 x 100, about 1.0x at 200 x 200. Each thread's V8 isolate compiles the solvers
 * on its own (about 150 ms of CPU on background threads, which a single thread gets for free on the
 * second core), and a machine busy with other processes gives a process its share whatever its
 * threads. More threads stay a choice (--threads N); the grid is taken as a reason once measured.
 */
export function defaultMapThreads(_nS: number, _nT: number): number {
  return 1;
}

/** The grid's size and the threads of an `efficiency` command line (InputError on a bad value). */
export function mapGridFlags(args: ParsedArgs): { nS: number; nT: number; threads: number } {
  const nS = numberFlag(args, 'speed-points', { min: 2, max: 2000, integer: true }) ?? 50;
  const nT = numberFlag(args, 'torque-points', { min: 2, max: 2000, integer: true }) ?? 50;
  const threads = numberFlag(args, 'threads', { min: 1, max: 64, integer: true }) ?? defaultMapThreads(nS, nT);
  return { nS, nT, threads };
}

/** Workers this process started at its entry for its efficiency command, not yet taken. */
const early = new EarlyWorkers();

/**
 * For an `efficiency` command line that will use more than one thread, starts its workers now (each
 * reads and loads the project file, then warms up on the map while it waits for it). They hold no process open (unref) until the map takes them.
 */
export function prestartMapWorkers(argv: readonly string[]): void {
  let data: MapWorkerData, threads: number;
  try {
    const a = parseArgs(argv);
    if (a.command !== 'efficiency' || a.file === undefined || a.flags.has('help')) return;
    const grid = mapGridFlags(a);
    threads = grid.threads;
    const corner = stringFlag(a, 'corner') === 'cold' ? 'cold' : 'hot';
    data = { task: MAP_WORKER_TASK, projectPath: a.file, warm: { corner, minLoss: a.flags.has('min-loss'), torquePoints: grid.nT } };
  } catch {
    return; // bad input: the command reports it
  }
  if (threads > 1) early.start(workerScript(), data, threads - 1);
}

/** `n` workers for a map: those started early (still alive) first, then new ones; the early ones left over are ended. */
export function takeMapWorkers(n: number): Worker[] {
  return early.take(n, workerScript(), { task: MAP_WORKER_TASK } satisfies MapWorkerData);
}
