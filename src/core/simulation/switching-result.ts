/**
 * What a run with the switching model (control.pwm.model "switching") reports beside the averaged
 * results: the current ripple, the phase current's harmonic content, the dead-time voltage error, the
 * DC-link current, and full-resolution traces over a chosen window (the run keeps its decimated
 * traces as well).
 */
export interface SwitchingResult {
  /** carrier frequency, Hz; dead time, s; modulation */
  fsw_Hz: number;
  deadTime_s: number;
  modulation: string;
  /** phase-a current ripple, peak to peak per carrier period, A: its largest and its mean over the last whole fundamental periods */
  ripplePeakToPeak_A: { max: number; mean: number };
  /** the ripple's envelope over one fundamental period (electrical angle, rad; peak-to-peak, A) */
  rippleEnvelope: { angle_rad: Float64Array; peakToPeak_A: Float64Array };
  /**
   * THD of the phase-a current up to `thdMaxHarmonic`, fraction, and the harmonic amplitudes (index =
   * harmonic order, A peak; index 0 the magnitude of the mean), from the current at the carrier's valleys
   */
  thd: number;
  thdMaxHarmonic: number;
  harmonics_A: Float64Array;
  /** the fundamental voltage lost to dead time (commanded minus applied, V peak phase), and its sign convention said in the text */
  deadTimeVoltageError_V: number;
  /** DC-link current drawn by the bridge: mean and rms, and the rms of its ripple (for the bus capacitor), A */
  dcLink: { mean_A: number; rms_A: number; rippleRms_A: number };
  /**
   * full-resolution traces over the zoom window (start and end, s), at every segment boundary: the
   * phase currents there, and phase a's voltage (to the machine's neutral) and the DC-link current
   * over the segment ending there (held over it: a step plot's "vh" shape); `truncated` when the
   * window holds fewer samples than it spans (its sample bound)
   */
  window: { from_s: number; to_s: number; truncated: boolean; t_s: Float64Array; ia_A: Float64Array; ib_A: Float64Array; ic_A: Float64Array; va_V: Float64Array; idc_A: Float64Array };
  /** the time span the statistics above cover (`cycles` whole fundamental periods at the run's end; 0: none, the harmonic figures NaN), s */
  analysed: { from_s: number; to_s: number; cycles: number };
  /** the fundamental (electrical) frequency at the run's end, Hz */
  fundamental_Hz: number;
}
