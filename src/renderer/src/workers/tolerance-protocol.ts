// Messages between the window and a tolerance worker, typed by the engine's own results: the window
// sends the project text and what to compute, the worker loads the project as every reader does
// (src/core/project loadProjectText) and answers with the result or the reason it could not run.
// Two requests: every corner of the bands (core/project/tolerance-corners.ts), and one chunk of
// Monte Carlo samples (core/project/tolerance-sample.ts runSampleChunk; each sample seeded by
// (seed, index), so chunks computed by any number of workers join to the same run). Cancel = the
// window terminates the workers.
import type { CornersResult } from '../../../core/project/tolerance-corners';
import type { SampleChunk } from '../../../core/project/tolerance-sample';
import type { MonteCarloSettings } from '../../../core/project/tolerance-schema';

export type ToleranceRequest =
  | { kind: 'corners'; projectText: string }
  | { kind: 'samples'; projectText: string; mc: MonteCarloSettings; thermal: boolean; from: number; count: number };

export type CornersDone = { corners: CornersResult; compute_ms: number };
export type SamplesDone = { chunk: SampleChunk; compute_ms: number };

export type ToleranceReply =
  | { kind: 'progress'; fraction: number }
  | ({ kind: 'done' } & (CornersDone | SamplesDone))
  | { kind: 'error'; message: string };
