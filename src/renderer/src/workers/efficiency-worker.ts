// The efficiency map is solved here, off the window's thread, one speed at a time with progress.
/// <reference lib="webworker" />
import { loadProjectText } from '../../../core/project/project';
import { efficiencyGridAxes, emptyEfficiencyMap, solveEfficiencyRow } from '../../../core/reports/efficiency-map-grid';
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
    const map = emptyEfficiencyMap(speeds, torques);
    let last = 0;
    for (let i = 0; i < speeds.length; i++) {
      solveEfficiencyRow(p, req.grid.corner, map, i);
      const now = performance.now();
      if (now - last > 50) {
        last = now;
        post({ kind: 'progress', fraction: (i + 1) / speeds.length });
      }
    }
    // the arrays' memory moves to the window instead of being copied
    const transfer = Object.values(map).map((v: ArrayBufferView) => v.buffer as ArrayBuffer);
    post({ kind: 'done', map, compute_ms: performance.now() - t0 }, [...new Set(transfer)]);
  } catch (e) {
    post({ kind: 'error', message: isInputError(e) ? e.message : `The efficiency map stopped: ${e instanceof Error ? e.message : String(e)}` });
  }
};
