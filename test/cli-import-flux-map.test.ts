// import-flux-map: a long-format CSV into the motor section, written atomically to --out after the
// new project loads; and what params says about a flux-map project.
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { runCli } from './cli-run';
import { loadProjectText } from '../src/core/project/project';
import { CONST_MOTOR, constProject, grid } from './flux-map-fixtures';

const dir = mkdtempSync(join(tmpdir(), 'tw-cli-map-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const project = join(dir, 'p.json');
writeFileSync(project, JSON.stringify(constProject(), null, 2));

/** The constant motor tabulated in long format, currents in A rms (grid covering 500 A peak both ways). */
function writeCsv(name: string, peakSpan = 500): string {
  const { Ld, Lq, psiM } = CONST_MOTOR;
  const rms = (x: number): number => Number((x / Math.SQRT2).toPrecision(15));
  const ids = grid(-peakSpan, peakSpan, 21).map(rms), iqs = grid(-peakSpan, peakSpan, 21).filter((x) => x >= 0).map(rms);
  const lines = ['id_rms_A,iq_rms_A,psid_Wb_peak,psiq_Wb_peak'];
  for (const iq of iqs) for (const id of ids) lines.push(`${id},${iq},${Ld * id * Math.SQRT2 + psiM},${Lq * iq * Math.SQRT2}`);
  const f = join(dir, name);
  writeFileSync(f, lines.join('\n') + '\n');
  return f;
}
const COLS = ['--id', 'id_rms_A', '--iq', 'iq_rms_A', '--psid', 'psid_Wb_peak', '--psiq', 'psiq_Wb_peak'];

/** Largest relative difference of two number trees (same shape). */
function worst(a: unknown, b: unknown): number {
  if (typeof a === 'number') return typeof b !== 'number' ? Infinity : a === b ? 0 : Math.abs(a - b) / Math.max(Math.abs(a), Math.abs(b), 1e-12);
  if (a && typeof a === 'object' && b && typeof b === 'object') return Math.max(0, ...Object.keys(a).map((k) => worst((a as any)[k], (b as any)[k])));
  return 0;
}

describe('import-flux-map', () => {
  const out = join(dir, 'map.json');
  it('round-trips a CSV with rms currents into a project that loads and gives the constant project\'s results', async () => {
    const r = await runCli('import-flux-map', project, '--from', writeCsv('map.csv'), ...COLS, '--current', 'rms', '--magnet-temp', '20', '--out', out);
    expect(r.err).toBe('');
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/flux map: 21 x 11 points, id -500 to 500 A peak, iq 0 to 500 A peak \(from A rms, x √2\), magnet at 20 °C/);
    const written = JSON.parse(readFileSync(out, 'utf8'));
    expect(written.motor.Ld).toBeUndefined();
    expect(written.motor.fluxMap.id_A[0]).toBeCloseTo(-500, 9); // A rms x √2 = A peak (common practice, no source)
    expect(written.motor.polePairs).toBe(CONST_MOTOR.polePairs);
    const p = loadProjectText(readFileSync(out, 'utf8'));
    expect(p.hot.Lq).toBeCloseTo(CONST_MOTOR.Lq, 12);
    // a map tabulated from constant terms: the same envelope, point and sizing through the CLI's JSON within 1e-6
    for (const cmd of [['envelope', '--points', '40'], ['point', '--speed', '7000', '--torque', '50'], ['size']]) {
      const a = await runCli(cmd[0]!, project, ...cmd.slice(1), '--json');
      const b = await runCli(cmd[0]!, out, ...cmd.slice(1), '--json');
      expect(b.code).toBe(0);
      expect(worst(JSON.parse(a.out), JSON.parse(b.out)), cmd[0]).toBeLessThan(1e-6);
    }
  });

  it('params: the inductances at zero and peak current and the map findings for a map; no new key for constant terms', async () => {
    const m = JSON.parse((await runCli('params', out, '--json')).out);
    expect(m.fluxMapInductances.d.map((x: any) => x.current_A)).toEqual([0, -450]);
    expect(m.fluxMapInductances.q[1].apparent_H).toBeCloseTo(CONST_MOTOR.Lq, 12);
    expect(m.findings.map((f: any) => f.code)).toEqual(expect.arrayContaining(['flux-map-temperature', 'flux-map-apparent-terms']));
    const c = JSON.parse((await runCli('params', project, '--json')).out);
    expect('fluxMapInductances' in c).toBe(false);
    const t = await runCli('params', out);
    expect(t.out).toMatch(/flux map inductances \(20 °C;/);
  });

  it('refusals: --out the project itself, --current missing, a map short of the peak limit (nothing written)', async () => {
    const same = await runCli('import-flux-map', project, '--from', writeCsv('a.csv'), ...COLS, '--current', 'rms', '--out', project);
    expect(same.code).toBe(2);
    expect(same.err).toMatch(/^torquewise: --out '.*' is the project file itself; it is never written over/);
    const cur = await runCli('import-flux-map', project, '--from', writeCsv('b.csv'), ...COLS, '--out', join(dir, 'x.json'));
    expect(cur.err).toBe('torquewise: --current must be "rms" or "peak": how the CSV\'s currents are given\n');
    const shortOut = join(dir, 'short.json');
    const short = await runCli('import-flux-map', project, '--from', writeCsv('c.csv', 400), ...COLS, '--current', 'rms', '--out', shortOut);
    expect(short.code).toBe(2);
    expect(short.err).toMatch(/^torquewise: motor\.fluxMap\.id_A covers -400 to 400 A; .*450 A \(inverter\.Imax\).*: 50 A short at the top, 50 A short at the bottom\n/);
    expect(existsSync(shortOut)).toBe(false);
    const missing = await runCli('import-flux-map', project, '--from', join(dir, 'none.csv'), ...COLS, '--current', 'peak', '--out', join(dir, 'y.json'));
    expect(missing.err).toMatch(/^torquewise: --from '.*none\.csv' does not exist\n$/);
    const np = join(dir, 'np.json');
    const withNameplate = constProject();
    delete withNameplate.motor;
    withNameplate.nameplate = { poles: 8, R: { value: 0.03, basis: 'phase' }, Ld: { value: 3e-4, basis: 'phase' }, Lq: { value: 7.5e-4, basis: 'phase' }, Ke: { value: 0.08, unit: 'V_ph_peak*s/rad' }, inertia: 0.045 };
    writeFileSync(np, JSON.stringify(withNameplate));
    const n = await runCli('import-flux-map', np, '--from', writeCsv('d.csv'), ...COLS, '--current', 'rms', '--out', join(dir, 'z.json'));
    expect(n.code).toBe(2);
    expect(n.err).toMatch(/^torquewise: motor is required: a flux map goes into a motor section/);
  });
});
