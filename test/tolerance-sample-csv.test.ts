// The samples of a tolerance run as CSV (src/core/reports/tolerance-sample-csv.ts): the comment line,
// the header naming each parameter with its unit and each point's margin and verdict, one row per
// sample with the chunk's numbers, and "all met" the conjunction of the verdicts.
import { describe, expect, it } from 'vitest';
import { sampleCsv } from '../src/core/reports/tolerance-sample-csv';
import { parseCsv } from '../src/core/reports/csv';
import type { SampleChunk } from '../src/core/project/tolerance-sample';
import type { ToleranceParameter } from '../src/core/project/tolerance-apply';

const params: ToleranceParameter[] = [
  { path: 'motor.psiM', nominal: 0.02, min: 0.018, max: 0.022, unit: 'Wb' },
  { path: 'inverter.Imax', nominal: 100, min: 90, max: 110, unit: 'A' },
];
// two samples from index 10, two points: the second sample fails the second point
const chunk: SampleChunk = { from: 10, count: 2, k: 2, nReq: 2, values: new Float64Array([0.019, 95, 0.021, 105]), margins: new Float64Array([1.5, 0.25, 2.5, -0.5]), met: new Uint8Array([1, 1, 1, 0]) };

describe('tolerance sample CSV', () => {
  const rows = parseCsv(sampleCsv(chunk, params, ['a', 'b'], '# test run'));
  it('a comment, a header and one row per sample (common practice (no source): RFC 4180 records)', () => {
    expect(rows[0]).toEqual(['# test run']);
    expect(rows[1]).toEqual(['sample', 'motor.psiM (Wb)', 'inverter.Imax (A)', 'a: margin (N·m)', 'a: met', 'b: margin (N·m)', 'b: met', 'all met']);
    expect(rows).toHaveLength(4);
  });
  it('the chunk\'s numbers, each sample by its own index, all met = every point met', () => {
    expect(rows[2]!.map(Number)).toEqual([10, 0.019, 95, 1.5, 1, 0.25, 1, 1]);
    expect(rows[3]!.map(Number)).toEqual([11, 0.021, 105, 2.5, 1, -0.5, 0, 0]);
  });
});
