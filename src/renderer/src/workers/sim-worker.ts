// The simulation runs here, off the window's thread. Cancel = the window terminates this worker.
/// <reference lib="webworker" />
import { loadProjectText } from '../../../core/project/project';
import { runSimulation, simulationFindings } from '../../../core/simulation/simulate';
import { simulationFromProject } from '../../../core/project/simulation-from-project';
import { isInputError } from '../../../core/base/errors';
import type { SimRequest, SimReply } from './sim-protocol';

const post = (msg: SimReply, transfer: Transferable[] = []) => (self as unknown as DedicatedWorkerGlobalScope).postMessage(msg, transfer);

self.onmessage = (ev: MessageEvent<SimRequest>) => {
  const req = ev.data;
  if (req.kind !== 'run') return;
  try {
    // the project read as the app and the command line read it
    const p = loadProjectText(req.projectText);
    const setup = simulationFromProject(p);
    let last = 0;
    const result = runSimulation(setup, {
      maxPoints: req.maxPoints,
      onProgress: (f: number) => {
        const now = performance.now();
        if (now - last > 50) {
          last = now;
          post({ kind: 'progress', fraction: Math.max(0, Math.min(1, f)) });
        }
      },
    });
    // the traces' memory moves to the window instead of being copied (each buffer once)
    const transfer = [...new Set(Object.values(result.traces).map((v) => v.buffer))];
    post({ kind: 'done', result, findings: simulationFindings(result, setup).filter((f) => f.code !== 'simulation-stopped') }, transfer);
  } catch (e) {
    post({ kind: 'error', message: isInputError(e) ? e.message : `The simulation stopped: ${e instanceof Error ? e.message : String(e)}` });
  }
};
