// The `datasheet` command: the same self-contained HTML the app exports, written atomically to --out.
import { copyFileSync, mkdtempSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { runCli } from './cli-run';
import { datasheetDate } from '../src/cli/commands/datasheet';
import { computeDatasheetResults } from '../src/core/reports/datasheet-results';
import { datasheetHtml } from '../src/core/reports/datasheet-html';
import { loadProjectText } from '../src/core/project/project';
import { TOOL_VERSION } from '../src/core/base/version';
import { datasheetEfficiencySummary } from '../src/core/reports/datasheet-efficiency';

const root = resolve(__dirname, '..');
const dir = mkdtempSync(join(tmpdir(), 'tw-datasheet-'));
const servoSrc = join(root, 'resources', 'demo-servo-axis.json');

const run = runCli;

let saved: string | undefined;
beforeEach(() => {
  saved = process.env['SOURCE_DATE_EPOCH'];
  process.env['SOURCE_DATE_EPOCH'] = String(Date.UTC(2026, 11, 3) / 1000);
});
afterEach(() => {
  if (saved === undefined) delete process.env['SOURCE_DATE_EPOCH'];
  else process.env['SOURCE_DATE_EPOCH'] = saved;
});

describe('datasheet command', () => {
  it('writes the same datasheet the app builds from the project, and says where', async () => {
    const out = join(dir, 'servo.html');
    const r = await run('datasheet', servoSrc, '--out', out);
    expect(r.err).toBe('');
    expect(r.code).toBe(0);
    const html = readFileSync(out, 'utf8');
    const p = loadProjectText(readFileSync(servoSrc, 'utf8'));
    expect(html).toBe(datasheetHtml(computeDatasheetResults(p), { date: '2026-12-03' }));
    expect(r.out).toContain(`datasheet written to ${out}`);
    expect(r.out).toContain('envelope tables every 500 rpm (13 rows, hot and cold)');
    expect(r.out).toContain('requirement points met hot and cold: 3 of 4');
  });
  it('--json prints one small summary document', async () => {
    const out = join(dir, 'servo-json.html');
    const r = await run('datasheet', servoSrc, '--out', out, '--step', '1000', '--json');
    expect(r.code).toBe(0);
    expect(r.out.trim().split('\n')).toHaveLength(1);
    const doc = JSON.parse(r.out);
    expect(doc.out).toBe(out);
    expect(doc.bytes).toBe(statSync(out).size);
    expect(doc.date).toBe('2026-12-03');
    expect(doc.version).toBe(TOOL_VERSION);
    expect(doc.tableStep_rpm).toBe(1000);
    expect(doc.tableRows).toBe(7); // 0..6000 rpm of a 6300 rpm range
    // 8 N·m at 4000 rpm: short hot (7.9 N·m available), met cold (stronger magnet)
    expect(doc.requirements).toEqual({ total: 4, metHot: 3, metCold: 4, metBoth: 3 });
  });
  it('--json carries the efficiency map\'s summary for a file with losses, and the document it had without', async () => {
    const out = join(dir, 'servo-eff.html');
    const r = await run('datasheet', servoSrc, '--out', out, '--json');
    expect(r.code).toBe(0);
    const doc = JSON.parse(r.out);
    expect(Object.keys(doc)).toEqual(['out', 'bytes', 'project', 'date', 'version', 'speedMax_rpm', 'tableStep_rpm', 'tableRows', 'requirements', 'cautions', 'efficiency']);
    const p = loadProjectText(readFileSync(servoSrc, 'utf8'));
    expect(doc.efficiency).toEqual(datasheetEfficiencySummary(computeDatasheetResults(p).efficiency!));
    expect(doc.efficiency).toMatchObject({ quantity: 'system', corner: 'hot', control: 'least-current', speedPoints: 60, torquePoints: 60 });
    expect(readFileSync(out, 'utf8')).toContain('data-testid="chart-efficiency"');
    const text = await run('datasheet', servoSrc, '--out', join(dir, 'servo-eff2.html'));
    const peak = doc.efficiency.peakSystem;
    expect(text.out).toContain(`system efficiency map (hot corner, least current, 60 x 60 grid): highest ${(100 * peak.efficiency).toFixed(1)} % at ${Math.round(peak.speed_rpm)} rpm`);
    // without the section: the keys of before, no map, no line about it
    const j = JSON.parse(readFileSync(servoSrc, 'utf8'));
    delete j.losses;
    const plain = join(dir, 'servo-no-losses.json');
    writeFileSync(plain, JSON.stringify(j));
    const r2 = await run('datasheet', plain, '--out', join(dir, 'servo-plain.html'), '--json');
    expect(Object.keys(JSON.parse(r2.out))).toEqual(['out', 'bytes', 'project', 'date', 'version', 'speedMax_rpm', 'tableStep_rpm', 'tableRows', 'requirements', 'cautions']);
    expect(readFileSync(join(dir, 'servo-plain.html'), 'utf8')).not.toContain('efficiency');
    expect((await run('datasheet', plain, '--out', join(dir, 'servo-plain2.html'))).out).not.toContain('efficiency');
  });
  it('refuses an --out that is the project file itself, however it is spelled, and leaves the file alone', async () => {
    const input = join(dir, 'project.json');
    copyFileSync(servoSrc, input);
    const before = readFileSync(input, 'utf8');
    for (const out of [input, join(dir, '.', 'sub', '..', 'project.json')]) {
      const r = await run('datasheet', input, '--out', out);
      expect(r.code).toBe(2);
      expect(r.err.trim().split('\n')).toHaveLength(1);
      expect(r.err).toMatch(/^torquewise: --out '.*' is the project file itself; it is never written over/);
    }
    expect(readFileSync(input, 'utf8')).toBe(before);
  });
  it('refuses bad options in one line naming the option', async () => {
    const cases: Array<[string[], RegExp]> = [
      [[], /^torquewise: --out is required/],
      [['--out', join(dir, 'a.html'), '--step', '0'], /^torquewise: --step must be a speed step > 0 rpm/],
      [['--out', join(dir, 'b.html'), '--step', '1'], /^torquewise: --step gives more than 500 rows over 0 to 6300 rpm; use a step >= 13 rpm/],
      [['--out', join(dir, 'c.html'), '--step', 'x'], /^torquewise: --step must be a number rpm/],
      [['--out', join(dir, 'no-such-folder', 'd.html')], /^torquewise: --out '.*d\.html' was not written: .*; any file there is unchanged/],
      [['--out', dir], /^torquewise: --out '.*' is not a regular file \(a folder or a device\)/],
    ];
    for (const [flags, msg] of cases) {
      const r = await run('datasheet', servoSrc, ...flags);
      expect(r.code, flags.join(' ')).toBe(2);
      expect(r.err.trim().split('\n')).toHaveLength(1);
      expect(r.err).toMatch(msg);
    }
  });
  it('dates the sheet today, or by SOURCE_DATE_EPOCH for a reproducible run', () => {
    expect(datasheetDate({}, new Date(Date.UTC(2030, 0, 2, 23)))).toBe('2030-01-02');
    expect(datasheetDate({ SOURCE_DATE_EPOCH: '0' }, new Date())).toBe('1970-01-01');
    expect(datasheetDate({ SOURCE_DATE_EPOCH: 'soon' }, new Date(Date.UTC(2030, 0, 2)))).toBe('2030-01-02');
  });
});
