// Messages between the window and the efficiency-map worker, typed by the engine's own results: the
// window sends the project text and the grid, the worker loads the project as every reader does
// (src/core/project loadProjectText) and solves the map a speed at a time, answering with progress,
// the core's EfficiencyMap (with the gain of loss-minimising control when asked), or the reason it
// could not run. Cancel = the window terminates the worker.
import type { EfficiencyMap, MapControl } from '../../../core/steady-state/efficiency-map';
import type { MinLossGainMap } from '../../../core/steady-state/min-loss-gain-map';
import type { EfficiencyGridSpec } from '../../../core/reports/efficiency-map-grid';

export type EfficiencyRequest = {
  kind: 'map';
  /** the project as JSON text (the project shown, already valid) */
  projectText: string;
  grid: EfficiencyGridSpec;
  /** the rule that chooses the current of the map returned */
  control: MapControl;
  /** also the gain of loss-minimising control over the least current (solves the min-loss map either way) */
  gain: boolean;
};

export type EfficiencyReply =
  | { kind: 'progress'; fraction: number }
  | { kind: 'done'; map: EfficiencyMap; gain: MinLossGainMap | null; compute_ms: number }
  | { kind: 'error'; message: string };
