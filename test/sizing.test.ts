import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import type { DqMachine } from '../src/core/machine/dq-machine';
import type { InverterSpec } from '../src/core/drive/inverter-spec';
import type { Requirement } from '../src/core/steady-state/operating-point-types';
import { leastVoltageLimit, sizeDrive } from '../src/core/steady-state/sizing';
import { driveLimits, voltageLimit } from '../src/core/drive/inverter';
import { solveOperatingPoint } from '../src/core/steady-state/operating-point';
import { maxTorquePoint } from '../src/core/steady-state/envelope';
import { rpmToRadS } from '../src/core/base/units';
import { InputError } from '../src/core/base/errors';
import { effectiveCurrentLimits } from '../src/core/drive/current-limits';
import { expectClose, numericOnly } from './model-paths';

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
      if (op.feasible) {
        expect(p.currentHeadroom_A!).toBeCloseTo(lim.Imax - op.current, 9);
        // in field weakening the least-current point sits on the voltage limit: 0 V by design
        expect(p.voltageHeadroom_V!).toBeCloseTo(op.region === 'mtpa' ? lim.Vmax - op.voltage : 0, 9);
        expect(p.torqueShortfall_Nm).toBeNull();
      } else {
        expect(p.currentHeadroom_A).toBeNull();
        expect(p.voltageHeadroom_V).toBeNull();
      }
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
        for (const x of [p.torqueAvailable_Nm, p.current_A, p.voltage_V]) expect(Number.isFinite(x)).toBe(true);
        const meaningful = p.met ? [p.currentHeadroom_A, p.voltageHeadroom_V] : [p.torqueShortfall_Nm];
        for (const x of meaningful) expect(Number.isFinite(x)).toBe(true);
        if (p.met) expect(p.currentHeadroom_A!).toBeGreaterThanOrEqual(-1e-9 * INV.Imax);
        else expect(p.torqueShortfall_Nm!).toBeGreaterThanOrEqual(0);
      }
    }), { numRuns: 40 });
  });
});

describe('sizing: duty, effective limits and headroom that means something', () => {
  const lim = driveLimits(INV);
  // 'launch' needs about 368 A at 300 rpm (MTPA): between Icont 250 A and Imax 400 A
  const launch = REQS[0];

  it('a continuous point is checked against the continuous limit and says so', () => {
    const peakDuty = sizeDrive(IPM, INV, [launch]).points[0];
    const cont = sizeDrive(IPM, INV, [{ ...launch, duty: 'continuous' }]);
    const c = cont.points[0];
    expect(peakDuty.met).toBe(true);
    expect(peakDuty.duty).toBe('peak');
    expect(peakDuty.currentLimit_A).toBe(400);
    expect(c.duty).toBe('continuous');
    expect(c.currentLimit_A).toBe(250);
    expect(c.current_A).toBeGreaterThan(250);
    expect(c.met).toBe(false);
    expect(c.limitedBy).toBe('current');
    // the available torque is that of the continuous limit at this speed
    expect(c.torqueAvailable_Nm).toBeCloseTo(maxTorquePoint(IPM, { Vmax: lim.Vmax, Imax: 250 }, rpmToRadS(300), 'motoring').torque, 9);
    expect(c.headroomNote).toMatch(/continuous current limit 250 A peak \(inverter's Icont\)/);
    // least continuous current: the MTPA current of the point (the only continuous one)
    expect(cont.minIcont).toBeCloseTo(c.current_A, 6);
    expect(sizeDrive(IPM, INV, [launch]).minIcont).toBeUndefined();
  });

  it('uses the effective limits (the motor binds) and names the motor', () => {
    const limits = effectiveCurrentLimits(INV, 200, 280); // invented motor: rated 200 A, peak 280 A peak
    const r = sizeDrive(IPM, INV, [launch], limits).points[0];
    expect(r.currentLimit_A).toBe(280);
    expect(r.currentLimitBinds).toBe('motor');
    expect(r.met).toBe(false); // 368 A needed > 280 A
    expect(r.headroomNote).toMatch(/peak current limit 280 A peak \(motor's peak current\)/);
  });

  it('a point not met gives the torque shortfall, never a current headroom', () => {
    const s = sizeDrive(IPM, INV, [{ label: 'too much', speed_rpm: 10, torque_Nm: 400 }]).points[0];
    expect(s.met).toBe(false);
    expect(s.currentHeadroom_A).toBeNull();
    expect(s.voltageHeadroom_V).toBeNull();
    // shortfall = asked - available at Imax (MTPA torque at 400 A at 10 rpm, far below the voltage limit)
    expect(s.torqueShortfall_Nm!).toBeCloseTo(400 - maxTorquePoint(IPM, lim, rpmToRadS(10), 'motoring').torque, 9);
    expect(s.torqueShortfall_Nm!).toBeGreaterThan(0);
    expect(s.headroomNote).toMatch(/^short by [0-9.]+ N·m: [0-9.]+ N·m available, limited by the peak current limit 400 A peak/);
  });

  it('a point met in field weakening: voltage headroom 0 V by design, current headroom in words', () => {
    const r = sizeDrive(IPM, INV, REQS);
    const cruise = r.points[3]; // 'top', 25 N·m at 14 000 rpm: on the voltage limit
    const op = solveOperatingPoint(IPM, lim, rpmToRadS(14000), 25);
    expect(op.region).toBe('field-weakening');
    expect(op.voltage / lim.Vmax).toBeCloseTo(1, 6); // the solver's point does sit on the limit
    expect(cruise.met).toBe(true);
    expect(cruise.voltageHeadroom_V).toBe(0);
    expect(cruise.currentHeadroom_A!).toBeCloseTo(400 - op.current, 9);
    expect(cruise.headroomNote).toBe(`field weakening, current headroom ${Number((400 - op.current).toPrecision(4))} A peak (peak limit)`);
    // an MTPA point reports both headrooms
    expect(r.points[0].headroomNote).toMatch(/^current headroom [0-9.]+ A peak \(peak limit\), voltage headroom [0-9.]+ V peak phase$/);
  });
});

describe('sizing through the numeric paths of the machine model', () => {
  it('a model that hides its constant terms sizes the same to 1e-9 (Morimoto et al. (1990), IEEE Trans. Ind. Appl. 26(5): the limits of the current vector)', () => {
    const a = sizeDrive(IPM, INV, REQS);
    const b = sizeDrive(numericOnly(IPM), INV, REQS);
    expect(b.minImax === null).toBe(a.minImax === null);
    if (a.minImax !== null) expectClose(b.minImax!, a.minImax, a.minImax);
    expect(b.minVdc === null).toBe(a.minVdc === null);
    if (a.minVdc !== null) expectClose(b.minVdc!, a.minVdc, a.minVdc);
    a.points.forEach((p, i) => {
      const q = b.points[i]!;
      expect(q.met).toBe(p.met);
      expect(q.limitedBy).toBe(p.limitedBy);
      expectClose(q.current_A, p.current_A, INV.Imax);
      expectClose(q.torqueAvailable_Nm, p.torqueAvailable_Nm, Math.abs(p.torqueAvailable_Nm));
    });
  });
});
