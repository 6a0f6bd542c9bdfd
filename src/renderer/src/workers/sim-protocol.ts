// Messages between the window and the simulation worker, typed by the engine's own results: the
// window sends the project text, the worker loads it as every reader does (src/core/project
// loadProjectText: JSON with the duplicate-key check, migration, schema, resolution) and answers
// with progress, the core's SimulationResult and findings, or the reason it could not run.
import type { Finding } from '../../../core/base/finding';
import type { SimulationResult } from '../../../core/simulation/simulate';
import type { SwitchingResult } from '../../../core/simulation/switching-result';

export type SimRequest = {
  kind: 'run';
  /** the project as JSON text (the project shown, already valid) */
  projectText: string;
  /** samples kept per trace */
  maxPoints: number;
};

export type SimReply =
  | { kind: 'progress'; fraction: number }
  | {
      kind: 'done';
      /** with the switching model, its switching result beside the averaged results */
      result: SimulationResult & { switching?: SwitchingResult };
      /** before and after the run: the scenario beyond the motor or drive, tuning warnings, limits met */
      findings: Finding[];
    }
  | { kind: 'error'; message: string };
