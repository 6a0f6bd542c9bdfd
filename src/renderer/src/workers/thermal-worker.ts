// The thermal results are computed here, off the window's thread: the continuous (S1) torque curves
// (a flux-map machine takes about 0.2 s for 200 speeds each way) and the duty cycle, repeated to its
// periodic state with progress through each repeat.
/// <reference lib="webworker" />
import { loadProjectText } from '../../../core/project/project';
import { datasheetContinuousOf } from '../../../core/reports/datasheet-parts';
import { lossConditionsFromProject } from '../../../core/project/loss-conditions-from-project';
import { temperatureModelFromProject } from '../../../core/project/temperature-model-from-project';
import { evaluateDutyCycle } from '../../../core/simulation/duty-cycle';
import { InputError, isInputError } from '../../../core/base/errors';
import type { ThermalReply, ThermalRequest } from './thermal-protocol';

const post = (msg: ThermalReply) => (self as unknown as DedicatedWorkerGlobalScope).postMessage(msg);

self.onmessage = (ev: MessageEvent<ThermalRequest>) => {
  const req = ev.data;
  try {
    const t0 = performance.now();
    const p = loadProjectText(req.projectText);
    if (req.kind === 's1') {
      const s1 = datasheetContinuousOf(p, req.speedMax, req.points);
      post({ kind: 'done', s1, compute_ms: performance.now() - t0 });
      return;
    }
    if (p.thermal === undefined) throw new InputError('thermal', 'is needed for the duty cycle: the project has no thermal section');
    if (p.dutyCycle === undefined) throw new InputError('dutyCycle', 'is needed: the project has no dutyCycle section');
    let last = 0;
    const result = evaluateDutyCycle(p.dutyCycle, p.thermal, temperatureModelFromProject(p), lossConditionsFromProject(p), p.peak, {
      ...(req.step_s !== null ? { step_s: req.step_s } : {}),
      onProgress: (fraction) => {
        const now = performance.now();
        if (now - last > 50) {
          last = now;
          post({ kind: 'progress', fraction });
        }
      },
    });
    // never null here: no signal, and progress never asks to stop (cancel terminates the worker)
    if (result !== null) post({ kind: 'done', result, compute_ms: performance.now() - t0 });
  } catch (e) {
    post({ kind: 'error', message: isInputError(e) ? e.message : `The ${req.kind === 's1' ? 'continuous-torque curve' : 'duty cycle'} stopped: ${e instanceof Error ? e.message : String(e)}` });
  }
};
