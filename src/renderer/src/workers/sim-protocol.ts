// Messages between the window and the simulation worker.
import type { Finding } from '../../../core/base/finding';
import type { LoadStepResult } from '../../../core/simulation/simulate';

export interface SimRequest {
  /** the project file (already valid) */
  file: unknown;
  maxPoints: number;
}

export interface SimEvent {
  kind: string;
  t_s: number;
  tEnd_s?: number;
  message: string;
}

export type SimReply =
  | { kind: 'progress'; fraction: number }
  | {
      kind: 'done';
      metrics: Record<string, unknown>;
      loadSteps: LoadStepResult[];
      traces: Record<string, Float64Array>;
      events: SimEvent[];
      stats: Record<string, unknown>;
      diagnostic: unknown;
      /** before and after the run: the scenario beyond the motor or drive, tuning warnings, limits met */
      findings: Finding[];
    }
  | { kind: 'error'; message: string };
