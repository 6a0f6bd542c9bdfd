/**
 * The inverter's pulse-width modulation as the simulator takes it (resolved from the project's
 * `control.pwm`): the averaged inverter (the voltage command applied as it is) or the switching
 * bridge (each carrier period split at the switching instants of the three legs).
 */

/**
 * How each leg's duty follows from the three phase references:
 * - 'sinusoidal': sine-triangle PWM, d = 1/2 + v/Vdc (linear up to a peak phase voltage of Vdc/2);
 * - 'svpwm': min-max zero-sequence injection, v0 = -(max + min)/2, the carrier-based equivalent of
 *   centred space-vector PWM (linear up to Vdc/sqrt 3);
 * - 'dpwm1': discontinuous PWM clamping, for each 60° around its peak, the leg of the largest
 *   |reference| to the rail of its sign (v0 = ±Vdc/2 - v_clamped): one leg does not switch in each
 *   60°, a third fewer switchings per fundamental (linear up to Vdc/sqrt 3).
 */
export type PwmModulation = 'sinusoidal' | 'svpwm' | 'dpwm1';

export interface PwmSpec {
  /** 'average': the controller's voltage applied as the period mean; 'switching': the bridge's switching states */
  model: 'average' | 'switching';
  /** carrier (switching) frequency, Hz: one carrier period = 1 or 2 control periods */
  fsw_Hz: number;
  /** control updates per carrier period: 1 (at the carrier's peak) or 2 (peak and valley) */
  updatesPerPeriod: 1 | 2;
  /** blanking time between one device turning off and the other of its leg turning on, s */
  deadTime_s: number;
  modulation: PwmModulation;
  /** DC-bus voltage the legs switch, V */
  Vdc: number;
  /** on-state drop of a conducting switch or diode, V (against the current's direction) */
  deviceDrop_V: number;
  /**
   * phase current below which the current counts as zero for the dead time and the device drop, A
   * (see switching-period.ts for the rule)
   */
  zeroCurrent_A: number;
  /**
   * dead-time and device-drop compensation (absent: off): each half period every leg's duty is
   * moved by the expected volt-second error for the sign of its phase current at the period's start,
   * so that the mean leg voltage is the command (see compensatedDuty in pwm-modulator.ts)
   */
  compensation?: { band_A: number };
  /**
   * the switching model's zoom window, s: full-resolution traces from `from_s` to `to_s` (absent:
   * the last two fundamental periods of the run)
   */
  window?: { from_s: number; to_s: number };
}
