/** What a simulation run returns: metrics, decimated traces (channels in TRACE_NAMES order), events, statistics. */
import type { SimulationEvent } from './simulation-setup';
import { ANGLE_TRACE_NAMES, type AngleTraceName } from './angle-sensing';
import type { SwitchingResult } from './switching-result';

export interface SimulationMetrics {
  finalSpeed_rpm: number | null;
  speedOvershoot_pct: number | null;
  riseTime_s: number | null;
  settlingTime_s: number | null;
  loadStepDip_rpm: number | null;
  loadStepRecovery_s: number | null;
  /** largest |i_dq| = peak phase current amplitude, A */
  peakCurrent_A: number | null;
  /** rms phase current over the run, A rms */
  rmsCurrent_A: number | null;
  voltageSaturation_s: number | null;
  energyFromBus_J: number | null;
  steadyStateError_rpm: number | null;
  /** rms and peak of the angle error (estimated minus true electrical angle), rad: only when the angle source is not ideal */
  angleErrorRms_rad?: number | null;
  angleErrorPeak_rad?: number | null;
  /** rms of the estimated minus the true mechanical speed, rpm (a sensorless start-up's open-loop samples left out) */
  speedEstimateRipple_rpm?: number | null;
}

export const TRACE_NAMES = [
  't_s', 'speedRef_rpm', 'speed_rpm', 'torque_Nm', 'loadTorque_Nm', 'idRef_A', 'iqRef_A', 'id_A', 'iq_A',
  'vd_V', 'vq_V', 'vNorm', 'ia_A', 'ib_A', 'ic_A', 'pDc_W',
] as const;
export type TraceName = (typeof TRACE_NAMES)[number];
/** the channels of TRACE_NAMES; with an angle source other than ideal also those of ANGLE_TRACE_NAMES */
export type Traces = Record<TraceName, Float64Array> & Partial<Record<AngleTraceName, Float64Array>>;

/** The channel names of a run's traces: TRACE_NAMES, then the angle channels when the run has them. */
export function traceNamesOf(traces: Traces): (TraceName | AngleTraceName)[] {
  const out: (TraceName | AngleTraceName)[] = [...TRACE_NAMES];
  for (const k of ANGLE_TRACE_NAMES) if (traces[k] !== undefined) out.push(k);
  return out;
}

export interface SimulationStats {
  controlSteps: number;
  rhsEvaluations: number;
  /** median derivative evaluations per control period */
  evaluationsPerPeriod: number;
  /** wall time of the whole call, s: setup_s + run_s */
  wall_s: number;
  /** of it, the run's set-up before the first period (plant, controller, integrator, recorder), s */
  setup_s: number;
  /** of it, the control periods and the result (traces, metrics), s */
  run_s: number;
}

/** One load event's disturbance response (speed mode): dip and recovery, or null when the loop had not settled at it. */
export interface LoadStepResult {
  t_s: number;
  dip_rpm: number | null;
  recovery_s: number | null;
  /** |speed reference - speed| when the load came, rpm */
  errorAtStep_rpm: number | null;
  /** the speed was within 2 % of the reference (at least 1 rpm) when the load came */
  settled: boolean;
}


/** When the largest current came, and what the controller asked for then. */
export interface PeakCurrentDetail {
  /** time of the peak sample, s */
  t_s: number;
  /** |i_dq reference| at that sample, A peak */
  reference_A: number;
  /** time since the voltage vector was last at the modulation limit, s (Infinity: never before) */
  sinceVoltageLimit_s: number;
}

export interface SimulationResult {
  metrics: SimulationMetrics;
  /** the sample of the largest current (absent when the run recorded none) */
  peakCurrentAt?: PeakCurrentDetail;
  /** every load step and ramp start, in time order (the metrics' loadStep* keys are the first) */
  loadSteps: LoadStepResult[];
  traces: Traces;
  events: SimulationEvent[];
  stats: SimulationStats;
  diagnostic?: string;
  /** the switching model's figures (present when the run used it: control.pwm.model "switching") */
  switching?: SwitchingResult;
}
