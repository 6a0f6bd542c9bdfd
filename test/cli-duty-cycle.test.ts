// duty-cycle: the project's cycle on its thermal network (src/cli/commands/duty-cycle.ts); the
// checks on the numbers are those of the core (test/duty-cycle.test.ts), here what the command says.
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { parseCsv } from '../src/core/reports/csv';
import { runCli } from './cli-run';

const demo = (name: string) => join(resolve(__dirname, '..'), 'resources', `demo-${name}.json`);
const dir = mkdtempSync(join(tmpdir(), 'tw-cli-duty-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const json = async (file: string, ...extra: string[]) => {
  const r = await runCli('duty-cycle', file, ...extra, '--json');
  expect(r.err).toBe('');
  expect(r.code).toBe(0);
  return JSON.parse(r.out);
};

describe('duty-cycle', () => {
  it('every demo: converged, the energy balance to 1e-6 (conservation of energy, common practice (no source)), a verdict', async () => {
    for (const name of ['ipm-traction', 'servo-axis', 'spm-48v', 'ipm-saturated']) {
      const d = await json(demo(name));
      expect(d.converged, name).toBe(true);
      expect(d.lastChange_K, name).toBeLessThan(0.1);
      const e = d.energies_J;
      const losses = e.copper_J + e.iron_J + e.mechanical_J + e.inverter_J;
      expect(Math.abs(e.dcLink_J - e.shaft_J - losses) / Math.abs(e.dcLink_J), name).toBeLessThan(1e-6);
      expect(Math.abs(e.heatStored_J - (e.copper_J + e.iron_J - e.heatRemoved_J)) / (e.copper_J + e.iron_J), name).toBeLessThan(1e-6);
      expect(['within-limits', 'limit-exceeded', 'outside-envelope']).toContain(d.verdict.status);
      expect(d.rmsCurrent_A, name).toBeLessThanOrEqual(d.peakCurrent_A.value);
      expect(d.peaks_C.winding.value, name).toBeGreaterThan(d.startTemps_C.stator - 1e-9);
    }
  }, 60_000);

  it('the text: the cycle, the repeats, the verdict, RMS and peak current against the limits, energies, peaks', async () => {
    const r = await runCli('duty-cycle', demo('ipm-traction'));
    expect(r.code).toBe(0);
    const lines = r.out.split('\n');
    expect(lines[0]).toMatch(/duty cycle "traction drive cycle, 120 s \(invented\)", 120 s, 24 instants \(the samples' own\), coolant 65 °C$/);
    expect(lines[1]).toMatch(/^ {2}periodic state after \d+ repeats \(last change .* K; reported: the last repeat\)$/);
    expect(lines[2]).toBe('  verdict: within limits');
    expect(lines[3]).toMatch(/RMS current .* A pk = .* A rms \(continuous 226 A peak \(159\.8 A rms\): inverter\)$/);
    expect(r.out).toMatch(/peaks: winding .* °C at .* s \(limit 180 °C\)/);
    expect(r.out).toContain('outside the envelope: never');
  });

  it('--step resamples the cycle; --every-instant solves every instant and agrees with the adaptive knots', async () => {
    const a = await json(demo('spm-48v'), '--step', '0.25');
    expect(a.instants).toBe(241);
    expect(a.step_s).toBe(0.25);
    const b = await json(demo('spm-48v'), '--step', '0.25', '--every-instant');
    expect(b.solve).toBe('every-instant');
    expect(b.lossPointsSolved).toBe(241);
    expect(a.lossPointsSolved).toBeLessThan(241);
    expect(Math.abs(a.peaks_C.winding.value - b.peaks_C.winding.value)).toBeLessThan(0.05);
  });

  it('--csv: one row per instant after a comment and the header, reading back as the JSON', async () => {
    const f = join(dir, 'cycle.csv');
    const r = await runCli('duty-cycle', demo('servo-axis'), '--step', '0.01', '--csv', f, '--json');
    expect(r.code).toBe(0);
    const d = JSON.parse(r.out);
    const rows = parseCsv(readFileSync(f, 'utf8'));
    expect(rows[0]![0]).toMatch(/^# torquewise duty cycle; project: .*; cycle: pick-and-place axis, 2 s \(invented\); the last of \d+ repeats/);
    expect(rows[1]).toEqual(['t_s', 'speed_rpm', 'torque_Nm', 'current_A_peak', 'copper_W', 'iron_W', 'mechanical_W', 'inverter_W', 'dcPower_W', 'winding_C', 'stator_C', 'magnet_C', 'junction_C', 'outside', 'solved']);
    expect(rows.length - 2).toBe(d.instants);
    const col = (name: string) => rows.slice(2).map((x) => Number(x[rows[1]!.indexOf(name)]));
    expect(Math.max(...col('winding_C'))).toBeCloseTo(d.peaks_C.winding.value, 6);
    expect(Math.max(...col('current_A_peak'))).toBeCloseTo(d.peakCurrent_A.value, 6);
  });

  it('refusals name the section or the flag', async () => {
    const j = JSON.parse(readFileSync(demo('ipm-traction'), 'utf8'));
    const noThermal = join(dir, 'no-thermal.json');
    writeFileSync(noThermal, JSON.stringify({ ...j, thermal: undefined }));
    expect((await runCli('duty-cycle', noThermal)).err).toBe('torquewise: thermal is needed for duty-cycle: the project has no thermal section\n');
    const noCycle = join(dir, 'no-cycle.json');
    writeFileSync(noCycle, JSON.stringify({ ...j, dutyCycle: undefined }));
    expect((await runCli('duty-cycle', noCycle)).err).toMatch(/^torquewise: dutyCycle is needed for duty-cycle: the project has no dutyCycle section/);
    const bad = await runCli('duty-cycle', demo('ipm-traction'), '--step', '0');
    expect(bad.code).not.toBe(0);
    expect(bad.err).toMatch(/^torquewise: --step /);
    expect((await runCli('help')).out).toContain('duty-cycle');
  });
});
