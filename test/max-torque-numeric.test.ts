import { describe, expect, it } from 'vitest';
import { baseSpeed, computeEnvelope, maximumSpeed, maxTorquePoint } from '../src/core/steady-state/envelope';
import { machineModel } from '../src/core/machine/linear-dq';
import { maxTorqueNumeric, numericMaxTorqueWork, type MaxTorqueResult } from '../src/core/steady-state/max-torque-numeric';
import { SPM_CASE, demoCases, expectClose, numericOnly } from './model-paths';

// Morimoto, Takeda, Hirasa, Taniguchi (1990), Expansion of operating limits for permanent magnet motor by
// current vector control considering inverter capacity, IEEE Trans. Ind. Appl. 26(5): the largest torque
// under both limits lies on MTPA, the current circle's crossing with the voltage boundary, or MTPV. The
// generic numeric search (any flux map) must find the same point as the closed-form search on a linear machine.
const cases = [...demoCases(), SPM_CASE];

describe('max torque: the numeric path agrees with the closed-form fast path to 1e-9', () => {
  for (const c of cases) {
    it(`${c.name}: points across the speed range, both directions, base and maximum speed`, () => {
      const num = numericOnly(c.m);
      const wb = baseSpeed(c.m, c.lim);
      const wm = maximumSpeed(c.m, c.lim);
      const wn = maximumSpeed(num, c.lim);
      // unbounded (psiM/Ld below Imax) on both paths, or the same finite speed
      expect(wn === null).toBe(wm === null);
      if (wm !== null) expectClose(wn!, wm, wm);
      const wmax = wm ?? 4 * wb;
      expect(wb).toBeGreaterThan(0);
      expectClose(baseSpeed(num, c.lim), wb, wb);
      const seen = new Set<string>();
      for (const f of [0, 0.1, 0.3, 0.5, 0.7, 0.9, 0.99, 1.01]) {
        for (const dir of ['motoring', 'generating'] as const) {
          const a = maxTorquePoint(c.m, c.lim, f * wmax, dir);
          const b = maxTorquePoint(num, c.lim, f * wmax, dir);
          seen.add(a.region);
          expect(b.feasible).toBe(a.feasible);
          expect(b.region).toBe(a.region);
          const Tscale = Math.abs(maxTorquePoint(c.m, c.lim, 0, 'motoring').torque);
          expectClose(b.torque, a.torque, Tscale);
          expectClose(b.id, a.id, c.lim.Imax);
          expectClose(b.iq, a.iq, c.lim.Imax);
        }
      }
      expect(seen.has('mtpa')).toBe(true);
      expect(seen.has('field-weakening')).toBe(true);
    });
  }

  it('an envelope through the numeric path equals the fast path point by point', () => {
    const c = demoCases()[2]!;
    const a = computeEnvelope(c.m, c.lim, { points: 25 });
    const b = computeEnvelope(numericOnly(c.m), c.lim, { points: 25 });
    expect(Array.from(b.feasible)).toEqual(Array.from(a.feasible));
    expect(b.region).toEqual(a.region);
    for (let k = 0; k < 25; k++) {
      expectClose(b.speed[k]!, a.speed[k]!, a.speed[24]!);
      expectClose(b.torque[k]!, a.torque[k]!, a.torque[0]!);
      expectClose(b.voltage[k]!, a.voltage[k]!, c.lim.Vmax);
    }
    expectClose(b.characteristicCurrent, a.characteristicCurrent, 1);
  });

  it('unbounded current: the largest torque on the voltage boundary (MTPV), same as the fast path', () => {
    const c = demoCases()[2]!;
    const w = machineModel(c.m);
    const out: MaxTorqueResult = { ok: false, id: 0, iq: 0, J: 0, region: 0 };
    maxTorqueNumeric(numericOnly(c.m), c.lim.Vmax, Infinity, w.polePairs * 1500, 1, out, numericMaxTorqueWork());
    expect(out.ok).toBe(true);
    expect(out.region).toBe(2);
    const a = maxTorquePoint(c.m, { Vmax: c.lim.Vmax, Imax: 1e6 }, 1500, 'motoring');
    expectClose(out.J, a.torque, a.torque);
    expectClose(out.id, a.id, Math.abs(a.id));
  });
});
