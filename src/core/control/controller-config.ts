/** What the cascade controller is given: modes, gains, limits, references (see controller.ts). */
import type { MachineInput } from '../machine/machine-model';
import type { ReferenceTable } from './reference-table';
import type { StepSchedule } from './step-schedule';
import type { VoltageLimitSpec } from './voltage-limit';

export type ControlMode = 'speed' | 'torque' | 'current-step';
export type AntiWindup = 'clamping' | 'back-calculation';

export interface PiGains {
  /** proportional gain (V/A for current loops, N·m/(rad/s) for the speed loop) */
  Kp: number;
  /** integral gain (V/(A·s), N·m/rad) */
  Ki: number;
}

export interface ControllerConfig {
  mode: ControlMode;
  /** control period, s */
  Ts: number;
  /** whole periods between sampling and applying the voltage (0 = ideal) */
  delaySamples: number;
  /** the machine model (or the constant dq terms it wraps): the feed-forward terms ask it */
  machine: MachineInput;
  currentD: PiGains;
  currentQ: PiGains;
  speed: PiGains;
  /** the speed loop runs every this many current periods (>= 1) */
  speedLoopDivider: number;
  antiWindup: AntiWindup;
  /** cross-coupling feed-forward -omega_e L_q i_q (d) and omega_e L_d i_d (q) */
  decoupling: boolean;
  /** back-EMF feed-forward omega_e psi_m on the q axis */
  backEmfFeedForward: boolean;
  /** advance the inverse-Park angle by (delaySamples + 0.5)·omega_e·Ts */
  delayAngleCompensation: boolean;
  /** slew limit of the speed reference, rad/s² (Infinity = none) */
  speedRamp_rad_s2: number;
  /** time constant of a first-order speed-reference prefilter, s (0 = none) */
  speedRefPrefilter_s: number;
  /** peak current limit of the references, A */
  Imax: number;
  voltage: VoltageLimitSpec;
  /** torque -> currents (speed and torque modes) */
  table: ReferenceTable | null;
  /** speed reference, rad/s (speed mode) */
  speedRef: StepSchedule;
  /** torque reference, N·m (torque mode) */
  torqueRef: StepSchedule;
  /** current references, A (current-step mode) */
  idRef: StepSchedule;
  iqRef: StepSchedule;
  /** torque the speed integrator starts at (bumpless start against the initial load), N·m */
  initialTorque: number;
  /**
   * schedule the current PIs' proportional gains from the machine model's incremental inductances at
   * the current reference, Kp(i) = Kp·L_inc(i)/L_inc(0) per axis, Ki kept (see gain-schedule.ts);
   * only for a model that is not linear (a linear one has the same inductance everywhere). Default off.
   */
  gainScheduling?: boolean;
}

export const DEFAULT_CONTROLLER_OPTIONS = {
  delaySamples: 1,
  speedLoopDivider: 1,
  antiWindup: 'clamping' as AntiWindup,
  decoupling: true,
  backEmfFeedForward: true,
  delayAngleCompensation: true,
  speedRamp_rad_s2: Infinity,
  speedRefPrefilter_s: 0,
};
