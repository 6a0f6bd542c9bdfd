// The simulation runs here, off the window's thread. Cancel = the window terminates this worker.
/// <reference lib="webworker" />
import { resolveProject } from '../../../core/project/project';
import { parseProject } from '../../../core/project/schema';
import { runSimulation, simulationFindings } from '../../../core/simulation/simulate';
import { simulationFromProject } from '../../../core/project/simulation-from-project';
import { isInputError } from '../../../core/base/errors';
import type { SimRequest, SimReply } from './sim-protocol';

const post = (msg: SimReply, transfer: Transferable[] = []) => (self as unknown as DedicatedWorkerGlobalScope).postMessage(msg, transfer);

self.onmessage = (ev: MessageEvent<SimRequest>) => {
  const { file, maxPoints } = ev.data;
  try {
    const p = resolveProject(parseProject(file));
    const setup = simulationFromProject(p);
    let last = 0;
    const result = runSimulation(setup, {
      maxPoints,
      onProgress: (f: number) => {
        const now = performance.now();
        if (now - last > 50) {
          last = now;
          post({ kind: 'progress', fraction: Math.max(0, Math.min(1, f)) });
        }
      },
    });
    const traces: Record<string, Float64Array> = {};
    const transfer: Transferable[] = [];
    for (const [k, v] of Object.entries(result.traces)) {
      if (v instanceof Float64Array) {
        traces[k] = v;
        transfer.push(v.buffer);
      }
    }
    post(
      {
        kind: 'done',
        metrics: { ...result.metrics },
        loadSteps: result.loadSteps,
        traces,
        events: result.events,
        stats: { ...result.stats },
        diagnostic: result.diagnostic ?? null,
        findings: simulationFindings(result, setup).filter((f) => f.code !== 'simulation-stopped'),
      },
      transfer,
    );
  } catch (e) {
    post({ kind: 'error', message: isInputError(e) ? e.message : `The simulation stopped: ${e instanceof Error ? e.message : String(e)}` });
  }
};
