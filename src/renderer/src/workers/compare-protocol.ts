// Messages between the window and the comparison worker. The window sends the variants as project
// texts (each a file as written, and the name of one of its named variants or null for the file
// itself); the worker loads each as every reader does (loadProject, then the variant's overrides)
// and answers, in two runs: 'steady' (envelopes, sizing, efficiency: quick) and 'load-steps' (the
// scenario of each variant simulated: the slow part), with progress, or the reason it could not.
import type { VariantLoadSteps, VariantSteady } from '../../../core/reports/variant-comparison';

export interface CompareSource {
  /** the column's heading */
  name: string;
  /** the project file's text */
  projectText: string;
  /** the file's named variant to compare, or null for the file itself */
  variant: string | null;
}

export type CompareRequest = { kind: 'steady' | 'load-steps'; sources: CompareSource[] };

export type CompareReply =
  | { kind: 'progress'; fraction: number }
  | { kind: 'done'; steady: VariantSteady[] | null; loads: VariantLoadSteps[] | null; compute_ms: number }
  | { kind: 'error'; message: string };
