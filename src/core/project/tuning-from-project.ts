/**
 * The tuning input of a project: the hot machine, motor plus load inertia, and the file's control
 * section with the schema's defaults (a file without one gets `defaultControl()`).
 */
import { tuneLoops, DEFAULT_CURRENT_BANDWIDTH_FRACTION, DEFAULT_SPEED_BANDWIDTH_FRACTION } from '../control/tuning';
import type { CurrentTuning, SpeedTuning, TuningInput, TuningReport } from '../control/tuning';
import type { ResolvedProject } from './project';
import { estimatorLoop } from '../control/estimator-loop';
import { angleFromProject } from './angle-from-project';
import { gainSchedule, type GainSchedule } from '../control/gain-schedule';
import { defaultControl, type ControlSection } from './schema';

/** The tuning input of a project for a given (defaulted) control section and load inertia. */
export function tuningInputFor(p: ResolvedProject, c: ControlSection, loadInertia: number): TuningInput {
  const fCtrl_Hz = c.fCtrl_Hz;
  const current: CurrentTuning =
    c.currentKp !== undefined && c.currentKi !== undefined
      ? { Kp: c.currentKp, Ki: c.currentKi }
      : { bandwidth_Hz: c.currentBandwidth_Hz ?? fCtrl_Hz * DEFAULT_CURRENT_BANDWIDTH_FRACTION };
  const fc = 'bandwidth_Hz' in current ? current.bandwidth_Hz : current.Kp / p.hot.Lq / (2 * Math.PI);
  let speed: SpeedTuning;
  if (c.speedKp !== undefined && c.speedKi !== undefined) speed = { Kp: c.speedKp, Ki: c.speedKi };
  else if (c.speedTuning?.method === 'symmetric-optimum') speed = { method: 'symmetric-optimum', a: c.speedTuning.a };
  else speed = { method: 'bandwidth', bandwidth_Hz: c.speedBandwidth_Hz ?? fc * DEFAULT_SPEED_BANDWIDTH_FRACTION };
  return {
    machine: p.models.hot,
    inertia: p.mechanics.inertia + loadInertia,
    viscousFriction: p.mechanics.viscousFriction,
    fCtrl_Hz,
    delaySamples: c.delaySamples,
    speedLoopDivider: c.speedLoopDivider,
    current,
    speed,
  };
}

/** The tuning input of a project: hot machine, motor plus load inertia, the file's control section. */
export function tuningInputFromProject(p: ResolvedProject): TuningInput {
  return tuningInputFor(p, p.file.control ?? defaultControl(), p.file.scenario?.loadInertia ?? 0);
}

/** The loops' tuning; with an angle source other than ideal also the estimator's loop and its finding (estimator-loop.ts). */
export function tuneFromProject(p: ResolvedProject): TuningReport {
  const input = tuningInputFromProject(p);
  const r = tuneLoops(input);
  const est = estimatorLoop(angleFromProject(p.file.control, p.models.hot.polePairs), 1 / input.fCtrl_Hz, r.speed);
  if (est === null) return r;
  return { ...r, estimator: est.report, warnings: est.finding ? [...r.warnings, est.finding] : r.warnings };
}

/** The current-loop gain schedule of a project: its tuning input along MTPA up to the peak current (control/gain-schedule.ts). */
export function gainScheduleFromProject(p: ResolvedProject, points?: number): GainSchedule {
  return gainSchedule(tuningInputFromProject(p), p.peak.Imax, points);
}
