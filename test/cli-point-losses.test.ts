// `point`: the torque is the shaft torque; the JSON keeps its keys and adds the losses, the
// efficiencies, the DC-link power and current, the power factor and the control rule (src/cli/commands/point.ts).
import { join, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from './cli-run';

const demo = (name: string) => join(resolve(__dirname, '..'), 'resources', `demo-${name}.json`);
const point = async (file: string, speed: number, torque: number, ...extra: string[]) => {
  const r = await runCli('point', file, '--speed', String(speed), '--torque', String(torque), ...extra, '--json');
  expect(r.err).toBe('');
  expect(r.code).toBe(0);
  return JSON.parse(r.out);
};
const totalLoss = (d: any) => d.losses.copper_W + d.losses.iron_W + d.losses.mechanical_W + d.losses.inverter_W;

describe('point --json', () => {
  it('keeps every earlier key and adds exactly the loss keys', async () => {
    const d = await point(demo('ipm-traction'), 3000, 100);
    const before = ['feasible', 'id_A', 'iq_A', 'current_A', 'voltage_V', 'limitedBy', 'region', 'currentLimits'];
    const added = ['torqueEm_Nm', 'losses', 'efficiency', 'dcPower_W', 'dcCurrent_A', 'powerFactor', 'control'];
    expect(Object.keys(d)).toEqual([...before, ...added]);
    expect(Object.keys(d.losses)).toEqual(['copper_W', 'iron_W', 'mechanical_W', 'inverter_W']);
    expect(Object.keys(d.efficiency)).toEqual(['motor', 'inverter', 'system']);
    expect(d.control).toBe('least-current');
    // the demo's losses are all above zero, so the electromagnetic torque exceeds the shaft torque
    expect(d.torqueEm_Nm).toBeGreaterThan(100);
    for (const k of ['motor', 'inverter', 'system'] as const) {
      expect(d.efficiency[k]).toBeGreaterThan(0.5);
      expect(d.efficiency[k]).toBeLessThan(1);
    }
  });

  it('energy balance, motoring: DC power = shaft power + all losses, to 1e-9 relative; DC current = P_dc / Vdc', async () => {
    for (const [name, speed, torque, Vdc] of [['ipm-traction', 3000, 100, 350], ['ipm-traction', 9000, 40, 350], ['spm-48v', 2000, 3, 48], ['servo-axis', 1500, 2, 320]] as const) {
      const d = await point(demo(name), speed, torque);
      expect(d.feasible, name).toBe(true);
      const shaft = (torque * speed * Math.PI) / 30;
      // energy conservation (common practice (no source))
      expect(Math.abs(d.dcPower_W - (shaft + totalLoss(d))) / d.dcPower_W, name).toBeLessThan(1e-9);
      expect(d.dcCurrent_A).toBeCloseTo(d.dcPower_W / Vdc, 9);
      // system = shaft / P_dc and system = motor x inverter for motoring (common practice (no source))
      expect(d.efficiency.system).toBeCloseTo(shaft / d.dcPower_W, 12);
      expect(d.efficiency.system).toBeCloseTo(d.efficiency.motor * d.efficiency.inverter, 12);
    }
  });

  it('--min-loss never has more total loss than the least current, and says so', async () => {
    for (const [speed, torque] of [[1000, 50], [3000, 100], [6000, 80], [9000, 40], [3000, -100]] as const) {
      const a = await point(demo('ipm-traction'), speed, torque);
      const b = await point(demo('ipm-traction'), speed, torque, '--min-loss');
      expect(b.control).toBe('min-loss');
      expect(b.feasible).toBe(true);
      // the loss-minimising current is chosen over a set holding the least-current one (common practice (no source))
      expect(totalLoss(b)).toBeLessThanOrEqual(totalLoss(a) * (1 + 1e-9));
    }
  });

  it('a lossless surface-magnet machine: the shaft torque is the electromagnetic torque, iq = T / (1.5 p psiM)', async () => {
    // (the earlier meaning of id/iq is kept wherever no loss adds torque; common practice (no source))
    const { mkdtempSync, writeFileSync } = await import('node:fs');
    const { tmpdir } = await import('node:os');
    const f = join(mkdtempSync(join(tmpdir(), 'tw-pl-')), 'spm.json');
    writeFileSync(f, JSON.stringify({
      format: 'torquewise-project', version: 1, name: 'invented lossless SPM',
      motor: { polePairs: 3, Rs: 0, Ld: 0.001, Lq: 0.001, psiM: 0.05, inertia: 0.001 },
      inverter: { Vdc: 300, Imax: 30, Icont: 15, modulation: 'svpwm' },
      conditions: { windingTemp_C: 20 },
    }));
    const d = await point(f, 1000, 2);
    expect(d.torqueEm_Nm).toBeCloseTo(2, 12);
    expect(d.iq_A).toBeCloseTo(2 / (1.5 * 3 * 0.05), 9);
    expect(totalLoss(d)).toBe(0);
    expect(d.efficiency.system).toBeCloseTo(1, 12);
  });

  it('the text names the shaft torque and gives the loss breakdown and the efficiencies', async () => {
    const r = await runCli('point', demo('ipm-traction'), '--speed', '3000', '--torque', '100');
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/shaft torque 100 N·m at 3000 rpm \(hot corner, least current\): feasible/);
    expect(r.out).toMatch(/losses: copper [\d.]+ W, iron [\d.]+ W, mechanical [\d.]+ W, inverter [\d.]+ W, total [\d.]+ W/);
    expect(r.out).toMatch(/efficiency: motor 9\d\.\d+ %, inverter 9\d\.\d+ %, system 9\d\.\d+ %/);
  });
});
