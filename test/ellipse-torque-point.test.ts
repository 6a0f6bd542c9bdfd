import { describe, expect, it } from 'vitest';
import { EllipseTorquePoint } from '../src/core/control/ellipse-torque-point';
import { solveOperatingPointUnlimitedCurrent } from '../src/core/steady-state/operating-point';
import { maxTorquePoint } from '../src/core/steady-state/envelope';
import type { DqMachine } from '../src/core/machine/dq-machine';

const torque = (m: DqMachine, id: number, iq: number): number => 1.5 * m.polePairs * (m.psiM * iq + (m.Ld - m.Lq) * id * iq);
const voltage = (m: DqMachine, we: number, id: number, iq: number): number =>
  Math.hypot(m.Rs * id - we * m.Lq * iq, m.Rs * iq + we * (m.Ld * id + m.psiM));

// machines: an interior-magnet traction motor, a surface-magnet one (Ld = Lq), and one with a large Rs
const machines: Array<{ name: string; m: DqMachine; Vmax: number; Imax: number }> = [
  { name: 'IPM', m: { polePairs: 4, Rs: 0.02, Ld: 0.3e-3, Lq: 0.75e-3, psiM: 0.07 }, Vmax: 190, Imax: 450 },
  { name: 'SPM', m: { polePairs: 5, Rs: 0.05, Ld: 0.2e-3, Lq: 0.2e-3, psiM: 0.02 }, Vmax: 27, Imax: 120 },
  { name: 'IPM, large Rs', m: { polePairs: 3, Rs: 0.8, Ld: 4e-3, Lq: 9e-3, psiM: 0.15 }, Vmax: 300, Imax: 20 },
];

describe('least-current point of a torque on the voltage boundary (constant-parameter machine)', () => {
  for (const { name, m, Vmax, Imax } of machines) {
    it(`${name}: equals the least-current solver where field weakening binds, both torque signs`, () => {
      // reference: the operating-point solver (bisection on the current of the largest torque within
      // |i| <= I and |v| <= Vmax, Morimoto, Takeda, Hirasa, Taniguchi 1990, IEEE Trans. Ind. Appl. 26(5))
      const e = new EllipseTorquePoint(m, m.polePairs, m.Rs, Vmax);
      const wBase = Vmax / (m.polePairs * m.psiM);
      let checked = 0;
      for (const f of [0.8, 1.1, 1.5, 2.2, 3]) {
        const w = f * wBase;
        const we = m.polePairs * w;
        expect(e.setSpeed(we)).toBe(true);
        for (const dir of [1, -1] as const) {
          const top = maxTorquePoint(m, { Vmax, Imax }, w, dir > 0 ? 'motoring' : 'generating');
          if (!top.feasible || !(dir * top.torque > 0)) continue;
          for (const u of [0.1, 0.35, 0.6, 0.85, 0.99]) {
            const T = u * top.torque;
            const ref = solveOperatingPointUnlimitedCurrent(m, Vmax, w, T);
            if (!ref.feasible || ref.region === 'mtpa') continue;
            expect(e.solve(T)).toBe(true);
            const [id, iq] = [e.out[0]!, e.out[1]!];
            // common practice (no source): the point is on the boundary with the asked torque ...
            expect(Math.abs(torque(m, id, iq) - T)).toBeLessThan(1e-9 * Math.abs(top.torque));
            expect(Math.abs(voltage(m, we, id, iq) - Vmax)).toBeLessThan(1e-9 * Vmax);
            // ... and it is the solver's (to 1e-9 of Imax)
            expect(Math.abs(id - ref.id)).toBeLessThan(1e-9 * Imax);
            expect(Math.abs(iq - ref.iq)).toBeLessThan(1e-9 * Imax);
            checked++;
          }
        }
      }
      expect(checked).toBeGreaterThan(10);
    });
  }

  it('finds no point beyond the largest torque at the speed, and none without a voltage drop', () => {
    const { m, Vmax } = machines[0]!;
    const w = 3 * Vmax / (m.polePairs * m.psiM);
    const e = new EllipseTorquePoint(m, m.polePairs, m.Rs, Vmax);
    e.setSpeed(m.polePairs * w);
    const top = maxTorquePoint(m, { Vmax, Imax: Infinity }, w, 'motoring').torque;
    expect(e.solve(top * (1 - 1e-6))).toBe(true);
    expect(e.solve(top * 1.001)).toBe(false);
    // Rs = 0 at standstill: the voltage is zero for every current, there is no boundary
    const e0 = new EllipseTorquePoint(m, m.polePairs, 0, Vmax);
    expect(e0.setSpeed(0)).toBe(false);
  });
});
