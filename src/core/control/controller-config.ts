/** What the cascade controller is given: modes, gains, limits, references (see controller.ts). */
import type { MachineInput, MachineModel } from '../machine/machine-model';
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

/** Indices of the controller's parameter array (controllerParameters). */
export const P_TS = 0;
export const P_POLES = 1;
export const P_LD = 2;
export const P_LQ = 3;
export const P_PSIM = 4;
export const P_IMAX = 5;
/** current PIs: proportional gains (scheduled with gainScheduling), Ts·Ki, back-calculation gains */
export const P_KPD = 6;
export const P_KPQ = 7;
export const P_KITSD = 8;
export const P_KITSQ = 9;
export const P_KBD = 10;
export const P_KBQ = 11;
/** inverse-Park advance per rad/s of electrical speed, s */
export const P_ADV = 12;
/** the voltage limit's radius (circle) */
export const P_RADIUS = 13;
/** speed loop: its period Ts·divider, ramp step per speed period, prefilter factor (< 0: none), Kp, Tsw·Ki, back-calculation gain */
export const P_TSW = 14;
export const P_RAMP = 15;
export const P_FILT = 16;
export const P_KPW = 17;
export const P_KIW = 18;
export const P_KBW = 19;
export const P_DIVIDER = 20;
/** reference table: highest speed and node counts (0 without a table) */
export const P_WMAX = 21;
export const P_NS = 22;
export const P_NU = 23;
/** gain scheduling: the proportional gains and incremental inductances at zero current */
export const P_KPD0 = 24;
export const P_KPQ0 = 25;
export const P_LDD0 = 26;
export const P_LQQ0 = 27;
export const P_COUNT = 28;


/**
 * The controller's parameters: its configuration's numbers in one typed array (the P_* indices),
 * read by the sampled step (controller.ts) without property lookups. `psi0d` is the d flux at zero
 * current, `Ldd0` and `Lqq0` the incremental inductances there (for gain scheduling).
 */
export function controllerParameters(cfg: ControllerConfig, model: MachineModel, psi0d: number, Ldd0: number, Lqq0: number, P: Float64Array): Float64Array {
  const lin = model.linear;
  P[P_TS] = cfg.Ts;
  P[P_POLES] = model.polePairs;
  P[P_LD] = lin ? lin.Ld : NaN;
  P[P_LQ] = lin ? lin.Lq : NaN;
  P[P_PSIM] = lin ? lin.psiM : psi0d;
  P[P_IMAX] = cfg.Imax;
  P[P_KPD] = cfg.currentD.Kp;
  P[P_KPQ] = cfg.currentQ.Kp;
  P[P_KITSD] = cfg.Ts * cfg.currentD.Ki;
  P[P_KITSQ] = cfg.Ts * cfg.currentQ.Ki;
  P[P_KBD] = cfg.currentD.Kp > 0 ? Math.min(1, (cfg.Ts * cfg.currentD.Ki) / cfg.currentD.Kp) : 0;
  P[P_KBQ] = cfg.currentQ.Kp > 0 ? Math.min(1, (cfg.Ts * cfg.currentQ.Ki) / cfg.currentQ.Kp) : 0;
  P[P_ADV] = cfg.delayAngleCompensation ? (cfg.delaySamples + 0.5) * cfg.Ts : 0;
  P[P_RADIUS] = cfg.voltage.radius;
  const Tsw = cfg.Ts * cfg.speedLoopDivider;
  P[P_TSW] = Tsw;
  P[P_RAMP] = cfg.speedRamp_rad_s2 * Tsw;
  P[P_FILT] = cfg.speedRefPrefilter_s > 0 ? 1 - Math.exp(-Tsw / cfg.speedRefPrefilter_s) : -1;
  P[P_KPW] = cfg.speed.Kp;
  P[P_KIW] = Tsw * cfg.speed.Ki;
  P[P_KBW] = cfg.speed.Kp > 0 ? Math.min(1, (Tsw * cfg.speed.Ki) / cfg.speed.Kp) : 0;
  P[P_DIVIDER] = cfg.speedLoopDivider;
  const tab = cfg.table;
  P[P_WMAX] = tab ? tab.speedMax : 0;
  P[P_NS] = tab ? tab.nS : 0;
  P[P_NU] = tab ? tab.nU : 0;
  P[P_KPD0] = cfg.currentD.Kp;
  P[P_KPQ0] = cfg.currentQ.Kp;
  P[P_LDD0] = Ldd0;
  P[P_LQQ0] = Lqq0;
  return P;
}
