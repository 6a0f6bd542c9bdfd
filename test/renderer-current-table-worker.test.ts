// The current-table worker's job (workers/current-table-job.ts currentTableJob, run by
// workers/current-table-worker.ts): the project from its text, progress as the share of speed rows
// solved (rising to 1), and the same header and summary as the export on the window's thread
// (common practice (no source): progress as items done / items).
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadProjectText } from '../src/core/project/project';
import { currentTableExport, currentTableJob } from '../src/renderer/src/workers/current-table-job';

const text = readFileSync(join(__dirname, '..', 'resources', 'demo-servo-axis.json'), 'utf8');

describe('current-table worker job', () => {
  it('reports 2 corners x 5 rows as fractions up to 1, and gives the window-thread export', () => {
    const choice = { speedPoints: 5, torquePoints: 4, corners: 'both' as const, minLoss: false };
    const seen: number[] = [];
    const r = currentTableJob(text, choice, '2026-01-02', (f) => seen.push(f));
    expect(seen).toEqual([1, 2, 3, 4, 5, 6, 7, 8, 9, 10].map((k) => k / 10));
    const direct = currentTableExport(loadProjectText(text), choice, '2026-01-02');
    expect(r).toEqual(direct);
    expect(r.summary).toMatch(/^5 x 7 nodes, hot and cold; bound/);
    expect(r.header).toContain('Date: 2026-01-02');
  }, 60_000);
});
