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
