/** Findings of a simulation run worth showing beside its metrics (stops, unsettled load steps, an unreached speed, a current above the limit, voltage saturation, where a sensorless observer is not valid). */
import type { Finding } from '../base/finding';
import { RAD_S_TO_RPM } from '../base/units';
import { sensorlessValidity } from '../control/sensorless-validity';
import { sensorlessCorrection_Hz } from '../control/angle-estimator-for';
import type { AnySetup } from './simulation-setup';
import type { SimulationResult } from './simulation-result';

/** A peak current above the limit by more than this fraction is a finding (below it: round-off of the loop). */
export const CURRENT_OVER_LIMIT_TOLERANCE = 1e-3;

/**
 * The phase current above the peak limit. The controller never asks for more than the limit (its
 * current reference is clamped there), but the current loop's transient can overshoot the
 * reference: a reference step to the limit, a rise held back by the voltage limit, the computation
 * delay (the loop corrects one or more periods late). The finding says so, with when and how much.
 */
export function currentAboveLimit(r: SimulationResult, setup?: AnySetup): Finding | null {
  const peak = r.metrics.peakCurrent_A;
  if (!setup || peak === null || r.diagnostic) return null;
  const lim = setup.Imax;
  if (!(peak > lim * (1 + CURRENT_OVER_LIMIT_TOLERANCE))) return null;
  const field = setup.currentLimitField ?? 'inverter.Imax';
  const at = r.peakCurrentAt;
  const a = (x: number): string => `${x.toPrecision(4)} A peak (${(x / Math.SQRT2).toPrecision(4)} A rms)`;
  const pct = ((peak / lim - 1) * 100).toPrecision(2);
  const Ts = setup.controller.Ts;
  const d = setup.controller.delaySamples;
  const asked = at ? ` (it asked for ${a(at.reference_A)} then)` : '';
  let why = `The controller clamps its current reference at the limit${asked}; the current overshot that reference in the current loop's step response`;
  why += d > 0
    ? `: the loop acts ${d} period${d > 1 ? 's' : ''} late (computation delay), which costs it phase margin at its bandwidth`
    : ', an overshoot of the loop itself (its gains or the sampled-data loop)';
  if (at && Number.isFinite(at.sinceVoltageLimit_s) && at.sinceVoltageLimit_s <= 10 * Ts) why += ` (the voltage limit had held the current's rise until ${(at.sinceVoltageLimit_s * 1e3).toPrecision(2)} ms before)`;
  why += '.';
  return {
    code: 'current-above-limit',
    severity: 'warning',
    field,
    message: `the phase current reached ${a(peak)}${at ? ` at ${(at.t_s * 1e3).toPrecision(4)} ms` : ''}, ${pct} % above the peak limit ${a(lim)} (${field}). ${why} ` +
      'A drive whose overcurrent trip sits at this limit would trip here: leave margin to the trip level, or lower the current-loop bandwidth or the torque step.',
  };
}

/** Findings of a run worth showing beside the metrics. */
export function simulationFindings(r: SimulationResult, setup?: AnySetup): Finding[] {
  const out: Finding[] = [...(setup?.findings ?? []), ...(setup?.tuning?.warnings ?? [])];
  // a sensorless observer: the speeds where it is not valid, against the start-up's hand-over
  const a = setup?.angle;
  if (setup && a && a.source === 'sensorless' && setup.ratedSpeed_rad_s) out.push(sensorlessValidity(a, setup.plant.machine, setup.ratedSpeed_rad_s * RAD_S_TO_RPM, { correction_Hz: sensorlessCorrection_Hz(a) }).finding);
  if (r.diagnostic) out.push({ code: 'simulation-stopped', severity: 'danger', message: r.diagnostic });
  // load steps the loop met before it had settled: not measured, said why
  for (const ls of r.loadSteps ?? []) {
    if (!ls.settled && ls.errorAtStep_rpm !== null) {
      out.push({ code: 'load-step-unsettled', severity: 'info', field: 'scenario.loadSteps', message: `the load at ${ls.t_s.toPrecision(4)} s came while the speed was still ${ls.errorAtStep_rpm >= 100 ? ls.errorAtStep_rpm.toFixed(0) : ls.errorAtStep_rpm.toPrecision(3)} rpm from its reference: its dip and recovery are not measured (start the load step after the speed has settled)` });
    }
  }
  // the speed reference not reached at the end of a speed-mode run
  const n = r.traces.t_s.length;
  if (!r.diagnostic && setup?.controller.mode === 'speed' && n > 0) {
    const ref = r.traces.speedRef_rpm[n - 1]!;
    const got = r.traces.speed_rpm[n - 1]!;
    if (Math.abs(ref - got) > Math.max(0.02 * Math.abs(ref), 1)) {
      out.push({ code: 'speed-not-reached', severity: 'warning', field: 'scenario.speedSteps', message: `at the end of the run the speed is ${got.toFixed(0)} rpm against a reference of ${ref.toFixed(0)} rpm: the drive could not reach it within the run (a current or voltage limit, the load, or too short a run)` });
    }
  }
  const over = currentAboveLimit(r, setup);
  if (over) out.push(over);
  if ((r.metrics.voltageSaturation_s ?? 0) > 0) out.push({ code: 'voltage-saturation', severity: 'warning', message: `the voltage limit was active for ${r.metrics.voltageSaturation_s!.toPrecision(3)} s` });
  return out;
}
