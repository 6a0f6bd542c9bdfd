/**
 * Shared value types of the engine. SI units throughout (see ../shared/conventions.md):
 * rad/s, A peak, V peak phase, Wb peak, H, ohm per phase (star equivalent), N·m, kg·m², s.
 */

/** dq model of a PMSM at one stated temperature. */
export interface DqMachine {
  /** pole pairs p (integer >= 1) */
  polePairs: number;
  /** stator resistance per phase, ohm */
  Rs: number;
  /** d-axis inductance, H */
  Ld: number;
  /** q-axis inductance, H */
  Lq: number;
  /** peak permanent-magnet flux linkage per phase, Wb */
  psiM: number;
}

/** Mechanical terms of the motor (the load's inertia is added by the scenario). */
export interface Mechanics {
  /** rotor inertia, kg·m² */
  inertia: number;
  /** viscous friction B, N·m·s/rad */
  viscousFriction: number;
  /** Coulomb friction, N·m */
  coulombFriction: number;
}

export type Modulation = 'sinusoidal' | 'svpwm' | 'six-step';

export interface InverterSpec {
  /** DC-bus voltage, V */
  Vdc: number;
  /** peak phase current limit, A */
  Imax: number;
  /** continuous phase current limit, A peak */
  Icont: number;
  modulation: Modulation;
  /** fraction (0..1] of the modulation's voltage limit that the steady state may use */
  voltageUtilization: number;
  /** on-state drop of the conducting devices, V (subtracted from the bus, two devices in series) */
  deviceDrop: number;
}

/** The two limits of the steady-state solvers. */
export interface DriveLimits {
  /** peak phase voltage available = largest length of v_dq, V */
  Vmax: number;
  /** peak phase current = largest length of i_dq, A */
  Imax: number;
}

/** Operating temperatures. */
export interface Conditions {
  /** winding temperature of the hot corner, °C */
  windingTemp_C: number;
  /** magnet temperature of the hot corner, °C */
  magnetTemp_C: number;
  /** temperature of the cold corner (winding and magnet), °C */
  coldTemp_C: number;
  /** relative change of remanence (and psiM) per kelvin, 1/K, e.g. -0.0012 for sintered NdFeB */
  magnetTempCoeff: number;
}

export type Region = 'mtpa' | 'field-weakening' | 'mtpv';

/** Which limit decides an operating point or a requirement. */
export type LimitedBy = 'none' | 'current' | 'voltage' | 'current-and-voltage' | 'beyond-mtpv';

export interface OperatingPoint {
  feasible: boolean;
  /** mechanical speed, rad/s */
  speed: number;
  /** electromagnetic torque delivered (or, when infeasible, asked for), N·m */
  torque: number;
  id: number;
  iq: number;
  /** |i_dq|, A peak */
  current: number;
  vd: number;
  vq: number;
  /** |v_dq|, V peak phase */
  voltage: number;
  region: Region;
  limitedBy: LimitedBy;
}

export type Severity = 'info' | 'warning' | 'danger';

export interface Finding {
  /** stable machine-readable code, e.g. "kt-ke-mismatch" */
  code: string;
  severity: Severity;
  /** project path the finding is about, e.g. "nameplate.Kt" */
  field?: string;
  message: string;
}

export interface Requirement {
  label: string;
  /** mechanical speed, rpm (as in the file) */
  speed_rpm: number;
  /** shaft torque wanted, N·m; negative = generating/braking */
  torque_Nm: number;
  /** which current limit the point is checked against: the peak (default) or the continuous limit */
  duty?: Duty;
}

/** A requirement's duty: short-time (peak current limit) or held (continuous current limit). */
export type Duty = 'peak' | 'continuous';

/** Who sets an effective current limit: the weaker of the motor's rating and the inverter's. */
export type LimitSource = 'motor' | 'inverter';

/** One effective current limit, A peak, and which rating binds it. */
export interface EffectiveCurrent {
  /** min(inverter, motor), A peak */
  A: number;
  binds: LimitSource;
  /** the inverter's figure, A peak */
  inverter_A: number;
  /** the motor's figure, A peak (absent when the file gives none) */
  motor_A?: number;
}

/** The peak and continuous current limits the solvers use. */
export interface CurrentLimits {
  peak: EffectiveCurrent;
  continuous: EffectiveCurrent;
}
