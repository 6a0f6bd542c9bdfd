// The efficiency map across worker threads (src/node/worker-pool.ts). The workers run the same
// code as the command: in the built CLI (one file, out/cli/torquewise.mjs) a worker is that file
// itself, started with workerData naming its task (src/cli/bin.ts hands it to workerMain); run from
// the TypeScript sources (tests, tsx) a worker loads src/cli/bin.ts through tsx.
//
// The process's entry starts the workers first (src/cli/map-prestart.ts), each reads and loads the
// project file while the main thread does; the map's rows are then shared out one at a time through a
// counter in shared memory, the results written in place (runSharedRows): no thread waits for another,
// and a worker not yet ready takes no row.
import { parentPort, workerData } from 'node:worker_threads';
import { loadProjectText, type ResolvedProject } from '../core/project/project';
import type { EfficiencyMap } from '../core/steady-state/efficiency-map';
import { readProjectText } from '../node/project-file';
import { claimRows, rowCounter, runSharedRows } from '../node/worker-pool';
import { MAP_WORKER_TASK, takeMapWorkers, type MapWorkerData } from './map-prestart';
export { MAP_WORKER_TASK, defaultMapThreads, mapGridFlags, prestartMapWorkers, workerScript } from './map-prestart';
import { efficiencyRows, ownMap, sharedMap, writeRow, type Corner } from './efficiency-grid';

/** What a worker is posted: the map's project and grid, the shared results and the shared row counter. */
export interface MapWorkerJob {
  projectText: string;
  corner: Corner;
  minLoss: boolean;
  /** the map, its arrays in shared memory (sharedMap) */
  out: EfficiencyMap;
  /** rowCounter() */
  counter: Int32Array;
}

/** True when this thread was started as an efficiency-map worker. */
export function isMapWorker(): boolean {
  return parentPort !== null && (workerData as Partial<MapWorkerData> | null)?.task === MAP_WORKER_TASK;
}

async function preload(path: string): Promise<{ text: string; project: ResolvedProject } | undefined> {
  try {
    const text = await readProjectText(path);
    return { text, project: loadProjectText(text) };
  } catch {
    return undefined; // the main thread reports what is wrong with the file
  }
}

/** A worker's loop: for each job, claim the map's rows and write them, then answer. */
export function workerMain(): void {
  const port = parentPort;
  if (port === null) return;
  const d = workerData as MapWorkerData;
  const early = d.projectPath === undefined ? Promise.resolve(undefined) : preload(d.projectPath);
  port.on('message', (m: MapWorkerJob) => {
    void early.then((pre) => {
      try {
        const p = pre !== undefined && pre.text === m.projectText ? pre.project : loadProjectText(m.projectText);
        const g = { corner: m.corner, minLoss: m.minLoss, torques: m.out.torques };
        claimRows(m.counter, m.out.speeds.length, (i) => writeRow(p, g, m.out, i));
        port.postMessage({ ok: true });
      } catch (e) {
        port.postMessage({ ok: false, name: e instanceof Error ? e.name : 'Error', message: e instanceof Error ? e.message : String(e) });
      }
    });
  });
}

/**
 * The map over speeds x torques: in this thread when threads <= 1, else its speed rows shared out
 * one at a time between this thread and `threads` - 1 workers (`workersOnly`: `threads` workers, this
 * thread computing nothing). Every row is computed on its own, so the map is the same bit for bit.
 */
export async function efficiencyMapThreaded(projectText: string, p: ResolvedProject, corner: Corner, minLoss: boolean, speeds: Float64Array, torques: Float64Array, threads: number, opts: { workersOnly?: boolean } = {}): Promise<EfficiencyMap> {
  const g = { corner, minLoss, torques };
  if (threads <= 1 || speeds.length < 2) return efficiencyRows(p, g, speeds);
  const local = opts.workersOnly !== true;
  const workers = takeMapWorkers(Math.min(local ? threads - 1 : threads, speeds.length));
  const out = sharedMap(speeds, torques), counter = rowCounter();
  const job: MapWorkerJob = { projectText, corner, minLoss, out, counter };
  try {
    await runSharedRows(workers, job, counter, speeds.length, local ? (i) => writeRow(p, g, out, i) : undefined);
  } finally {
    for (const w of workers) void w.terminate();
  }
  return ownMap(out);
}
