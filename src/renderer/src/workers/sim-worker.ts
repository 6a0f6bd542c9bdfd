// The simulation runs here, off the window's thread. Cancel = the window terminates this worker.
/// <reference lib="webworker" />
import { loadProjectText } from '../../../core/project/project';
import { runSimulation, simulationFindings } from '../../../core/simulation/simulate';
import { simulationFromProject } from '../../../core/project/simulation-from-project';
import { isInputError } from '../../../core/base/errors';
import type { SwitchingResult } from '../../../core/simulation/switching-result';
import type { SimRequest, SimReply } from './sim-protocol';

const post = (msg: SimReply, transfer: Transferable[] = []) => (self as unknown as DedicatedWorkerGlobalScope).postMessage(msg, transfer);

/** The typed arrays of a switching result (envelope, harmonics, the full-resolution window), to move rather than copy. */
function switchingArrays(s: SwitchingResult | undefined): Float64Array[] {
  if (!s) return [];
  const w = s.window;
  return [s.rippleEnvelope.angle_rad, s.rippleEnvelope.peakToPeak_A, s.harmonics_A, w.t_s, w.ia_A, w.ib_A, w.ic_A, w.va_V, w.idc_A];
}

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
    const transfer = [...new Set([...Object.values(result.traces), ...switchingArrays((result as { switching?: SwitchingResult }).switching)].map((v) => v.buffer))];
    post({ kind: 'done', result, findings: simulationFindings(result, setup).filter((f) => f.code !== 'simulation-stopped') }, transfer);
  } catch (e) {
    post({ kind: 'error', message: isInputError(e) ? e.message : `The simulation stopped: ${e instanceof Error ? e.message : String(e)}` });
  }
};
