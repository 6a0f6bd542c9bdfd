// Tolerance studies off the window's thread: every corner of the bands (with progress), or one chunk of Monte Carlo
// samples (the window hands chunks to as many of these workers as it runs and joins them in order).
// The project is loaded once per text and kept for the next chunk.
/// <reference lib="webworker" />
import { loadProjectText } from '../../../core/project/project';
import { toleranceCorners } from '../../../core/project/tolerance-corners';
import { toleranceParameters, type ToleranceParameter } from '../../../core/project/tolerance-apply';
import { runSampleChunk } from '../../../core/project/tolerance-sample';
import type { ProjectFile } from '../../../core/project/schema';
import { isInputError } from '../../../core/base/errors';
import type { ToleranceReply, ToleranceRequest } from './tolerance-protocol';

const post = (msg: ToleranceReply, transfer: Transferable[] = []) => (self as unknown as DedicatedWorkerGlobalScope).postMessage(msg, transfer);

// this worker's project, kept between chunks of one run (a worker belongs to one window and one run)
const loaded: { text: string | null; file: ProjectFile | null; params: ToleranceParameter[] } = { text: null, file: null, params: [] };

self.onmessage = (ev: MessageEvent<ToleranceRequest>) => {
  const req = ev.data;
  try {
    const t0 = performance.now();
    if (loaded.text !== req.projectText) {
      const file = loadProjectText(req.projectText).file;
      loaded.text = req.projectText;
      loaded.file = file;
      loaded.params = toleranceParameters(file);
    }
    const file = loaded.file!;
    if (req.kind === 'corners') {
      // progress after each corner (corners done / corners); cancel terminates this worker
      const corners = toleranceCorners(file, { onCorner: (done, total) => post({ kind: 'progress', fraction: done / total }) });
      post({ kind: 'done', corners, compute_ms: performance.now() - t0 });
      return;
    }
    const chunk = runSampleChunk(file, loaded.params, req.mc, req.from, req.count, { thermal: req.thermal });
    post({ kind: 'done', chunk, compute_ms: performance.now() - t0 }, [chunk.values.buffer, chunk.margins.buffer, chunk.met.buffer]);
  } catch (e) {
    post({ kind: 'error', message: isInputError(e) ? e.message : `The tolerance ${req.kind === 'corners' ? 'corners' : 'samples'} stopped: ${e instanceof Error ? e.message : String(e)}` });
  }
};
