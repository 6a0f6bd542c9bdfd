import type { Command } from '../command';
import { numberFlag } from '../args';
import { InputError } from '../../core/base/errors';
import { fmt } from '../table';
import { peakToRms } from '../../core/base/units';
import { describeLimit } from '../../core/drive/current-limits';
import { lossConditionsFromProject } from '../../core/project/loss-conditions-from-project';
import { temperatureModelFromProject } from '../../core/project/temperature-model-from-project';
import { evaluateDutyCycle, type DutyCycleResult } from '../../core/simulation/duty-cycle';
import type { Peak } from '../../core/simulation/cycle-summary';
import { dutyCycleTraceCsv } from '../../core/reports/duty-cycle-trace-csv';

const kJ = (j: number): string => `${fmt(j / 1000)} kJ`;
const at = (p: Peak): string => `${fmt(p.value)} °C at ${fmt(p.t_s)} s`;
/** intervals outside the envelope listed in the text at most */
const LISTED = 10;

export const dutyCycleCommand: Command = {
  name: 'duty-cycle',
  summary: "the project's duty cycle on its thermal network: RMS and peak current, energies, temperature peaks, instants outside the envelope, verdict",
  usage: 'duty-cycle <project.json> [--step S] [--every-instant] [--csv FILE] [--json]',
  flags: { step: 'number', 'every-instant': 'switch', csv: 'output' },
  run(p, args) {
    if (p.thermal === undefined) throw new InputError('thermal', 'is needed for duty-cycle: the project has no thermal section');
    if (p.dutyCycle === undefined) throw new InputError('dutyCycle', 'is needed for duty-cycle: the project has no dutyCycle section (import-duty-cycle writes one from a CSV)');
    const step = numberFlag(args, 'step', { min: 1e-6, max: 1e6, unit: 's' });
    const every = args.flags.has('every-instant');
    const r = evaluateDutyCycle(p.dutyCycle, p.thermal, temperatureModelFromProject(p), lossConditionsFromProject(p), p.peak, {
      ...(step !== undefined ? { step_s: step } : {}), solve: every ? 'every-instant' : 'adaptive',
    }) as DutyCycleResult; // no signal: never cancelled
    const e = r.energies, th = p.thermal;
    const json = {
      label: r.label, period_s: r.period_s, instants: r.t_s.length, step_s: step ?? null, solve: every ? 'every-instant' : 'adaptive',
      repeats: r.repeats, converged: r.converged, lastChange_K: r.lastChange_K, startTemps_C: { winding: r.start_C[0], stator: r.start_C[1] },
      rmsTorque_Nm: r.rmsTorque_Nm, rmsCurrent_A: r.rmsCurrent_A, peakCurrent_A: { value: r.peakCurrent.value, t_s: r.peakCurrent.t_s },
      energies_J: { ...e }, peaks_C: r.peaks, outside: r.outside, exceeded: r.exceeded, verdict: r.verdict,
      lossPointsSolved: r.solves.last, currentLimits: p.currentLimits,
    };
    const limit = (max: number | undefined): string => (max === undefined ? 'not rated' : `limit ${fmt(max)} °C`);
    const lines = [
      `${p.name}: duty cycle "${r.label}", ${fmt(r.period_s)} s, ${r.t_s.length} instants (${step === undefined ? "the samples' own" : `every ${fmt(step)} s`}), coolant ${fmt(th.coolantTemp_C)} °C`,
      `  ${r.converged ? 'periodic state' : 'NOT converged'} after ${r.repeats} repeats (last change ${fmt(r.lastChange_K, 3)} K; reported: the last repeat)`,
      `  verdict: ${r.verdict.text}`,
      `  RMS torque ${fmt(r.rmsTorque_Nm)} N·m; RMS current ${fmt(r.rmsCurrent_A)} A pk = ${fmt(peakToRms(r.rmsCurrent_A))} A rms (${describeLimit('continuous', p.currentLimits.continuous)})`,
      `  peak current ${fmt(r.peakCurrent.value)} A pk at ${fmt(r.peakCurrent.t_s)} s (${describeLimit('peak', p.currentLimits.peak)})`,
      `  energy per cycle: DC link ${kJ(e.dcLink_J)}, shaft ${kJ(e.shaft_J)}; losses copper ${kJ(e.copper_J)}, iron ${kJ(e.iron_J)}, mechanical ${kJ(e.mechanical_J)}, inverter ${kJ(e.inverter_J)}; heat to the coolant ${kJ(e.heatRemoved_J)}`,
      `  peaks: winding ${at(r.peaks.winding)} (${limit(th.windingMax_C)}), stator ${at(r.peaks.stator)}, magnet ${at(r.peaks.magnet)} (${limit(th.magnetMax_C)}), junction ${at(r.peaks.junction)} (${limit(th.junctionToCoolant_K_per_W === undefined ? undefined : th.junctionMax_C)})`,
      r.outside.length === 0 ? '  outside the envelope: never (hot, at the temperatures reached)' : `  outside the envelope (hot, at the temperatures reached), ${r.outside.length} interval${r.outside.length > 1 ? 's' : ''}:`,
      ...r.outside.slice(0, LISTED).map((o) => `    ${fmt(o.from_s)}..${fmt(o.to_s)} s: ${o.limitedBy} limit, up to ${fmt(o.peakCurrent_A)} A pk needed`),
      ...(r.outside.length > LISTED ? [`    ... and ${r.outside.length - LISTED} more (all in --json)`] : []),
    ];
    const comments = [`# torquewise duty cycle; project: ${p.name || 'unnamed'}; cycle: ${r.label}; the last of ${r.repeats} repeats; current in A peak`];
    return { json, lines, ...(args.flags.has('csv') ? { files: [{ flag: 'csv', contents: dutyCycleTraceCsv(r, comments) }] } : {}) };
  },
};
