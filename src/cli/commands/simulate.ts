import type { Command } from '../command';
import { csvDocument, type CsvCell } from '../../core/reports/csv';
import { numberFlag } from '../args';
import { table, fmt, orDash } from '../table';
import { runSimulation, simulationFindings, traceNamesOf } from '../../core/simulation/simulate';
import { simulationFromProject } from '../../core/project/simulation-from-project';
import type { CurrentLimits } from '../../core/drive/current-limit-types';
import type { Finding } from '../../core/base/finding';
import { describeLimit } from '../../core/drive/current-limits';
import type { SimulationResult, SimulationSetup } from '../../core/simulation/simulate';
import type { ResolvedProject } from '../../core/project/project';
import { peakToRms } from '../../core/base/units';
import { MAX_TRACE_POINTS } from '../../core/simulation/decimate';
import { findingLine } from '../../core/reports/phrases';
import { InputError } from '../../core/base/errors';
import type { SwitchingResult } from '../../core/simulation/switching-result';

/** The metrics of the JSON document: the keys issue 3 names first, then the rest of the engine's. */
const JSON_METRICS = [
  'finalSpeed_rpm', 'speedOvershoot_pct', 'riseTime_s', 'settlingTime_s', 'loadStepDip_rpm', 'loadStepRecovery_s',
  'peakCurrent_A', 'rmsCurrent_A', 'voltageSaturation_s', 'energyFromBus_J', 'steadyStateError_rpm',
] as const satisfies ReadonlyArray<keyof SimulationResult['metrics']>;

/** A number for the JSON document: null for NaN or an infinity (what the analysis could not give). */
const num = (x: number): number | null => (Number.isFinite(x) ? x : null);
const arr = (a: Float64Array): Array<number | null> => Array.from(a, num);

/** The switching model's figures for the JSON document (typed arrays as plain arrays, NaN as null). */
export function switchingJson(s: SwitchingResult) {
  const w = s.window;
  return {
    fsw_Hz: s.fsw_Hz, deadTime_s: s.deadTime_s, modulation: s.modulation, fundamental_Hz: num(s.fundamental_Hz),
    ripplePeakToPeak_A: { max: num(s.ripplePeakToPeak_A.max), mean: num(s.ripplePeakToPeak_A.mean) },
    rippleEnvelope: { angle_rad: arr(s.rippleEnvelope.angle_rad), peakToPeak_A: arr(s.rippleEnvelope.peakToPeak_A) },
    thd: num(s.thd), thdMaxHarmonic: s.thdMaxHarmonic, harmonics_A: arr(s.harmonics_A),
    deadTimeVoltageError_V: num(s.deadTimeVoltageError_V),
    dcLink: { mean_A: num(s.dcLink.mean_A), rms_A: num(s.dcLink.rms_A), rippleRms_A: num(s.dcLink.rippleRms_A) },
    analysed: { from_s: num(s.analysed.from_s), to_s: num(s.analysed.to_s), cycles: s.analysed.cycles },
    window: {
      from_s: num(w.from_s), to_s: num(w.to_s), truncated: w.truncated,
      t_s: arr(w.t_s), ia_A: arr(w.ia_A), ib_A: arr(w.ib_A), ic_A: arr(w.ic_A), va_V: arr(w.va_V), idc_A: arr(w.idc_A),
    },
  };
}

/** The switching model's window as CSV: one row per segment boundary. */
export function switchingWindowCsv(s: SwitchingResult): string {
  const w = s.window;
  const rows: CsvCell[][] = [['t_s', 'ia_A', 'ib_A', 'ic_A', 'va_V', 'idc_A']];
  for (let i = 0; i < w.t_s.length; i++) rows.push([w.t_s[i]!, w.ia_A[i]!, w.ib_A[i]!, w.ic_A[i]!, w.va_V[i]!, w.idc_A[i]!]);
  return csvDocument(rows);
}

