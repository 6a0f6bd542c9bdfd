// `current-table`: the firmware's current-reference table from the command line (src/cli/commands/current-table.ts).
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from './cli-run';
import { demoJson } from './helpers';

const demo = (name: string) => join(resolve(__dirname, '..'), 'resources', `demo-${name}.json`);
const dir = mkdtempSync(join(tmpdir(), 'tw-ct-'));

describe('current-table', () => {
  it('--json: axes, both corners, the bound and the times; the three files written', async () => {
    const h = join(dir, 't.h'), c = join(dir, 't.csv'), n = join(dir, 't.md');
    const r = await runCli('current-table', demo('spm-48v'), '--speed-points', '6', '--torque-points', '4', '--header', h, '--csv', c, '--notes', n, '--json');
    expect(r.err).toBe('');
    expect(r.code).toBe(0);
    const d = JSON.parse(r.out);
    expect(d.speedAxis_rad_s_per_V).toHaveLength(6);
    expect(d.torqueAxis_Nm).toHaveLength(7);
    expect(d.corners.map((k: { corner: string }) => k.corner)).toEqual(['hot', 'cold']);
    expect(d.corners[0].iq_A).toHaveLength(6);
    expect(d.bound.torque_Nm).toBeGreaterThan(0);
    expect(d.bus.effective_V).toBeCloseTo(48 - 0.4, 12);
    expect(d.build_s).toBeGreaterThan(0);
    expect(readFileSync(h, 'utf8')).toContain('static const float twct_iq_cold[TWCT_SPEED_POINTS][TWCT_TORQUE_POINTS]');
    expect(readFileSync(c, 'utf8')).toContain('"corner","x_rad_s_per_V"');
    expect(readFileSync(n, 'utf8')).toContain('# Current-reference table');
  }, 60_000);

  it('text: one corner, the bound, the time; --min-loss on a file without losses says it is the least current', async () => {
    const j = demoJson('demo-spm-48v');
    delete j['losses'];
    const f = join(dir, 'nolosses.json');
    writeFileSync(f, JSON.stringify(j));
    const r = await runCli('current-table', f, '--speed-points', '4', '--torque-points', '3', '--corner', 'cold', '--min-loss');
    expect(r.code).toBe(0);
    expect(r.out).toContain('corners cold,');
    expect(r.out).toContain('loss-minimising current');
    expect(r.out).toContain('the file has no losses section');
    expect(r.out).toMatch(/bound .*torque [0-9.e-]+ N·m/);
    expect(r.out).toMatch(/built in [0-9.]+ ms/);
  }, 60_000);

  it('refuses, in one line naming the option: a missing grid, a bad corner, the project file as output', async () => {
    const a = await runCli('current-table', demo('spm-48v'), '--torque-points', '4');
    expect(a.code).not.toBe(0);
    expect(a.err).toContain('--speed-points');
    const b = await runCli('current-table', demo('spm-48v'), '--speed-points', '4', '--torque-points', '4', '--corner', 'warm');
    expect(b.err).toContain('--corner');
    const c = await runCli('current-table', demo('spm-48v'), '--speed-points', '4', '--torque-points', '1');
    expect(c.err).toContain('--torque-points');
    const d = await runCli('current-table', demo('spm-48v'), '--speed-points', '4', '--torque-points', '4', '--header', demo('spm-48v'));
    expect(d.err).toContain('--header');
    expect(d.err.trim().split('\n')).toHaveLength(1);
  }, 60_000);
});
