// The tuning view's current-table export (workers/current-table-job.ts): the header it writes is
// the command line's for the same choice, and names the file from the project.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadProjectText } from '../src/core/project/project';
import { currentTableExport, currentTableFileName } from '../src/renderer/src/workers/current-table-job';
import { runCli } from './cli-run';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';

const file = join(__dirname, '..', 'resources', 'demo-servo-axis.json');

describe('tuning view: export current table', () => {
  it('the same header as `current-table --header` (the date aside), a file name from the project', async () => {
    const p = loadProjectText(readFileSync(file, 'utf8'));
    const r = currentTableExport(p, { speedPoints: 5, torquePoints: 4, corners: 'hot', minLoss: false }, '2026-01-02');
    const out = join(mkdtempSync(join(tmpdir(), 'tw-ctr-')), 'h.h');
    const c = await runCli('current-table', file, '--speed-points', '5', '--torque-points', '4', '--corner', 'hot', '--header', out);
    expect(c.code).toBe(0);
    const cli = readFileSync(out, 'utf8').replace(/Date: \S+/, 'Date: X');
    expect(r.header.replace(/Date: \S+/, 'Date: X')).toBe(cli);
    expect(r.summary).toMatch(/^5 x 7 nodes, hot; bound: torque [0-9.e-]+ N·m/);
    expect(currentTableFileName(p)).toBe('Invented-demo-servo-axis-on-a-320-V-rectified-bus-current-table.h');
  }, 60_000);
});
