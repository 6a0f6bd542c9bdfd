// Messages between the window and the thermal worker, typed by the engine's own results: the window
// sends the project text and what to compute, the worker loads the project as every reader does
// (src/core/project loadProjectText) and answers with progress, the result, or the reason it could
// not run. Two requests: the continuous (S1) torque curves of the envelope view
// (core/reports/datasheet-parts.ts) and the duty cycle of the Duty cycle view
// (core/simulation/duty-cycle.ts). Cancel = the window terminates the worker.
import type { DatasheetContinuous } from '../../../core/reports/datasheet-parts';
import type { DutyCycleResult } from '../../../core/simulation/duty-cycle';

export type ThermalRequest =
  | { kind: 's1'; projectText: string; /** rad/s */ speedMax: number; points: number }
  | { kind: 'duty-cycle'; projectText: string; /** evaluation step, s; null: the samples' own instants */ step_s: number | null };

export type S1Done = { s1: DatasheetContinuous | null; compute_ms: number };
export type DutyCycleDone = { result: DutyCycleResult; compute_ms: number };

export type ThermalReply =
  | { kind: 'progress'; fraction: number }
  | ({ kind: 'done' } & (S1Done | DutyCycleDone))
  | { kind: 'error'; message: string };
