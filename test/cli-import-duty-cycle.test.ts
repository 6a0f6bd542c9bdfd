// import-duty-cycle: a CSV of samples into the dutyCycle section, written atomically to --out after
// the new project loads; refusals before anything is written. Common practice (no source).
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { runCli } from './cli-run';
import { loadProjectText } from '../src/core/project/project';
import { MAX_PROJECT_BYTES } from '../src/core/project/schema';
import { constProject } from './flux-map-fixtures';

const dir = mkdtempSync(join(tmpdir(), 'tw-cli-cycle-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const project = join(dir, 'p.json');
writeFileSync(project, JSON.stringify(constProject(), null, 2));
const COLS = ['--t', 'time [s]', '--speed', 'speed [rpm]', '--torque', 'torque [Nm]'];

function writeCsv(name: string, lines: string[]): string {
  const f = join(dir, name);
  writeFileSync(f, ['time [s],speed [rpm],torque [Nm],current [A]', ...lines].join('\n') + '\n');
  return f;
}
const MOVE = ['0,0,150,300', '2.5,3000,150,300', '2.51,3000,40,80', '30,3000,40,80', '30.01,3000,-60,120', '33,0,-60,120', '40,0,0,0'];

describe('import-duty-cycle', () => {
  const out = join(dir, 'cycle.json');
  it('writes the cycle into a copy of the project that loads, its columns one line each, the rest of the project kept', async () => {
    const r = await runCli('import-duty-cycle', project, '--from', writeCsv('move.csv', MOVE), ...COLS, '--label', 'launch, cruise, brake (invented)', '--out', out);
    expect(r.err).toBe('');
    expect(r.code).toBe(0);
    expect(r.out).toContain("duty cycle 'launch, cruise, brake (invented)': 7 samples over 40 s, speed 0 to 3000 rpm, torque -60 to 150 N·m");
    expect(r.out).toContain('written to the project given by --out (dutyCycle added)');
    const text = readFileSync(out, 'utf8');
    expect(text).toContain('    "t_s": [0, 2.5, 2.51, 30, 30.01, 33, 40],\n');
    const p = loadProjectText(text);
    expect(Array.from(p.dutyCycle!.torque_Nm)).toEqual([150, 150, 40, 40, -60, -60, 0]);
    expect(p.dutyCycle!.label).toBe('launch, cruise, brake (invented)');
    const original = constProject();
    expect(JSON.parse(text).requirements).toEqual(original.requirements);
    expect(JSON.parse(text).motor).toEqual(original.motor);
  });

  it('--json: the summary; a second import replaces the cycle; the label defaults to the CSV\'s name; a log from 12 s is moved to 0', async () => {
    const again = join(dir, 'again.json');
    const r = await runCli('import-duty-cycle', out, '--from', writeCsv('log.csv', ['12,0,1,0', '12.5,100,1,0', '14,200,0,0']), ...COLS, '--out', again, '--json');
    expect(r.code).toBe(0);
    expect(JSON.parse(r.out)).toEqual({
      name: 'invented IPM, constant terms', label: 'from log.csv', samples: 3, duration_s: 2, shift_s: 12,
      speed_rpm: { min: 0, max: 200 }, torque_Nm: { min: 0, max: 1 }, replaced: true,
    });
    expect(Array.from(loadProjectText(readFileSync(again, 'utf8')).dutyCycle!.t_s)).toEqual([0, 0.5, 2]);
  });

  it('a 30-minute cycle at 10 ms (180 000 rows) is imported, loads, and stays well under the file size limit', async () => {
    const rows: string[] = [];
    for (let i = 0; i < 180_000; i++) rows.push(`${(i * 0.01).toFixed(2)},${(3000 + 2500 * Math.sin(i / 3000)).toFixed(1)},${(40 * Math.cos(i / 700)).toFixed(2)},0`);
    const big = join(dir, 'big.json');
    const r = await runCli('import-duty-cycle', project, '--from', writeCsv('big.csv', rows), ...COLS, '--out', big);
    expect(r.err).toBe('');
    const text = readFileSync(big, 'utf8');
    expect(text.length).toBeLessThan(MAX_PROJECT_BYTES / 4); // about 3.3 MB (measured)
    expect(loadProjectText(text).dutyCycle!.t_s.length).toBe(180_000);
  }, 30_000);

  it('refusals name the flag or the row, and nothing is written', async () => {
    const x = join(dir, 'x.json');
    const run = (csv: string, ...more: string[]) => runCli('import-duty-cycle', project, '--from', csv, ...COLS, ...more, '--out', x);
    const same = await runCli('import-duty-cycle', project, '--from', writeCsv('a.csv', MOVE), ...COLS, '--out', project);
    expect(same.code).toBe(2);
    expect(same.err).toMatch(/^torquewise: --out '.*' is the project file itself; it is never written over/);
    const noCol = await runCli('import-duty-cycle', project, '--from', writeCsv('b.csv', MOVE), '--t', 'time [s]', '--speed', 'speed [rpm]', '--torque', 'T', '--out', x);
    expect(noCol.err).toBe("torquewise: --torque 'T' is not a column of the CSV header (columns: 'time [s]', 'speed [rpm]', 'torque [Nm]', 'current [A]')\n");
    const missingFlag = await runCli('import-duty-cycle', project, '--from', writeCsv('c.csv', MOVE), '--t', 'time [s]', '--speed', 'speed [rpm]', '--out', x);
    expect(missingFlag.err).toBe("torquewise: --torque is required: the CSV header's name of the torque column (N·m)\n");
    const dup = join(dir, 'dup.csv');
    writeFileSync(dup, 'time [s],speed [rpm],torque [Nm],time [s]\n0,0,0,0\n1,1,1,1\n');
    expect((await run(dup)).err).toBe("torquewise: --t 'time [s]' names more than one column of the CSV header\n");
    expect((await run(writeCsv('d.csv', ['0,0,0,0', '1,0,0,0', '1,0,0,0']))).err).toBe("torquewise: CSV row 4 column 'time [s]' (--t) is 1 s, not after row 3 (1 s): the times must be strictly ascending\n");
    expect((await run(writeCsv('e.csv', ['0,0,0,0', '1,NaN,0,0']))).err).toBe("torquewise: CSV row 3 column 'speed [rpm]' (--speed) must be a number (got 'NaN')\n");
    // a cycle the project file cannot hold is refused by the schema, naming the sample
    expect((await run(writeCsv('f.csv', ['0,0,0,0', '1,2000000,0,0']))).err).toBe('torquewise: dutyCycle.speed_rpm[1] must be <= 1000000 rpm\n');
    const missing = await run(join(dir, 'none.csv'));
    expect(missing.err).toMatch(/^torquewise: --from '.*none\.csv' does not exist\n$/);
    expect(existsSync(x)).toBe(false);
  });

  it('is listed by help with its usage', async () => {
    const h = await runCli('help');
    expect(h.out).toContain('import-duty-cycle');
  });
});
