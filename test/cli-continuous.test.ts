// `continuous` (the S1 curve) and `overload` (peak duration) on the demos' invented thermal networks.
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseCsv } from '../src/core/reports/csv';
import { runCli } from './cli-run';

const demo = (name: string) => join(resolve(__dirname, '..'), 'resources', `demo-${name}.json`);
const thermalOf = (name: string) => JSON.parse(readFileSync(demo(name), 'utf8')).thermal;
const dir = mkdtempSync(join(tmpdir(), 'tw-continuous-'));
const json = async (...argv: string[]) => {
  const r = await runCli(...argv, '--json');
  expect(r.err).toBe('');
  expect(r.code).toBe(0);
  return JSON.parse(r.out);
};
const LIMIT_KEY = { winding: ['windingTemp_C', 'windingMax_C'], magnet: ['magnetTemp_C', 'magnetMax_C'], junction: ['junctionTemp_C', 'junctionMax_C'] } as const;

describe('continuous', () => {
  for (const name of ['ipm-traction', 'spm-48v', 'servo-axis']) {
    it(`${name}: the points' keys, and each thermal bound's temperature on the file's limit to 0.01 K (IEC 60034-1 duty type S1; issue 13's check)`, async () => {
      const d = await json('continuous', demo(name), '--points', '21');
      const net = thermalOf(name);
      expect(d.points).toHaveLength(21);
      expect(d.windingMax_C).toBe(net.windingMax_C);
      for (const q of d.points) {
        expect(Object.keys(q)).toEqual(['speed_rpm', 'torque_Nm', 'limitedBy', 'windingTemp_C', 'magnetTemp_C', 'junctionTemp_C']);
        expect(['winding', 'magnet', 'junction', 'current', 'voltage']).toContain(q.limitedBy);
        expect(q.torque_Nm).toBeGreaterThanOrEqual(0);
        const k = LIMIT_KEY[q.limitedBy as keyof typeof LIMIT_KEY];
        if (k !== undefined && q.torque_Nm > 0) expect(Math.abs(q[k[0]] - net[k[1]])).toBeLessThan(0.01);
        if (q.windingTemp_C !== null) {
          expect(q.windingTemp_C).toBeLessThan(net.windingMax_C + 0.01);
          expect(q.magnetTemp_C).toBeLessThan(net.magnetMax_C + 0.01);
        }
      }
    });
  }

  it('--speed-max and --csv: one row per point, reading back as the JSON', async () => {
    const csv = join(dir, 's1.csv');
    const d = await json('continuous', demo('ipm-traction'), '--speed-max', '6000', '--points', '7', '--csv', csv);
    expect(d.points[6].speed_rpm).toBeCloseTo(6000, 9);
    const rows = parseCsv(readFileSync(csv, 'utf8'));
    expect(rows[0]).toEqual(['speed_rpm', 'torque_Nm', 'limitedBy', 'windingTemp_C', 'magnetTemp_C', 'junctionTemp_C']);
    expect(rows).toHaveLength(8);
    for (let k = 0; k < 7; k++) {
      expect(Number(rows[k + 1]![1])).toBeCloseTo(d.points[k].torque_Nm, 6);
      expect(rows[k + 1]![2]).toBe(d.points[k].limitedBy);
    }
  });

  it('a project without a thermal section: refused, naming it', async () => {
    const file = join(dir, 'no-thermal.json');
    const j = JSON.parse(readFileSync(demo('ipm-traction'), 'utf8'));
    delete j.thermal;
    delete j.dutyCycle;
    writeFileSync(file, JSON.stringify(j));
    for (const argv of [['continuous', file], ['overload', file, '--speed', '1000', '--torque', '100']]) {
      const r = await runCli(...argv);
      expect(r.code).not.toBe(0);
      expect(r.err).toMatch(/thermal/);
    }
  });
});

describe('overload', () => {
  it('one point: the start is the steady state of half the S1 torque by default, the end on the limit named', async () => {
    const net = thermalOf('ipm-traction');
    const s1 = (await json('continuous', demo('ipm-traction'), '--speed-max', '3000', '--points', '2')).points[1];
    const d = await json('overload', demo('ipm-traction'), '--speed', '3000', '--torque', '250');
    expect(Object.keys(d)).toEqual(['speed_rpm', 'torque_Nm', 'duration_s', 'limitedBy', 'outsideEnvelope', 'from', 'start', 'end']);
    expect(d.from.torque_Nm).toBeCloseTo(0.5 * s1.torque_Nm, 6);
    expect(d.duration_s).toBeGreaterThan(0);
    const k = LIMIT_KEY[d.limitedBy as keyof typeof LIMIT_KEY];
    expect(k).toBeDefined();
    expect(d.end[k[0]]).toBeCloseTo(net[k[1]], 6);
    expect(d.start.windingTemp_C).toBeLessThan(d.end.windingTemp_C);
    // a chosen start, hotter: a shorter time (common practice (no source))
    const hot = await json('overload', demo('ipm-traction'), '--speed', '3000', '--torque', '250', '--from-torque', String(0.9 * s1.torque_Nm));
    expect(hot.duration_s).toBeLessThan(d.duration_s);
  });

  it('the curve: N torques up to the peak envelope, durations falling, null where never reached; --csv', async () => {
    const csv = join(dir, 'overload.csv');
    const d = await json('overload', demo('ipm-traction'), '--speed', '3000', '--torques', '6', '--csv', csv);
    expect(d.points).toHaveLength(6);
    expect(d.points[0].duration_s).toBeNull();
    expect(d.points[0].limitedBy).toBe('none');
    let last = Infinity;
    for (const q of d.points) {
      const t = q.duration_s ?? Infinity;
      expect(t).toBeLessThanOrEqual(last);
      last = t;
    }
    expect(parseCsv(readFileSync(csv, 'utf8'))).toHaveLength(7);
  });

  it('refuses --torque with --torques, and no --speed, naming the option', async () => {
    const both = await runCli('overload', demo('ipm-traction'), '--speed', '3000', '--torque', '100', '--torques', '4');
    expect(both.code).not.toBe(0);
    expect(both.err).toMatch(/--torque/);
    const none = await runCli('overload', demo('ipm-traction'), '--torque', '100');
    expect(none.code).not.toBe(0);
    expect(none.err).toMatch(/--speed/);
  });
});
