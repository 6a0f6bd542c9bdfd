// `simulate` with the switching model (src/cli/commands/simulate.ts): the summary lines, the
// `switching` key of --json with plain arrays, --window-csv, and the refusal of --window-csv for the
// averaged model. Keys: issue 14 of this project; the figures' plausibility bounds: common practice
// (no source).
import { describe, expect, it } from 'vitest';
import { readFileSync, mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { runCli } from './cli-run';
import { switchingProjectFile } from './switching-fixtures';

const demo = (name: string): string => join(__dirname, '..', 'resources', `demo-${name}.json`);

describe('simulate with the switching model', () => {
  it('--json gains `switching` (plain arrays, the analysed span, the default window of the last two fundamental periods); the text has the summary; --window-csv writes the window', async () => {
    const project = switchingProjectFile();
    const csv = join(mkdtempSync(join(tmpdir(), 'tw-wcsv-')), 'window.csv');
    const r = await runCli('simulate', project, '--json', '--window-csv', csv);
    expect(r.code).toBe(0);
    const sim = JSON.parse(r.out);
    const s = sim.switching;
    expect(Object.keys(s).sort()).toEqual(['analysed', 'dcLink', 'deadTimeVoltageError_V', 'fsw_Hz', 'fundamental_Hz', 'harmonics_A', 'modulation', 'ripplePeakToPeak_A', 'rippleEnvelope', 'thd', 'thdMaxHarmonic', 'deadTime_s', 'window'].sort());
    expect(s.fsw_Hz).toBe(10000);
    expect(s.deadTime_s).toBe(1e-6);
    expect(Array.isArray(s.harmonics_A) && Array.isArray(s.window.t_s) && Array.isArray(s.rippleEnvelope.peakToPeak_A)).toBe(true);
    expect(s.harmonics_A.length).toBe(s.thdMaxHarmonic + 1);
    // 3000 rpm, 5 pole pairs: 250 Hz; whole fundamental periods analysed at the run's end
    expect(s.fundamental_Hz).toBeCloseTo(250, 0);
    expect(s.analysed.cycles).toBeGreaterThanOrEqual(1);
    expect(s.analysed.to_s).toBeCloseTo(0.16, 6);
    expect(s.thd).toBeGreaterThan(0);
    expect(s.thd).toBeLessThan(0.2);
    expect(s.ripplePeakToPeak_A.max).toBeGreaterThanOrEqual(s.ripplePeakToPeak_A.mean);
    expect(s.dcLink.rms_A).toBeGreaterThanOrEqual(Math.abs(s.dcLink.mean_A));
    // the default window: the last two fundamental periods (8 ms at 250 Hz)
    expect(s.window.to_s - s.window.from_s).toBeCloseTo(2 / s.fundamental_Hz, 3);
    for (const k of ['ia_A', 'ib_A', 'ic_A', 'va_V', 'idc_A']) expect(s.window[k].length).toBe(s.window.t_s.length);
    const lines = readFileSync(csv, 'utf8').trim().split(/\r?\n/);
    expect(lines[0]!.replace(/"/g, '')).toBe('t_s,ia_A,ib_A,ic_A,va_V,idc_A');
    expect(lines.length).toBe(s.window.t_s.length + 1);
    expect(Number(lines[1]!.split(',')[0]!.replace(/"/g, ''))).toBeCloseTo(s.window.t_s[0], 9);
    const text = await runCli('simulate', project);
    expect(text.out).toMatch(/switching model: over \d whole fundamental period\(s\) at 250/);
    for (const k of ['phase current ripple peak to peak', 'phase current THD', 'dead-time voltage error', 'DC-link current mean / rms', 'DC-link ripple current rms']) expect(text.out).toContain(k);
  });

  it('a window from the project (control.pwm.window_s) is the window of --json', async () => {
    const sim = JSON.parse((await runCli('simulate', switchingProjectFile({ from: 0.1, to: 0.101 }), '--json')).out);
    const w = sim.switching.window;
    expect([w.from_s, w.to_s, w.truncated]).toEqual([0.1, 0.101, false]);
    expect(w.t_s[0]).toBeGreaterThanOrEqual(0.1);
    expect(w.t_s[w.t_s.length - 1]).toBeLessThanOrEqual(0.101);
    expect(w.t_s.length).toBeGreaterThan(10 * 4); // ten carrier periods, several boundaries each
  });

  it('the averaged demos have no `switching` key, and --window-csv is refused for them, naming the option', async () => {
    const sim = JSON.parse((await runCli('simulate', demo('spm-48v'), '--json')).out);
    expect(sim).not.toHaveProperty('switching');
    const r = await runCli('simulate', demo('spm-48v'), '--window-csv', join(mkdtempSync(join(tmpdir(), 'tw-wcsv-')), 'w.csv'));
    expect(r.code).not.toBe(0);
    expect(r.err).toMatch(/--window-csv needs the switching model \(control\.pwm\.model "switching"\)/);
  });
});
