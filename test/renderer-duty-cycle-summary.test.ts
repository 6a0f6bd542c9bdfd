// The input side's duty-cycle summary (sample count, duration, ranges, RMS torque), its min-max
// decimated sparkline, and the starting values of a new duty cycle.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { sameColumns, sparkline, summariseDutyCycle } from '../src/renderer/src/views/inputs/duty-cycle-summary';
import { startingDutyCycle, START_INVERTER_LOSSES, START_THERMAL } from '../src/renderer/src/views/inputs/starting-values';
import { checkProject } from '../src/core/project/schema';

describe('duty-cycle summary', () => {
  it('a ramp from 0 to T has RMS T/√3; a constant T has RMS T', () => {
    // the RMS of a linear ramp from 0 to its peak is peak/√3 (common practice, no source)
    const ramp = summariseDutyCycle({ t_s: [0, 2], speed_rpm: [0, 1000], torque_Nm: [0, 30] })!;
    expect(ramp.torqueRms_Nm).toBeCloseTo(30 / Math.sqrt(3), 12);
    expect(ramp.samples).toBe(2);
    expect(ramp.duration_s).toBe(2);
    expect([ramp.speedMin_rpm, ramp.speedMax_rpm, ramp.torqueMin_Nm, ramp.torqueMax_Nm]).toEqual([0, 1000, 0, 30]);
    // a square wave of ±T (switching in 1 µs) has RMS T (common practice, no source)
    const sq = summariseDutyCycle({ t_s: [0, 1, 1 + 1e-6, 2], speed_rpm: [0, 0, 0, 0], torque_Nm: [5, 5, -5, -5] })!;
    expect(sq.torqueRms_Nm).toBeCloseTo(5, 5);
    expect(sq.stepMin_s).toBeCloseTo(1e-6, 15);
    expect(sq.stepMax_s).toBe(1);
  });

  it("the traction demo's cycle: 24 samples over 120 s, RMS torque equal to a direct 1 ms average", () => {
    const demo = JSON.parse(readFileSync(join(__dirname, '..', 'resources', 'demo-ipm-traction.json'), 'utf8'));
    const dc = demo.dutyCycle as { t_s: number[]; speed_rpm: number[]; torque_Nm: number[] };
    const s = summariseDutyCycle(dc)!;
    expect(s.samples).toBe(24);
    expect(s.duration_s).toBe(120);
    expect([s.speedMin_rpm, s.speedMax_rpm, s.torqueMin_Nm, s.torqueMax_Nm]).toEqual([0, 8000, -80, 200]);
    // the mean of T² by the midpoint rule at 0.1 ms, the torque interpolated linearly between samples
    // (common practice, no source): an independent quadrature of the same definition
    const h = 1e-4;
    let acc = 0;
    let k = 0;
    for (let t = h / 2; t < 120; t += h) {
      while (dc.t_s[k + 1]! < t) k++;
      const a = (t - dc.t_s[k]!) / (dc.t_s[k + 1]! - dc.t_s[k]!);
      const q = dc.torque_Nm[k]! + a * (dc.torque_Nm[k + 1]! - dc.torque_Nm[k]!);
      acc += q * q * h;
    }
    expect(s.torqueRms_Nm).toBeCloseTo(Math.sqrt(acc / 120), 3);
  });

  it('reads what it can of a half-typed cycle, and nothing of a cycle without lists', () => {
    const s = summariseDutyCycle({ t_s: [0, 1, 'x', 3], speed_rpm: [0, 10, 20, 30], torque_Nm: [1, 1, 1, 1] })!;
    expect(s.samples).toBe(4);
    expect(s.duration_s).toBe(3);
    // the two segments touching the unreadable time are left out of the RMS
    expect(s.torqueRms_Nm).toBeCloseTo(1, 12);
    expect(summariseDutyCycle({ t_s: 5, speed_rpm: [], torque_Nm: [] })).toBeNull();
    expect(summariseDutyCycle({ t_s: [0], speed_rpm: [0], torque_Nm: [0] })).toBeNull();
    expect(summariseDutyCycle(undefined)).toBeNull();
  });
});

