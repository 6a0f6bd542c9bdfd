// The efficiency map is solved here, off the window's thread, one speed at a time with progress: with
// least-current control, or with the loss-minimising current (then also its least-current start points,
// so the gain of loss-minimising control comes with it).
/// <reference lib="webworker" />
import { loadProjectText } from '../../../core/project/project';
import { efficiencyGridAxes, emptyEfficiencyMap, solveEfficiencyRow } from '../../../core/reports/efficiency-map-grid';
import { minLossGain, type MinLossGainMap } from '../../../core/steady-state/min-loss-gain-map';
import { isInputError } from '../../../core/base/errors';
import type { EfficiencyReply, EfficiencyRequest } from './efficiency-protocol';

const post = (msg: EfficiencyReply, transfer: Transferable[] = []) => (self as unknown as DedicatedWorkerGlobalScope).postMessage(msg, transfer);

self.onmessage = (ev: MessageEvent<EfficiencyRequest>) => {
  const req = ev.data;
  if (req.kind !== 'map') return;
  try {
    const t0 = performance.now();
    const p = loadProjectText(req.projectText);
    const { speeds, torques } = efficiencyGridAxes(req.grid);
    const minLoss = req.control === 'min-loss' || req.gain;
    const map = emptyEfficiencyMap(speeds, torques);
    const starts = minLoss ? emptyEfficiencyMap(speeds, torques) : undefined;
    let last = 0;
    for (let i = 0; i < speeds.length; i++) {
      solveEfficiencyRow(p, req.grid.corner, map, i, minLoss ? 'min-loss' : 'least-current', starts);
      const now = performance.now();
      if (now - last > 50) {
        last = now;
        post({ kind: 'progress', fraction: (i + 1) / speeds.length });
      }
    }
    const gain: MinLossGainMap | null = starts && req.gain ? minLossGain(starts, map) : null;
    const shown = starts && req.control === 'least-current' ? starts : map;
    // the arrays' memory moves to the window instead of being copied
    const transfer = [...Object.values(shown), ...(gain ? Object.values(gain) : [])].map((v: ArrayBufferView) => v.buffer as ArrayBuffer);
    post({ kind: 'done', map: shown, gain, compute_ms: performance.now() - t0 }, [...new Set(transfer)]);
  } catch (e) {
    post({ kind: 'error', message: isInputError(e) ? e.message : `The efficiency map stopped: ${e instanceof Error ? e.message : String(e)}` });
  }
};