/** The switching summary's text lines. */
export function switchingLines(s: SwitchingResult): string[] {
  const f = (x: number, k = 1): string => (Number.isFinite(x) ? fmt(x * k) : '-');
  const rows: Array<[string, string, string]> = [
    ['carrier, dead time, modulation', `${fmt(s.fsw_Hz)} Hz, ${fmt(s.deadTime_s * 1e6)} µs, ${s.modulation}`, ''],
    ['phase current ripple peak to peak (max / mean)', `${f(s.ripplePeakToPeak_A.max)} / ${f(s.ripplePeakToPeak_A.mean)}`, 'A'],
    [`phase current THD (to harmonic ${s.thdMaxHarmonic})`, f(s.thd, 100), '%'],
    ['dead-time voltage error (fundamental)', f(s.deadTimeVoltageError_V), 'V peak'],
    ['DC-link current mean / rms', `${f(s.dcLink.mean_A)} / ${f(s.dcLink.rms_A)}`, 'A'],
    ['DC-link ripple current rms (bus capacitor)', f(s.dcLink.rippleRms_A), 'A rms'],
  ];
  const a = s.analysed;
  return [
    `switching model: over ${a.cycles} whole fundamental period(s) at ${f(s.fundamental_Hz)} Hz, ${f(a.from_s, 1e3)} to ${f(a.to_s, 1e3)} ms` +
      (a.cycles === 0 ? ' (no whole fundamental period: THD and dead-time error not given)' : ''),
    ...table(['switching', 'value', 'unit'], rows),
    `zoom window ${f(s.window.from_s, 1e3)} to ${f(s.window.to_s, 1e3)} ms, ${s.window.t_s.length} samples${s.window.truncated ? ' (cut at its sample bound)' : ''} (--window-csv FILE)`,
    '',
  ];
}

/** The simulate command's JSON document: every metric and trace channel, events, findings, stats. */
export function simulationJson(r: SimulationResult, findings: Finding[] = [], projectSetup_s?: number) {
  const metrics: Record<string, number | null> = {};
  for (const k of JSON_METRICS) metrics[k] = r.metrics[k];
  // the angle error's and the speed estimate's, only when the angle source is not ideal
  for (const k of ['angleErrorRms_rad', 'angleErrorPeak_rad', 'speedEstimateRipple_rpm'] as const) if (r.metrics[k] !== undefined) metrics[k] = r.metrics[k];
  const traces: Record<string, number[]> = {};
  for (const k of traceNamesOf(r.traces)) traces[k] = Array.from(r.traces[k]!);
  return {
    metrics,
    loadSteps: r.loadSteps.map((l) => ({ ...l })),
    traces,
    events: r.events.map((e) => ({ ...e })),
    findings: findings.map((f) => ({ ...f })),
    diagnostic: r.diagnostic ?? null,
    ...(r.switching ? { switching: switchingJson(r.switching) } : {}),
    stats: {
      controlSteps: r.stats.controlSteps, rhsEvaluations: r.stats.rhsEvaluations, evaluationsPerPeriod: r.stats.evaluationsPerPeriod, wall_s: r.stats.wall_s,
      // set-up apart from the periods: the project's (tuning, reference table) when given, and the run's own
      ...(projectSetup_s !== undefined ? { projectSetup_s } : {}),
      setup_s: r.stats.setup_s, run_s: r.stats.run_s,
    },
  };
}

const CSV_HEADER: Record<string, string> = {
  t_s: 't_s', speedRef_rpm: 'speed_ref_rpm', speed_rpm: 'speed_rpm', torque_Nm: 'torque_Nm', loadTorque_Nm: 'load_torque_Nm',
  idRef_A: 'id_ref_A_peak', iqRef_A: 'iq_ref_A_peak', id_A: 'id_A_peak', iq_A: 'iq_A_peak', vd_V: 'vd_V_peak', vq_V: 'vq_V_peak',
  vNorm: 'v_over_vmax', ia_A: 'ia_A', ib_A: 'ib_A', ic_A: 'ic_A', pDc_W: 'p_dc_W',
  thetaError_rad: 'theta_error_rad', speedEstimate_rpm: 'speed_estimate_rpm',
};

