// A finished load-step simulation as the app keeps it (owned by App, so it survives switching
// views and the Export menu can write its traces): the engine's result, its findings, and the name
// of the project it was run on; for the switching model, its switching result and the last averaged
// run of the same inputs (kept for the overlay).
import type { Finding } from '../../../core/base/finding';
import type { SimulationResult } from '../../../core/simulation/simulate';
import type { SwitchingResult } from '../../../core/simulation/switching-result';

export type SimDone = SimulationResult & {
  /** before and after the run: the scenario beyond the motor or drive, tuning warnings, limits met */
  findings: Finding[];
  /** the name of the project the run belongs to */
  project: string;
  /** the inverter model the run used (control.pwm.model; absent: averaged) */
  pwmModel?: 'average' | 'switching';
  /** the project's inputs apart from control.pwm, as text: two runs with the same key differ only in the PWM model */
  inputsKey?: string;
  /** the switching model's results (a switching run whose engine reports them) */
  switching?: SwitchingResult;
  /** a switching run: the last averaged run of the same inputs, for the overlay */
  averaged?: SimDone;
};
