import { describe, expect, it } from 'vitest';
import { zeroTorqueLinear, zeroTorqueNumeric } from '../src/core/steady-state/zero-torque';
import { solveOperatingPoint, solveOperatingPointUnlimitedCurrent } from '../src/core/steady-state/operating-point';
import { baseSpeed, maxTorquePoint } from '../src/core/steady-state/envelope';
import { machineModel } from '../src/core/machine/linear-dq';
import { SPM_CASE, demoCases, expectClose, numericOnly } from './model-paths';

const cases = [...demoCases(), SPM_CASE];

describe('zero torque at speed', () => {
  it('below the open-circuit speed: no current at all; above: |v(id, 0)| = Vmax on iq = 0 (common practice (no source))', () => {
    const c = SPM_CASE;
    const lin = machineModel(c.m);
    const w0 = c.lim.Vmax / (c.m.polePairs * c.m.psiM); // back-EMF = Vmax
    const p = zeroTorqueLinear(lin, c.m, c.lim.Vmax, 0.5 * w0)!;
    expect(p.current).toBe(0);
    expect(p.region).toBe('mtpa');
    const q = zeroTorqueLinear(lin, c.m, c.lim.Vmax, 1.5 * w0)!;
    expect(q.iq).toBe(0);
    expect(q.voltage).toBeCloseTo(c.lim.Vmax, 9);
    // by hand, Rs id² + ... : |v|² = Rs² id² + we² (L id + psiM)² = Vmax²
    const we = c.m.polePairs * 1.5 * w0;
    expect(Math.hypot(c.m.Rs * q.id, we * (c.m.Ld * q.id + c.m.psiM))).toBeCloseTo(c.lim.Vmax, 9);
  });

  it('the numeric path (line iq = 0) agrees with the closed form to 1e-9 where that line is the least current', () => {
    for (const c of cases) {
      const w0 = c.lim.Vmax / (c.m.polePairs * c.m.psiM);
      for (const f of [0.5, 1.2, 2]) {
        const a = zeroTorqueLinear(machineModel(c.m), c.m, c.lim.Vmax, f * w0)!;
        const b = zeroTorqueNumeric(numericOnly(c.m), c.lim.Vmax, f * w0, 10 * c.lim.Imax)!;
        expect(b.torque).toBe(0);
        if (a.iq !== 0) continue; // the closed form found the reluctance line better: not on iq = 0
        expectClose(b.id, a.id, c.lim.Imax);
        expectClose(b.voltage, a.voltage, c.lim.Vmax);
      }
    }
  });
});

describe('operating points through the numeric path agree with the fast path to 1e-9', () => {
  for (const c of cases) {
    it(c.name, () => {
      const num = numericOnly(c.m);
      const wb = baseSpeed(c.m, c.lim);
      const regions = new Set<string>();
      for (const f of [0, 0.5, 1.5, 2.5]) {
        const w = f * wb;
        const Tmax = maxTorquePoint(c.m, c.lim, w, 'motoring').torque;
        for (const g of [0.2, 0.6, 0.95, -0.5]) {
          const T = g * Tmax;
          const a = solveOperatingPoint(c.m, c.lim, w, T);
          const b = solveOperatingPoint(num, c.lim, w, T);
          regions.add(a.region);
          expect(b.feasible).toBe(a.feasible);
          expect(b.limitedBy).toBe(a.limitedBy);
          expect(b.region).toBe(a.region);
          expectClose(b.torque, a.torque, Math.abs(Tmax));
          expectClose(b.current, a.current, c.lim.Imax);
          expectClose(b.id, a.id, c.lim.Imax);
          expectClose(b.iq, a.iq, c.lim.Imax);
          expectClose(b.voltage, a.voltage, c.lim.Vmax);
        }
      }
      // beyond any current's reach: the same verdict
      const u = solveOperatingPointUnlimitedCurrent(num, c.lim.Vmax, 3 * wb, 1e6);
      expect(u.feasible).toBe(false);
      expect(u.limitedBy).toBe(solveOperatingPointUnlimitedCurrent(c.m, c.lim.Vmax, 3 * wb, 1e6).limitedBy);
      expect(regions.has('mtpa')).toBe(true);
      expect(regions.has('field-weakening')).toBe(true);
    });
  }
});