export function simulationCsv(r: SimulationResult): string {
  const names = traceNamesOf(r.traces);
  const rows: CsvCell[][] = [names.map((n) => CSV_HEADER[n]!)];
  const n = r.traces.t_s.length;
  for (let i = 0; i < n; i++) rows.push(names.map((c) => r.traces[c]![i]!));
  return csvDocument(rows);
}

export const simulateCommand: Command = {
  name: 'simulate',
  summary: 'cascade simulation of the scenario: metrics, events, traces',
  usage: 'simulate <project.json> [--max-points N] [--csv FILE] [--window-csv FILE] [--json]',
  flags: { csv: 'output', 'max-points': 'number', 'window-csv': 'output' },
  run(p, args) {
    const t0 = performance.now();
    const setup = simulationFromProject(p);
    const projectSetup_s = (performance.now() - t0) / 1000;
    // trace length per channel (min/max decimated; the metrics always use every sample), bounded so
    // that memory stays bounded (MAX_TRACE_POINTS)
    const maxPoints = numberFlag(args, 'max-points', { min: 2, max: MAX_TRACE_POINTS, integer: true });
    if (args.flags.has('window-csv') && setup.pwm?.model !== 'switching') {
      throw new InputError('--window-csv', 'needs the switching model (control.pwm.model "switching"): the averaged model has no switching window');
    }
    const r = runSimulation(setup, maxPoints !== undefined ? { maxPoints } : {});
    const { json, lines } = simulationReport(p, setup, r, projectSetup_s);
    const files: Array<{ flag: string; contents: string }> = [];
    if (args.flags.has('csv')) files.push({ flag: 'csv', contents: simulationCsv(r) });
    if (args.flags.has('window-csv') && r.switching) files.push({ flag: 'window-csv', contents: switchingWindowCsv(r.switching) });
    return { json, lines, ...(files.length > 0 ? { files } : {}) };
  },
};

