// Messages between the window and the simulation worker.
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
      traces: Record<string, Float64Array>;
      events: SimEvent[];
      stats: Record<string, unknown>;
      diagnostic: unknown;
    }
  | { kind: 'error'; message: string };
