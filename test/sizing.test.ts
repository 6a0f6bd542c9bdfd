import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import type { DqMachine, InverterSpec, Requirement } from '../src/core/types';
import { leastVoltageLimit, sizeDrive } from '../src/core/sizing';
import { driveLimits, voltageLimit } from '../src/core/inverter';
import { solveOperatingPoint } from '../src/core/operating-point';
import { maxTorquePoint } from '../src/core/envelope';
import { rpmToRadS } from '../src/core/units';
import { InputError } from '../src/core/errors';

// Invented test machine and inverter.
const IPM: DqMachine = { polePairs: 4, Rs: 0.02, Ld: 0.12e-3, Lq: 0.3e-3, psiM: 0.045 };
const INV: InverterSpec = { Vdc: 350, Imax: 400, Icont: 250, modulation: 'svpwm', voltageUtilization: 0.95, deviceDrop: 1 };
const REQS: Requirement[] = [
  { label: 'launch', speed_rpm: 300, torque_Nm: 150 },
  { label: 'cruise', speed_rpm: 6000, torque_Nm: 60 },
  { label: 'brake', speed_rpm: 8000, torque_Nm: -50 },
  { label: 'top', speed_rpm: 14000, torque_Nm: 25 },
];

describe('sizing', () => {
  const r = sizeDrive(IPM, INV, REQS);
  const lim = driveLimits(INV);

  it('per point: verdict, available torque, headroom and binding limit agree with the solvers', () => {
    expect(r.points.map((p) => p.label)).toEqual(['launch', 'cruise', 'brake', 'top']);
    for (const [k, p] of r.points.entries()) {
      const w = rpmToRadS(REQS[k].speed_rpm);
      const op = solveOperatingPoint(IPM, lim, w, REQS[k].torque_Nm);
      expect(p.met).toBe(op.feasible);
      expect(p.current_A).toBeCloseTo(op.current, 9);
      expect(p.currentHeadroom_A).toBeCloseTo(lim.Imax - op.current, 9);
      expect(p.voltageHeadroom_V).toBeCloseTo(lim.Vmax - op.voltage, 9);
      expect(p.limitedBy).toBe(op.limitedBy);
      const dir = REQS[k].torque_Nm >= 0 ? 'motoring' : 'generating';
      expect(p.torqueAvailable_Nm).toBeCloseTo(maxTorquePoint(IPM, lim, w, dir).torque, 9);
      if (p.met) expect(Math.abs(p.torqueAvailable_Nm)).toBeGreaterThanOrEqual(Math.abs(p.torque_Nm));
    }
    expect(r.points[0].limitedBy).toBe('none');
    expect(r.points[2].torqueAvailable_Nm).toBeLessThan(0);
  });

  it('minImax meets every point, exactly at its binding point', () => {
    expect(r.minImax).not.toBeNull();
    const lim2 = { Vmax: lim.Vmax, Imax: r.minImax! };
    const ops = REQS.map((q) => solveOperatingPoint(IPM, lim2, rpmToRadS(q.speed_rpm), q.torque_Nm));
    for (const op of ops) expect(op.feasible).toBe(true);
    const binding = Math.max(...ops.map((o) => o.current));
    expect(binding / r.minImax!).toBeCloseTo(1, 9);
    // a little less current misses a point
    const lim3 = { Vmax: lim.Vmax, Imax: r.minImax! * (1 - 1e-6) };
    expect(REQS.some((q) => !solveOperatingPoint(IPM, lim3, rpmToRadS(q.speed_rpm), q.torque_Nm).feasible)).toBe(true);
  });

  it('minVdc meets every point with Imax, exactly at its binding point', () => {
    expect(r.minVdc).not.toBeNull();
    const at = (Vdc: number) => ({ Vmax: voltageLimit({ ...INV, Vdc }), Imax: INV.Imax });
    const ok = (Vdc: number) => REQS.every((q) => solveOperatingPoint(IPM, at(Vdc), rpmToRadS(q.speed_rpm), q.torque_Nm).feasible);
    expect(ok(r.minVdc! * (1 + 1e-9))).toBe(true);
    expect(ok(r.minVdc! * (1 - 1e-6))).toBe(false);
    // the bus includes the device drop and utilisation, through busForVoltageLimit
    const vmaxNeeded = Math.max(...REQS.map((q) => leastVoltageLimit(IPM, INV.Imax, rpmToRadS(q.speed_rpm), q.torque_Nm)!));
    expect(r.minVdc!).toBeCloseTo((vmaxNeeded * Math.sqrt(3)) / 0.95 + 2, 6);
  });

  it('a point beyond MTPV for any current gives minImax null and names the limit', () => {
    const reqs = [...REQS, { label: 'impossible', speed_rpm: 20000, torque_Nm: 150 }];
    const s = sizeDrive(IPM, INV, reqs);
    expect(s.minImax).toBeNull();
    expect(s.points[4].met).toBe(false);
    expect(s.points[4].limitedBy).toBe('beyond-mtpv');
    // a point that needs more than Imax at any bus gives minVdc null
    const t = sizeDrive(IPM, INV, [{ label: 'too much', speed_rpm: 10, torque_Nm: 400 }]);
    expect(t.minVdc).toBeNull();
    expect(t.points[0].limitedBy).toBe('current');
    expect(t.minImax).toBeGreaterThan(INV.Imax);
  });

  it('hot and cold machines give different verdicts in the expected direction', () => {
    // common practice (no source): a hot magnet has less flux, so needs more current for the same torque at low speed
    const hot = { ...IPM, psiM: IPM.psiM * 0.88, Rs: IPM.Rs * 1.47 };
    const h = sizeDrive(hot, INV, REQS);
    expect(h.points[0].current_A).toBeGreaterThan(r.points[0].current_A);
  });

  it('rejects bad requirements with the path', () => {
    expect(() => sizeDrive(IPM, INV, [{ label: 'x', speed_rpm: Number.NaN, torque_Nm: 1 }])).toThrow(/requirements\[0\].speed_rpm/);
    expect(() => sizeDrive(IPM, { ...INV, voltageUtilization: 0 }, REQS)).toThrow(InputError);
  });

  it('property: no NaN in any verdict for valid machines and requirements', () => {
    const machine = fc.record({
      polePairs: fc.integer({ min: 1, max: 8 }),
      Rs: fc.oneof(fc.constant(0), fc.double({ min: 1e-3, max: 0.5, noNaN: true })),
      Ld: fc.double({ min: 5e-5, max: 5e-3, noNaN: true }),
      ratio: fc.oneof(fc.constant(1), fc.double({ min: 0.5, max: 4, noNaN: true })),
      psiM: fc.oneof(fc.constant(0), fc.double({ min: 5e-3, max: 0.3, noNaN: true })),
    }).filter((r) => r.psiM > 0 || r.ratio !== 1)
      .map((r): DqMachine => ({ polePairs: r.polePairs, Rs: r.Rs, Ld: r.Ld, Lq: r.Ld * r.ratio, psiM: r.psiM }));
    const req = fc.record({ label: fc.constant('p'), speed_rpm: fc.double({ min: -8000, max: 8000, noNaN: true }), torque_Nm: fc.double({ min: -100, max: 100, noNaN: true }) });
    fc.assert(fc.property(machine, fc.array(req, { minLength: 1, maxLength: 3 }), (m, reqs) => {
      const s = sizeDrive(m, INV, reqs);
      expect(s.minImax === null || Number.isFinite(s.minImax)).toBe(true);
      expect(s.minVdc === null || Number.isFinite(s.minVdc)).toBe(true);
      for (const p of s.points) {
        for (const x of [p.torqueAvailable_Nm, p.current_A, p.voltage_V, p.currentHeadroom_A, p.voltageHeadroom_V]) expect(Number.isFinite(x)).toBe(true);
        if (p.met) expect(p.currentHeadroom_A).toBeGreaterThanOrEqual(-1e-9 * INV.Imax);
      }
    }), { numRuns: 40 });
  });
});
