import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from './cli-run';

const dir = mkdtempSync(join(tmpdir(), 'tw-compare-'));
const spm = join(__dirname, '..', 'resources', 'demo-spm-48v.json');
const servo = join(__dirname, '..', 'resources', 'demo-servo-axis.json');

/** The SPM demo with extra keys, written under a temporary name. */
function spmWith(name: string, extra: Record<string, unknown>): string {
  const f = join(dir, name);
  writeFileSync(f, JSON.stringify({ ...JSON.parse(readFileSync(spm, 'utf8')), ...extra }));
  return f;
}

describe('compare', () => {
  it('one file with named variants: one JSON object per variant, the table with a column each', async () => {
    const f = spmWith('spm-variants.json', { variants: [{ name: 'strong magnet', overrides: { 'motor.psiM': 0.0095 * 1.2 } }] });
    const r = await runCli('compare', f, '--json');
    expect(r.err).toBe('');
    expect(r.code).toBe(0);
    const d = JSON.parse(r.out);
    expect(d.variants.map((v: { name: string }) => v.name)).toEqual(['spm-variants', 'strong magnet']);
    for (const v of d.variants) {
      expect(Object.keys(v)).toEqual(['name', 'file', 'projectName', 'model', 'limits', 'envelope', 'sizing', 'efficiency', 'loadSteps']);
      expect(Object.keys(v.sizing.hot)).toEqual(expect.arrayContaining(['minImax_A', 'minVdc_V', 'points']));
      expect(Object.keys(v.envelope.cold)).toEqual(['peakTorque_Nm', 'baseSpeed_rpm', 'maxSpeed_rpm', 'maxPower_W', 'speed_rpm', 'torque_Nm']);
      expect(Object.keys(v.loadSteps.metrics)).toContain('loadStepDip_rpm');
    }
    // Kt = 1.5 p psiM (Krishnan 2010, Permanent Magnet Synchronous and Brushless DC Motor Drives): the ratio of the magnets
    expect(d.variants[1].model.constantsHot.Kt_Nm_per_Apeak / d.variants[0].model.constantsHot.Kt_Nm_per_Apeak).toBeCloseTo(1.2, 12);
    expect(d.table.columns).toEqual(['spm-variants', 'strong magnet']);
  });

  it('two files: the text table names each column and puts a dash where a file has no such point', async () => {
    const r = await runCli('compare', spm, servo);
    expect(r.code).toBe(0);
    const lines = r.out.split('\n');
    expect(lines.find((l) => /\bunit\b/.test(l))).toMatch(/demo-spm-48v\s+demo-servo-axis/);
    expect(lines.find((l) => /cruise: hot/.test(l))).toMatch(/met, \+[\d.]+ A \/ \+[\d.]+ V\s+-$/);
    expect(r.out).toMatch(/least Imax hot/);
    expect(r.out).toMatch(/load-step speed dip/);
  });

  it('refusals name the file and the field', async () => {
    const unknown = spmWith('unknown-path.json', { variants: [{ name: 'x', overrides: { 'motor.psiX': 1 } }] });
    let r = await runCli('compare', unknown);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/unknown-path\.json: variants\[0\]\.overrides\.motor\.psiX is not a parameter of the project file/);
    const bad = spmWith('bad-second.json', { inverter: { Vdc: -1, Imax: 200, Icont: 100 } });
    r = await runCli('compare', spm, bad);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/bad-second\.json: inverter\.Vdc must be > 0 V/);
    r = await runCli('compare', spm);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/variants are needed to compare: give a second project file, or a variants section in/);
    // the other commands still take one file only
    r = await runCli('size', spm, servo);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/is not expected after the project file/);
  });
});