describe('an unchanged cycle is known without summarising it again', () => {
  it('equal columns in a copy are the same; one changed entry or length is not', () => {
    // common practice (no source): a deep copy of equal lists compares equal entry by entry
    const a = { label: 'x', t_s: [0, 1, 2], speed_rpm: [0, 10, 0], torque_Nm: [1, 2, 3] };
    const copy = JSON.parse(JSON.stringify({ ...a, label: 'renamed' }));
    expect(sameColumns(a, copy)).toBe(true);
    expect(sameColumns(a, { ...copy, torque_Nm: [1, 2, 3.5] })).toBe(false);
    expect(sameColumns(a, { ...copy, t_s: [0, 1] })).toBe(false);
    expect(sameColumns(a, undefined)).toBe(false);
    expect(sameColumns(undefined, undefined)).toBe(true);
  });
});

describe('duty-cycle sparkline', () => {
  it('decimates 180 000 samples to at most two per slice and keeps a one-sample peak', () => {
    // min-max decimation keeps each slice's extremes (common practice, no source)
    const n = 180_000;
    const t = Array.from({ length: n }, (_, i) => i * 0.01);
    const y = Array.from({ length: n }, (_, i) => Math.sin(i / 5000));
    y[123_457] = 5; // a spike of one sample
    const pts = sparkline(t, y, 100);
    expect(pts.length).toBeLessThanOrEqual(200);
    expect(pts.length).toBeGreaterThan(100);
    expect(Math.max(...pts.map((p) => p[1]))).toBe(1);
    const spike = pts.find((p) => p[1] === 1)!;
    expect(spike[0]).toBeCloseTo(123_457 / (n - 1), 12);
    // x runs from 0 to 1 in order
    expect(pts[0]![0]).toBe(0);
    expect(pts[pts.length - 1]![0]).toBe(1);
    for (let i = 1; i < pts.length; i++) expect(pts[i]![0]).toBeGreaterThanOrEqual(pts[i - 1]![0]);
  });

  it('is empty without a time span', () => {
    expect(sparkline([0, 0], [1, 2], 10)).toEqual([]);
    expect(sparkline(['a', 'b'], [1, 2], 10)).toEqual([]);
  });
});

describe('starting values', () => {
  const base = JSON.parse(readFileSync(join(__dirname, '..', 'resources', 'demo-ipm-traction.json'), 'utf8'));

  it("a new duty cycle cruises at the first continuous requirement point and passes the core's checks", () => {
    const dc = startingDutyCycle(base) as { t_s: number[]; speed_rpm: number[]; torque_Nm: number[] };
    // the traction demo's rated point, 4000 rpm and 90 N·m, is its continuous-duty requirement
    expect(Math.max(...dc.speed_rpm)).toBe(4000);
    expect(Math.max(...dc.torque_Nm)).toBe(90);
    expect(Math.min(...dc.torque_Nm)).toBe(-45);
    expect(checkProject({ ...base, dutyCycle: dc })).toEqual([]);
    // no requirement points: 1000 rpm and 1 N·m
    const bare = startingDutyCycle({}) as { speed_rpm: number[]; torque_Nm: number[] };
    expect(Math.max(...bare.speed_rpm)).toBe(1000);
    expect(Math.max(...bare.torque_Nm)).toBe(1);
  });

  it("the starting losses and thermal network pass the core's checks", () => {
    expect(checkProject({ ...base, losses: { inverter: START_INVERTER_LOSSES }, thermal: START_THERMAL })).toEqual([]);
    const { junctionToCoolant_K_per_W: _r, junctionMax_C: _m, ...motorOnly } = START_THERMAL as Record<string, number>;
    expect(checkProject({ ...base, thermal: motorOnly })).toEqual([]);
  });
});
