/**
 * The samples of a Monte Carlo tolerance run as CSV: one row per sample with its index, the
 * parameters' values, each requirement's least torque margin (N·m) and verdict (1 met), and whether
 * every requirement is met; a comment line first (what was run). The CLI's `tolerance-sample --csv`
 * and the app's Tolerances view write the same text.
 */
import type { SampleChunk } from '../project/tolerance-sample';
import type { ToleranceParameter } from '../project/tolerance-apply';
import { CSV_EOL, csvDocument, type CsvCell } from './csv';

/** One row per sample: its index, the parameters' values, each requirement's margin and verdict. */
export function sampleCsv(c: SampleChunk, params: readonly ToleranceParameter[], labels: readonly string[], comment: string): string {
  const head = ['sample', ...params.map((p) => `${p.path}${p.unit ? ` (${p.unit})` : ''}`), ...labels.flatMap((l) => [`${l}: margin (N·m)`, `${l}: met`]), 'all met'];
  const rows: CsvCell[][] = [head];
  for (let s = 0; s < c.count; s++) {
    const cells: CsvCell[] = [c.from + s];
    for (let j = 0; j < c.k; j++) cells.push(c.values[s * c.k + j]!);
    let all = 1;
    for (let j = 0; j < c.nReq; j++) {
      const met = c.met[s * c.nReq + j]!;
      all &= met;
      cells.push(c.margins[s * c.nReq + j]!, met);
    }
    cells.push(all);
    rows.push(cells);
  }
  return comment + CSV_EOL + csvDocument(rows);
}