/** The simulate command's document and text lines for a finished run (also what the fuzz checks). */
export function simulationReport(p: ResolvedProject, setup: SimulationSetup, r: SimulationResult, projectSetup_s?: number): { json: ReturnType<typeof simulationJson> & { currentLimits: CurrentLimits }; lines: string[] } {
  const m = r.metrics;
  const c = setup.controller;
  const rows: Array<[string, string, string]> = [
    ['final speed', orDash(m.finalSpeed_rpm), 'rpm'],
    ['speed overshoot', orDash(m.speedOvershoot_pct), '%'],
    ['rise time 10-90 %', orDash(m.riseTime_s === null ? null : m.riseTime_s * 1e3), 'ms'],
    ['settling time 2 %', orDash(m.settlingTime_s === null ? null : m.settlingTime_s * 1e3), 'ms'],
    ['load-step speed dip', orDash(m.loadStepDip_rpm), 'rpm'],
    ['load-step recovery', orDash(m.loadStepRecovery_s === null ? null : m.loadStepRecovery_s * 1e3), 'ms'],
    ['steady-state speed error', orDash(m.steadyStateError_rpm), 'rpm'],
    ['peak phase current', m.peakCurrent_A === null ? '-' : `${fmt(m.peakCurrent_A)} (${fmt(peakToRms(m.peakCurrent_A))} rms)`, 'A peak'],
    ['rms phase current', m.rmsCurrent_A === null ? '-' : `${fmt(m.rmsCurrent_A)} (${fmt(m.rmsCurrent_A * Math.SQRT2)} peak)`, 'A rms'],
    ['time in voltage saturation', orDash(m.voltageSaturation_s === null ? null : m.voltageSaturation_s * 1e3), 'ms'],
    ['energy from the DC link', orDash(m.energyFromBus_J), 'J'],
    // the angle the controller saw: only when the angle source is not ideal
    ...(m.angleErrorRms_rad !== undefined ? [['angle error rms (electrical)', orDash(m.angleErrorRms_rad ?? null), 'rad'] as [string, string, string]] : []),
    ...(m.angleErrorPeak_rad !== undefined ? [['angle error peak (electrical)', orDash(m.angleErrorPeak_rad ?? null), 'rad'] as [string, string, string]] : []),
    ...(m.speedEstimateRipple_rpm !== undefined ? [['speed estimate ripple (rms)', orDash(m.speedEstimateRipple_rpm ?? null), 'rpm'] as [string, string, string]] : []),
  ];
  const lines = [
    `${p.name}: ${c.mode} control at ${fmt(1 / c.Ts)} Hz, delay ${c.delaySamples} period(s), anti-windup ${c.antiWindup}, ` +
      `${setup.duration_s} s simulated, hot corner`,
    `current PI d: Kp ${fmt(c.currentD.Kp)} V/A, Ki ${fmt(c.currentD.Ki)} V/(A·s); q: Kp ${fmt(c.currentQ.Kp)} V/A, Ki ${fmt(c.currentQ.Ki)} V/(A·s)` +
      (c.mode === 'speed' ? `; speed PI: Kp ${fmt(c.speed.Kp)} N·m·s/rad, Ki ${fmt(c.speed.Ki)} N·m/rad` : ''),
    `current reference limited to the ${describeLimit('peak', p.currentLimits.peak)}`,
    '',
    ...table(['metric', 'value', 'unit'], rows),
    '',
  ];
  if (r.loadSteps.length > 1 || r.loadSteps.some((l) => !l.settled)) {
    lines.push('load steps (each from its time to the next event):');
    lines.push(...table(['at ms', 'dip rpm', 'recovery ms', 'error at step rpm'], r.loadSteps.map((l) => [
      fmt(l.t_s * 1e3), l.settled ? orDash(l.dip_rpm) : 'not settled', orDash(l.recovery_s === null ? null : l.recovery_s * 1e3), orDash(l.errorAtStep_rpm),
    ])));
    lines.push('');
  }
  if (r.switching) lines.push(...switchingLines(r.switching));
  if (r.events.length === 0) lines.push('events: none');
  else {
    lines.push('events:');
    const shown = r.events.slice(0, 30);
    lines.push(...table(['kind', 'from ms', 'to ms', 'what'], shown.map((e) => [e.kind, fmt(e.t_s * 1e3), e.tEnd_s === undefined ? '-' : fmt(e.tEnd_s * 1e3), e.message])));
    if (r.events.length > shown.length) lines.push(`... ${r.events.length - shown.length} more (see --json)`);
  }
  const findings = simulationFindings(r, setup).filter((f) => f.code !== 'simulation-stopped');
  if (findings.length > 0) {
    lines.push('', 'findings:');
    for (const f of findings) lines.push(`  ${findingLine(f)}`);
  }
  if (r.diagnostic) lines.push('', `stopped: ${r.diagnostic}`);
  lines.push('', `${r.stats.controlSteps} control periods, ${r.stats.rhsEvaluations} derivative evaluations ` +
    `(median ${r.stats.evaluationsPerPeriod} per period), ${fmt(r.stats.wall_s * 1e3)} ms wall time` +
    (r.stats.wall_s > 0 ? `, ${fmt((r.stats.controlSteps * c.Ts) / r.stats.wall_s)} x real time` : ''));
  lines.push(`set-up ${fmt(((projectSetup_s ?? 0) + r.stats.setup_s) * 1e3)} ms` +
    (projectSetup_s !== undefined ? ` (tuning and reference table ${fmt(projectSetup_s * 1e3)} ms)` : '') +
    `, control periods ${fmt(r.stats.run_s * 1e3)} ms` +
    (r.stats.run_s > 0 ? ` (${fmt((r.stats.controlSteps * c.Ts) / r.stats.run_s)} x real time)` : ''));
  if (p.inverter.Vdc > 60) {
    lines.push(`caution: a ${fmt(p.inverter.Vdc)} V DC bus is hazardous; work on it only under local codes, licensed practice and IEC 61800-5-1.`);
  }
  return { json: { ...simulationJson(r, findings, projectSetup_s), currentLimits: p.currentLimits }, lines };
}
