import type { Command } from '../command';
import { table, fmt, orDash } from '../table';
import { gainScheduleFromProject, tuneFromProject, tuningInputFromProject } from '../../core/project/tuning-from-project';
import type { LoopReport, TuningReport } from '../../core/control/tuning';
import type { EstimatorLoopReport } from '../../core/control/estimator-loop';
import type { GainSchedule } from '../../core/control/gain-schedule';
import { findingLine } from '../../core/reports/phrases';
import { GAIN_SCHEDULE_COLUMNS, gainScheduleCaption, gainScheduleCells } from '../../core/reports/gain-schedule-table';

function loopJson(l: LoopReport, withBode: boolean) {
  const { bode, ...rest } = l;
  return withBode ? { ...rest, bode } : rest;
}

/** The tune command's JSON document: gains, bandwidths, margins, warnings (Bode data with --bode). */
export function tuningJson(r: TuningReport, withBode = false, schedule: GainSchedule | null = null) {
  return {
    current: loopJson(r.current, withBode),
    ...(r.currentQ ? { currentQ: loopJson(r.currentQ, withBode) } : {}),
    speed: loopJson(r.speed, withBode),
    speedLagEquivalent_s: r.speedLagEquivalent_s,
    currentDelay_s: r.currentDelay_s,
    warnings: r.warnings,
    ...(r.estimator ? { estimator: withBode ? r.estimator : { ...r.estimator, speedLoop: { crossover_Hz: r.estimator.speedLoop.crossover_Hz, phaseMargin_deg: r.estimator.speedLoop.phaseMargin_deg } } } : {}),
    ...(schedule ? { gainSchedule: schedule } : {}),
  };
}

/** The estimator's loop in words: its gains and margins (closed forms), the speed loop through it. */
function estimatorLine(e: EstimatorLoopReport): string {
  const loop = e.kp !== null && e.ki !== null
    ? `type II loop kp ${fmt(e.kp)} 1/s, ki ${fmt(e.ki)} 1/s², wn ${fmt(e.naturalFrequency_rad_s!)} rad/s, damping ${fmt(e.damping!)}, angle bandwidth ${orDash(e.angleBandwidth_Hz)} Hz, crossover ${orDash(e.crossover_Hz)} Hz, phase margin ${orDash(e.phaseMargin_deg)} deg; `
    : '';
  return `angle estimator (${e.source}): ${loop}speed estimate bandwidth ${fmt(e.speedBandwidth_Hz)} Hz; speed loop through it: crossover ${orDash(e.speedLoop.crossover_Hz)} Hz, phase margin ${orDash(e.speedLoop.phaseMargin_deg)} deg`;
}

export const tuneCommand: Command = {
  name: 'tune',
  summary: 'current and speed PI gains with crossover, phase and gain margins',
  usage: 'tune <project.json> [--bode] [--json]',
  flags: { bode: 'switch' },
  run(p, args) {
    const input = tuningInputFromProject(p);
    const r = tuneFromProject(p);
    // a flux map: the gains change with current (constant-parameter projects print what they always did)
    const schedule = p.models.hot.linear === null ? gainScheduleFromProject(p) : null;
    const loops: Array<[string, LoopReport, string, string]> = [
      [r.currentQ ? 'current d' : 'current d, q', r.current, 'V/A', 'V/(A·s)'],
      ...(r.currentQ ? [['current q', r.currentQ, 'V/A', 'V/(A·s)'] as [string, LoopReport, string, string]] : []),
      ['speed', r.speed, 'N·m·s/rad', 'N·m/rad'],
    ];
    const rule = 'method' in input.speed ? (input.speed.method === 'symmetric-optimum' ? `symmetric optimum, a = ${input.speed.a}` : `bandwidth ${fmt(input.speed.bandwidth_Hz)} Hz`) : 'gains from the file';
    const lines = [
      `${p.name}: fCtrl ${fmt(input.fCtrl_Hz)} Hz, delay ${input.delaySamples} period(s) + half a period of PWM hold = ${fmt(r.currentDelay_s * 1e6)} µs, ` +
        `speed loop every ${input.speedLoopDivider} period(s), inertia ${fmt(input.inertia)} kg·m² (motor + load), hot corner`,
      `current loop: ${'bandwidth_Hz' in input.current ? `internal model control at ${fmt(input.current.bandwidth_Hz)} Hz` : 'gains from the file'}; speed loop: ${rule} (equivalent lag ${fmt(r.speedLagEquivalent_s * 1e6)} µs)`,
      '',
      ...table(
        ['loop', 'Kp', 'Kp unit', 'Ki', 'Ki unit', 'design Hz', 'crossover Hz', 'bandwidth -3 dB Hz', 'phase margin deg', 'gain margin dB', 'peaking dB', 'PM continuous approx. deg'],
        loops.map(([name, l, ku, kiu]) => [name, fmt(l.Kp), ku, fmt(l.Ki), kiu, fmt(l.design_Hz), orDash(l.crossover_Hz), l.phaseMargin_deg !== null && l.phaseMargin_deg <= 0 ? '- (unstable)' : orDash(l.bandwidth_Hz), orDash(l.phaseMargin_deg), orDash(l.gainMargin_dB), orDash(l.peaking_dB), orDash(l.continuous.phaseMargin_deg)]),
      ),
      ...(r.estimator ? ['', estimatorLine(r.estimator)] : []),
      '',
      ...(r.warnings.length === 0 ? ['warnings: none'] : ['warnings:', ...r.warnings.map((w) => `  ${findingLine(w)}`)]),
      'margins of the sampled loop as the controller runs it (discrete PI, zero-order hold, winding discretised, delay of whole periods), up to half the loop\'s sample rate;',
      'the last column is the continuous approximation (delay e^{-s Td}) for comparison. Cautions: phase margin under 45 deg (danger under 30 deg), gain margin under 6 dB, closed-loop peaking above 3 dB.',
      ...(schedule ? ['', `current-loop gains against current: ${gainScheduleCaption(schedule)}`, '', ...table(GAIN_SCHEDULE_COLUMNS.map((c) => c.header), gainScheduleCells(schedule))] : []),
    ];
    return { json: tuningJson(r, args.flags.has('bode'), schedule), lines };
  },
};
