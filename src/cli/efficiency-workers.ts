// The efficiency map across worker threads (src/node/worker-pool.ts). The workers run the same
// code as the command: in the built CLI (one file, out/cli/torquewise.mjs) a worker is that file
// itself, started with workerData naming its task (src/cli/bin.ts hands it to workerMain); run from
// the TypeScript sources (tests, tsx) a worker loads src/cli/bin.ts through tsx.
//
// The process's entry starts the workers first (src/cli/map-prestart.ts), each reads and loads the
// project file while the main thread does; the map's rows are then shared out one at a time through a
// counter in shared memory, the results written in place (runSharedRows): no thread waits for another,
// and a worker not yet ready takes no row.
import { parentPort, receiveMessageOnPort, workerData, type MessagePort } from 'node:worker_threads';
import { mapAxis } from '../core/steady-state/efficiency-map';
import { maxTorquePoint } from '../core/steady-state/envelope';
import { projectSpeedRange } from '../core/reports/speed-range';
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

/** Longest warm-up, ms: a worker started early has this long before its map is due. */
const WARM_MS = 250;

/**
 * Warm-up while the map is not yet posted: rows of the command line's map (the default speed range,
 * the motoring-to-generating torques at standstill), spread over the speeds, their results thrown away,
 * so that the map's code is compiled when the map comes (a cold thread computes its first rows several
 * times slower). Stops as soon as a message waits (returned), or after WARM_MS.
 */
function warmUp(port: MessagePort, p: ResolvedProject, w: NonNullable<MapWorkerData['warm']>): MapWorkerJob | undefined {
  const until = performance.now() + WARM_MS;
  const waiting = receiveMessageOnPort(port);
  if (waiting !== undefined) return waiting.message as MapWorkerJob;
  const model = w.corner === 'hot' ? p.models.hot : p.models.cold;
  const wMax = projectSpeedRange(p).speedMax;
  const tMot = Math.abs(maxTorquePoint(model, p.peak, 0, 'motoring').torque), tGen = Math.abs(maxTorquePoint(model, p.peak, 0, 'generating').torque);
  const g = { corner: w.corner, minLoss: w.minLoss, torques: mapAxis(-tGen, tMot, w.torquePoints) };
  const speed = new Float64Array(1);
  for (let k = 0; performance.now() < until; k++) {
    const m = receiveMessageOnPort(port);
    if (m !== undefined) return m.message as MapWorkerJob;
    speed[0] = wMax * ((k * 0.618034) % 1);
    efficiencyRows(p, g, speed);
  }
  return undefined;
}

/** A worker's loop: for each job, claim the map's rows and write them, then answer. */
export function workerMain(): void {
  const port = parentPort;
  if (port === null) return;
  const d = workerData as MapWorkerData;
  const serve = (m: MapWorkerJob, pre: { text: string; project: ResolvedProject } | undefined): void => {
    try {
      const p = pre !== undefined && pre.text === m.projectText ? pre.project : loadProjectText(m.projectText);
      const g = { corner: m.corner, minLoss: m.minLoss, torques: m.out.torques };
      claimRows(m.counter, m.out.speeds.length, (i) => writeRow(p, g, m.out, i));
      port.postMessage({ ok: true });
    } catch (e) {
      port.postMessage({ ok: false, name: e instanceof Error ? e.name : 'Error', message: e instanceof Error ? e.message : String(e) });
    }
  };
  if (d.projectPath === undefined) {
    port.on('message', (m: MapWorkerJob) => serve(m, undefined));
    return;
  }
  void preload(d.projectPath).then((pre) => {
    let first: MapWorkerJob | undefined;
    try {
      if (pre !== undefined && d.warm !== undefined) first = warmUp(port, pre.project, d.warm);
    } catch {
      // a warm-up that fails changes nothing: the map reports its own failures
    }
    if (first !== undefined) serve(first, pre);
    port.on('message', (m: MapWorkerJob) => serve(m, pre));
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
