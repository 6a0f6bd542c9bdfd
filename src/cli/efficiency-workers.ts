// The efficiency map across worker threads (src/node/worker-pool.ts). The workers run the same
// code as the command: in the built CLI (one file, out/cli/torquewise.mjs) a worker is that file
// itself, started with workerData naming its task (src/cli/bin.ts hands it to workerMain); run from
// the TypeScript sources (tests, tsx) a worker loads src/cli/bin.ts through tsx. Each worker loads
// the project text through the core pipeline once, then computes the blocks of speed rows it is given.
import { parentPort, workerData } from 'node:worker_threads';
import { loadProjectText } from '../core/project/project';
import type { EfficiencyMap } from '../core/steady-state/efficiency-map';
import { runWorkerPool, type WorkerReply, type WorkerScript } from '../node/worker-pool';
import { efficiencyRows, joinRows, type Corner } from './efficiency-grid';

/** The workerData that marks an efficiency-map worker. */
export const MAP_WORKER_TASK = 'torquewise-efficiency-map';

interface MapWorkerData {
  task: typeof MAP_WORKER_TASK;
  projectText: string;
  corner: Corner;
  minLoss: boolean;
  torques: Float64Array;
}

/** True when this thread was started as an efficiency-map worker. */
export function isMapWorker(): boolean {
  return parentPort !== null && (workerData as Partial<MapWorkerData> | null)?.task === MAP_WORKER_TASK;
}

/** A worker's loop: answer each block of speeds with its rows. */
export function workerMain(): void {
  const port = parentPort;
  if (port === null) return;
  const d = workerData as MapWorkerData;
  const p = loadProjectText(d.projectText);
  const g = { corner: d.corner, minLoss: d.minLoss, torques: d.torques };
  port.on('message', (m: { job: number; input: Float64Array }) => {
    let reply: WorkerReply<EfficiencyMap>;
    try {
      reply = { job: m.job, ok: true, result: efficiencyRows(p, g, m.input) };
    } catch (e) {
      reply = { job: m.job, ok: false, name: e instanceof Error ? e.name : 'Error', message: e instanceof Error ? e.message : String(e) };
    }
    port.postMessage(reply);
  });
}

/** The script a worker runs: this very file when bundled, else a fixed bootstrap that loads src/cli/bin.ts through tsx. */
export function workerScript(): WorkerScript {
  const here = import.meta.url;
  if (!/\.ts$/.test(here)) return { script: new URL(here) };
  return { script: new URL('./efficiency-worker-source.mjs', here) };
}

/**
 * The map over speeds x torques: in this thread when threads <= 1, else the speed rows split in
 * blocks (about eight per thread, so that the threads finish together) across this thread and
 * `threads` - 1 workers (`workersOnly`: on `threads` workers, this thread computing nothing).
 */
export async function efficiencyMapThreaded(projectText: string, p: ReturnType<typeof loadProjectText>, corner: Corner, minLoss: boolean, speeds: Float64Array, torques: Float64Array, threads: number, opts: { workersOnly?: boolean } = {}): Promise<EfficiencyMap> {
  const g = { corner, minLoss, torques };
  if (threads <= 1 || speeds.length < 2) return efficiencyRows(p, g, speeds);
  const size = Math.max(1, Math.ceil(speeds.length / (threads * 8)));
  const blocks: Float64Array[] = [];
  for (let a = 0; a < speeds.length; a += size) blocks.push(speeds.slice(a, a + size));
  const data: MapWorkerData = { task: MAP_WORKER_TASK, projectText, corner, minLoss, torques };
  // this thread computes blocks too, while the workers start and after
  const rows = await runWorkerPool<Float64Array, EfficiencyMap>(workerScript(), data, blocks, threads, opts.workersOnly === true ? undefined : (s) => efficiencyRows(p, g, s));
  return joinRows(speeds, torques, rows);
}
