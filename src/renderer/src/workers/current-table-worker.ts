// The firmware's current-reference table built off the window's thread (workers/current-table-job.ts
// currentTableJob): progress after each speed row of each corner, then the header text to export.
/// <reference lib="webworker" />
import { isInputError } from '../../../core/base/errors';
import { currentTableJob } from './current-table-job';
import type { CurrentTableReply, CurrentTableRequest } from './current-table-protocol';

const post = (msg: CurrentTableReply) => (self as unknown as DedicatedWorkerGlobalScope).postMessage(msg);

self.onmessage = (ev: MessageEvent<CurrentTableRequest>) => {
  const req = ev.data;
  if (req.kind !== 'current-table') return;
  try {
    const t0 = performance.now();
    const r = currentTableJob(req.projectText, req.choice, req.date, (fraction) => post({ kind: 'progress', fraction }));
    post({ kind: 'done', ...r, compute_ms: performance.now() - t0 });
  } catch (e) {
    post({ kind: 'error', message: isInputError(e) ? e.message : `The current table stopped: ${e instanceof Error ? e.message : String(e)}` });
  }
};
