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

/** The metrics of the JSON document: the keys issue 3 names first, then the rest of the engine's. */
const JSON_METRICS = [
  'finalSpeed_rpm', 'speedOvershoot_pct', 'riseTime_s', 'settlingTime_s', 'loadStepDip_rpm', 'loadStepRecovery_s',
  'peakCurrent_A', 'rmsCurrent_A', 'voltageSaturation_s', 'energyFromBus_J', 'steadyStateError_rpm',
] as const satisfies ReadonlyArray<keyof SimulationResult['metrics']>;

/** The simulate command's JSON document: every metric and trace channel, events, findings, stats. */
export function simulationJson(r: SimulationResult, findings: Finding[] = [], projectSetup_s?: number) {
  const metrics: Record<string, number | null> = {};
  for (const k of JSON_METRICS) metrics[k] = r.metrics[k];
  // the angle error's, only when the angle source is not ideal
  for (const k of ['angleErrorRms_rad', 'angleErrorPeak_rad'] as const) if (r.metrics[k] !== undefined) metrics[k] = r.metrics[k];
  const traces: Record<string, number[]> = {};
  for (const k of traceNamesOf(r.traces)) traces[k] = Array.from(r.traces[k]!);
  return {
    metrics,
    loadSteps: r.loadSteps.map((l) => ({ ...l })),
    traces,
    events: r.events.map((e) => ({ ...e })),
    findings: findings.map((f) => ({ ...f })),
    diagnostic: r.diagnostic ?? null,
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
  usage: 'simulate <project.json> [--max-points N] [--csv FILE] [--json]',
  flags: { csv: 'output', 'max-points': 'number' },
  run(p, args) {
    const t0 = performance.now();
    const setup = simulationFromProject(p);
    const projectSetup_s = (performance.now() - t0) / 1000;
    // trace length per channel (min/max decimated; the metrics always use every sample), bounded so
    // that memory stays bounded (MAX_TRACE_POINTS)
    const maxPoints = numberFlag(args, 'max-points', { min: 2, max: MAX_TRACE_POINTS, integer: true });
    const r = runSimulation(setup, maxPoints !== undefined ? { maxPoints } : {});
    const { json, lines } = simulationReport(p, setup, r, projectSetup_s);
    return { json, lines, ...(args.flags.has('csv') ? { files: [{ flag: 'csv', contents: simulationCsv(r) }] } : {}) };
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
