// Worker threads started at the process's entry for a command that will want them (map-prestart.ts,
// tolerance-prestart.ts), held without keeping the process open until the command takes them; and
// the script such a worker runs. This module imports little, so that it runs first in the bundle.
import type { Worker } from 'node:worker_threads';
import { existsSync } from 'node:fs';
import { startWorkers, type WorkerScript } from '../node/worker-pool';

/**
 * The script of a command-line worker: bundled (`here` ends in .mjs), the lean worker bundle beside
 * it (out/cli/efficiency-worker.mjs, built by scripts/cli-bundle.mjs, which serves every task) or,
 * without it, the bundle itself; from the sources (`here` ends in .ts), the tsx bootstrap
 * `sourceBootstrap` beside the calling module.
 */
export function cliWorkerScript(here: string, sourceBootstrap: string): WorkerScript {
  if (/\.ts$/.test(here)) return { script: new URL(sourceBootstrap, here) };
  const lean = new URL('./efficiency-worker.mjs', here);
  return { script: lean.protocol === 'file:' && existsSync(lean) ? lean : new URL(here) };
}

/** Workers started ahead of their command: unref'd (they hold no process open) until taken. */
export class EarlyWorkers {
  private early: Array<{ worker: Worker; alive: boolean }> = [];

  /** Starts `n` workers of `ws` with `data` now. */
  start(ws: WorkerScript, data: unknown, n: number): void {
    this.early = startWorkers(ws, data, n).map((worker) => {
      const e = { worker, alive: true };
      worker.unref();
      worker.on('error', () => (e.alive = false));
      worker.on('exit', () => (e.alive = false));
      return e;
    });
  }

  /** Those started and still alive, not yet taken. */
  alive(): number {
    return this.early.filter((e) => e.alive).length;
  }

  /** `n` workers: those started early (still alive) first, then new ones of `ws` with `data`; the early ones left over are ended. */
  take(n: number, ws: WorkerScript, data: unknown): Worker[] {
    const taken = this.early.filter((e) => e.alive).map((e) => e.worker).slice(0, n);
    for (const e of this.early) if (!taken.includes(e.worker)) void e.worker.terminate();
    this.early = [];
    for (const w of taken) w.ref();
    return [...taken, ...startWorkers(ws, data, n - taken.length)];
  }
}
