// Text exports: the envelope and the simulated traces as CSV (numbers straight from the engine),
// written by the one CSV module the command line uses too (src/core/reports/csv.ts): text quoted, formula
// starts neutralised, numbers left as numbers.
import { csvDocument, csvNumber, type CsvCell } from '../../../core/reports/csv';
import { describeLimits } from '../../../core/drive/current-limits';
import { envelopeCsv as envelopeCsvDocument } from '../../../core/reports/envelope-csv';
import type { Results } from '../state/compute';

/**
 * Every envelope curve in long form, one row per speed point (src/core/reports/envelope-csv.ts, the
 * app's naming: a curve column first). Header lines starting with '#' state the options the curves
 * were computed with, so the numbers can be reproduced; each is one quoted cell (the project's name
 * may hold commas, quotes or line breaks).
 */
export function envelopeCsv(r: Results): string {
  const comments = [
    `# torquewise envelope; project: ${r.project.name || 'unnamed'}`,
    `# points=${r.points} speedMax_rad_s=${csvNumber(r.speedMax)} curves=${r.curves.map((c) => c.key).join(',')}`,
    `# ${describeLimits(r.project.currentLimits)}; Vmax ${csvNumber(r.project.peak.Vmax)} V peak phase`,
    '# currents in A peak (and rms), voltage in V peak phase, speed mechanical',
  ];
  return envelopeCsvDocument(r.curves, { comments, naming: 'app' });
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
