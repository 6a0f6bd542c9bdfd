// A finished load-step simulation as the app keeps it (owned by App, so it survives switching
// views and the Export menu can write its traces): the engine's result, its findings, and the name
// of the project it was run on.
import type { Finding } from '../../../core/base/finding';
import type { SimulationResult } from '../../../core/simulation/simulate';

export type SimDone = SimulationResult & {
  /** before and after the run: the scenario beyond the motor or drive, tuning warnings, limits met */
  findings: Finding[];
  /** the name of the project the run belongs to */
  project: string;
};
