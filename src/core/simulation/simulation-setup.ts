/**
 * What a simulation run is given: the plant, the controller, the scenario's marks, the solver and
 * the limits that stop a run (SimulationSetup), and the options of one run (RunOptions).
 */
import type { Finding } from '../base/finding';
import type { PlantParams } from './plant';
import type { DqMachine } from '../machine/dq-machine';
import type { MachineInput } from '../machine/machine-model';
import type { ControllerConfig } from '../control/controller';
import type { TuningReport } from '../control/tuning';
import type { PwmSpec } from '../drive/pwm-spec';
import type { AngleSpec } from '../control/angle-spec';
import { DEFAULT_MAX_POINTS } from './decimate';

export interface SolverOptions {
  /** 'cash-karp': adaptive ode45-cash-karp; 'rk4': classical fixed-step RK4 (baseline) */
  method: 'cash-karp' | 'rk4';
  /** Cash-Karp error tolerance (relative, with the floors below) */
  tol: number;
  /** RK4 steps per control period */
  rk4Substeps: number;
  /** absolute error floor of the currents, as a fraction of Imax */
  currentFloor: number;
  /** absolute error floor of the speed, as a fraction of the divergence speed / 3 */
  speedFloor: number;
  /** absolute error floor of the electrical angle, rad */
  angleFloor: number;
  /**
   * with 'cash-karp' and a constant-parameter machine: each control period by the exact
   * discretisation of the electrical dynamics where it applies (exact-stepper.ts), Cash-Karp
   * elsewhere (default true; false: Cash-Karp throughout)
   */
  exactPeriods?: boolean;
  /**
   * the switching model's segments for a constant-parameter machine: 'exact' (default: the exact
   * propagator, switching-segment.ts) or 'rk4' (one classical RK4 step each, the reference path)
   */
  switchingSegments?: 'exact' | 'rk4';
}

export const DEFAULT_SOLVER_OPTIONS: Readonly<SolverOptions> = {
  method: 'cash-karp',
  tol: 1e-6,
  rk4Substeps: 1,
  currentFloor: 1e-3,
  speedFloor: 1e-3,
  angleFloor: 1,
  exactPeriods: true,
};

/** Overcurrent trip of `simulationFromProject`, in units of Imax. */
export const DEFAULT_TRIP_FACTOR = 3;

export interface ScenarioMarks {
  /** speed reference steps, rad/s (for the step metrics) */
  speedSteps: Array<{ t: number; v: number }>;
  /** times of load events (steps and ramp starts), s */
  loadEvents: number[];
}

/** A run's setup; M is the plant's machine (a project's setup carries the constant dq terms). */
export interface SimulationSetup<M extends MachineInput = DqMachine> {
  plant: PlantParams<M>;
  controller: ControllerConfig;
  duration_s: number;
  initialSpeed_rad_s: number;
  initialTheta_rad: number;
  solver: SolverOptions;
  /** peak current limit, A (divergence at 20x): the effective limit, the weaker of motor and inverter */
  Imax: number;
  /** the field of the rating that sets Imax, e.g. "inverter.Imax" or "motor.peakCurrent" (default "inverter.Imax") */
  currentLimitField?: string;
  /**
   * overcurrent trip, A: |i_dq| above it stops the run as a divergence, as a drive's hardware trip
   * would (a saturated unstable loop settles into a bounded limit cycle that 20·Imax never sees)
   */
  tripCurrent_A: number;
  /** |omega_m| above which the run is stopped as diverged, rad/s */
  divergenceSpeed_rad_s: number;
  /** |omega_m| above which an overspeed event is recorded, rad/s */
  overspeed_rad_s: number;
  marks: ScenarioMarks;
  /** the tuning the gains came from (null when a test built the setup by hand) */
  tuning: TuningReport | null;
  /** what the scenario asks that the motor or the drive cannot give, found before the run (see `scenarioFindings`) */
  findings?: Finding[];
  /** the inverter's modulation; absent or model 'average' = the averaged inverter (see switching-stepper.ts) */
  pwm?: PwmSpec;
  /** where the controller's angle and speed come from; absent or source 'ideal' = the true values */
  angle?: AngleSpec;
  /** the motor's rated speed, rad/s (mechanical): set with a sensorless angle source, for its validity finding */
  ratedSpeed_rad_s?: number;
}

export interface RunOptions {
  signal?: { readonly aborted: boolean };
  onProgress?: (fraction: number) => void;
  /** largest trace length per channel (default 5000, at most MAX_TRACE_POINTS = 200 000) */
  maxPoints?: number;
  /** wall-time budget, s (default 60) */
  wallBudget_s?: number;
  /** control-period budget (default 2 000 000) */
  maxSteps?: number;
  /** wall clock in seconds (default: globalThis.performance.now or Date.now) */
  clock?: () => number;
  /** periods between two closings of an event interval before it is split (default 20) */
  eventMergeGap?: number;
}

export const DEFAULT_RUN_OPTIONS = { maxPoints: DEFAULT_MAX_POINTS, wallBudget_s: 60, maxSteps: 2_000_000, eventMergeGap: 20 };

export type EventKind = 'current-limit' | 'voltage-saturation' | 'overspeed' | 'divergence' | 'aborted' | 'budget';

export interface SimulationEvent {
  kind: EventKind;
  t_s: number;
  tEnd_s?: number;
  message: string;
}


/** Largest number of control periods a project scenario may ask for (duration_s x fCtrl_Hz): the default step budget. */
export const MAX_CONTROL_PERIODS = DEFAULT_RUN_OPTIONS.maxSteps;

/** A setup with any machine input (what the run itself accepts). */
export type AnySetup = SimulationSetup<MachineInput>;
