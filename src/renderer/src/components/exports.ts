// Text exports: the envelope and the simulated traces as CSV (numbers straight from the engine),
// written by the one CSV module the command line uses too (src/core/csv.ts): text quoted, formula
// starts neutralised, numbers left as numbers.
import { csvDocument, csvNumber, type CsvCell } from '../../../core/reports/csv';
import { describeLimits } from '../../../core/drive/current-limits';
import { RAD_S_TO_RPM, SQRT2 } from '../../../core/base/units';
import type { Results } from '../state/compute';

/**
 * Every envelope curve in long form, one row per speed point. Header lines starting with '#'
 * state the options the curves were computed with, so the numbers can be reproduced; each is one
 * quoted cell (the project's name may hold commas, quotes or line breaks).
 */
export function envelopeCsv(r: Results): string {
  const rows: CsvCell[][] = [];
  rows.push([`# torquewise envelope; project: ${r.project.name || 'unnamed'}`]);
  rows.push([`# points=${r.points} speedMax_rad_s=${csvNumber(r.speedMax)} curves=${r.curves.map((c) => c.key).join(',')}`]);
  rows.push([`# ${describeLimits(r.project.currentLimits)}; Vmax ${csvNumber(r.project.peak.Vmax)} V peak phase`]);
  rows.push(['# currents in A peak (and rms), voltage in V peak phase, speed mechanical']);
  rows.push(['curve', 'speed_rpm', 'torque_Nm', 'power_W', 'id_A', 'iq_A', 'current_A_peak', 'current_A_rms', 'voltage_V', 'region']);
  for (const c of r.curves) {
    const e = c.env;
    for (let k = 0; k < e.speed.length; k++) {
      rows.push([
        c.key,
        e.speed[k]! * RAD_S_TO_RPM,
        e.torque[k]!,
        e.power[k]!,
        e.id[k]!,
        e.iq[k]!,
        e.current[k]!,
        e.current[k]! / SQRT2,
        e.voltage[k]!,
        e.feasible[k] ? e.region[k]! : 'beyond-max-speed',
      ]);
    }
  }
  return csvDocument(rows);
}

/** Simulated traces, one column per channel. */
export function tracesCsv(traces: Record<string, ArrayLike<number>>): string {
  const keys = Object.keys(traces).filter((k) => traces[k] && typeof traces[k]!.length === 'number');
  const t = keys.includes('t_s') ? ['t_s', ...keys.filter((k) => k !== 't_s')] : keys;
  const n = Math.min(...t.map((k) => traces[k]!.length));
  const rows: CsvCell[][] = [t];
  for (let i = 0; i < n; i++) rows.push(t.map((k) => traces[k]![i]!));
  return csvDocument(rows);
}
