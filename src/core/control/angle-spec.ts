/**
 * Where the controller's rotor angle and speed come from (the project's `control.angle`, resolved):
 * the true values (`ideal`), an incremental encoder, a resolver read through a tracking loop, or a
 * sensorless observer with a phase-locked loop. Angles electrical unless named mechanical.
 */
export type AngleSpec = IdealAngle | EncoderAngle | ResolverAngle | SensorlessAngle;

export interface IdealAngle {
  source: 'ideal';
}

export interface EncoderAngle {
  source: 'encoder';
  /** lines per mechanical revolution; quadrature decoding counts 4 edges per line */
  linesPerRev: number;
  /** speed by the difference of counts over this many control periods */
  speedWindowPeriods: number;
  /** first-order speed filter corner, Hz (0: none) */
  speedFilter_Hz: number;
  /** mounting offset error, mechanical degrees */
  offset_deg: number;
  /** speed by edge timing with this timer frequency, Hz (absent: the difference method) */
  timerFrequency_Hz?: number;
}

export interface ResolverAngle {
  source: 'resolver';
  /** tracking loop (type II) bandwidth, Hz, and damping ratio */
  bandwidth_Hz: number;
  damping: number;
  /** sine-channel amplitude over cosine-channel amplitude minus 1 (0: balanced) */
  amplitudeImbalance?: number;
  /** quadrature error of the sine channel, electrical degrees of the resolver */
  quadratureError_deg?: number;
  /** resolver pole pairs (default 1) */
  polePairs?: number;
}

export interface SensorlessAngle {
  source: 'sensorless';
  /** the PLL's bandwidth, Hz */
  bandwidth_Hz: number;
  /** below this speed the drive starts open loop (current vector with a speed ramp), rpm */
  handoverSpeed_rpm: number;
  /** the observer's parameters against the plant's, percent (positive: the observer's value is larger) */
  fluxError_pct: number;
  resistanceError_pct: number;
  inductanceError_pct: number;
}
