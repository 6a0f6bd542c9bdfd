// Messages between the window and the efficiency-map worker, typed by the engine's own results: the
// window sends the project text and the grid, the worker loads the project as every reader does
// (src/core/project loadProjectText) and solves the map a speed at a time, answering with progress,
// the core's EfficiencyMap, or the reason it could not run. Cancel = the window terminates the worker.
import type { EfficiencyMap } from '../../../core/steady-state/efficiency-map';
import type { EfficiencyGridSpec } from '../../../core/reports/efficiency-map-grid';

export type EfficiencyRequest = {
  kind: 'map';
  /** the project as JSON text (the project shown, already valid) */
  projectText: string;
  grid: EfficiencyGridSpec;
};

export type EfficiencyReply =
  | { kind: 'progress'; fraction: number }
  | { kind: 'done'; map: EfficiencyMap; compute_ms: number }
  | { kind: 'error'; message: string };
