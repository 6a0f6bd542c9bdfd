import { describe, expect, it } from 'vitest';
import { constantTorqueIq, mtpaAngle, mtpaCurrentForTorque, mtpaCurrents, mtpvLossless, mtpvPoint } from '../src/core/steady-state/mtpa';
import { constantTorqueIqNumeric, mtpaCurrentsNumeric } from '../src/core/steady-state/mtpa-numeric';
import { machineModel } from '../src/core/machine/linear-dq';
import { SPM_CASE, demoCases, expectClose, numericOnly } from './model-paths';

const cases = [...demoCases(), SPM_CASE];

describe('MTPA and MTPV: the numeric paths agree with the closed forms to 1e-9', () => {
  for (const c of cases) {
    it(`${c.name}`, () => {
      const num = numericOnly(c.m);
      const lin = machineModel(c.m);
      const I = c.lim.Imax;
      const out = new Float64Array(2);
      for (const f of [0.05, 0.3, 0.7, 1, 1.6]) {
        // Morimoto, Takeda, Hirasa, Taniguchi (1990), Expansion of operating limits for permanent magnet motor
        // by current vector control considering inverter capacity, IEEE Trans. Ind. Appl. 26(5): MTPA closed form
        const a = mtpaCurrents(c.m, f * I);
        mtpaCurrentsNumeric(lin, f * I, out);
        expectClose(out[0]!, a.id, f * I);
        expectClose(out[1]!, a.iq, f * I);
        const b = mtpaCurrents(num, f * I);
        expectClose(b.id, a.id, f * I);
        expectClose(mtpaAngle(num, f * I), mtpaAngle(c.m, f * I), Math.PI);
      }
      for (const T of [0.5, -3, 10]) {
        const a = mtpaCurrentForTorque(c.m, T);
        const b = mtpaCurrentForTorque(num, T);
        expectClose(b.current, a.current, a.current);
        expectClose(b.id, a.id, a.current);
        expectClose(b.iq, a.iq, a.current);
      }
      // the constant-torque locus: iq = T / (1.5 p (psiM + (Ld - Lq) id)), common practice (no source)
      for (const id of [0, -0.2 * I, -0.5 * I]) {
        const a = constantTorqueIq(c.m, 5, id);
        expectClose(constantTorqueIqNumeric(lin, 5, id), a, Math.abs(a));
        expectClose(constantTorqueIq(num, 5, id), a, Math.abs(a));
      }
      // MTPV at a speed well above base speed, both signs: the boundary current by Newton instead of A^-1
      const w = (3 * c.lim.Vmax) / (c.m.polePairs * c.m.psiM);
      for (const s of [1, -1] as const) {
        const a = mtpvPoint(c.m, c.lim.Vmax, w, s)!;
        const b = mtpvPoint(c.m, c.lim.Vmax, w, s, true)!;
        const n = mtpvPoint(num, c.lim.Vmax, w, s)!;
        expect(Math.sign(a.torque)).toBe(s);
        for (const x of [b, n]) {
          expectClose(x.torque, a.torque, Math.abs(a.torque));
          // the fast path stops at golden section (the angle to about sqrt(eps), where the torque is flat):
          // its currents are good to about 1e-8, the polished numeric path's to round-off
          expectClose(x.id, a.id, a.current, 1e-7);
          expectClose(x.iq, a.iq, a.current, 1e-7);
        }
        expectClose(n.id, b.id, a.current);
        expectClose(n.iq, b.iq, a.current);
      }
    });
  }

  it('lossless MTPV: the polished numeric path meets the closed form to 1e-9 (from memory: the lossless MTPV flux angle of mtpa.ts)', () => {
    for (const c of [...demoCases(), SPM_CASE]) {
      const m = { ...c.m, Rs: 0 };
      const w = (3 * c.lim.Vmax) / (m.polePairs * m.psiM);
      const cf = mtpvLossless(m, c.lim.Vmax, w);
      const n = mtpvPoint(numericOnly(m), c.lim.Vmax, w)!;
      const I = Math.hypot(cf.id, cf.iq);
      expectClose(n.torque, cf.torque, cf.torque);
      expectClose(n.id, cf.id, I);
      expectClose(n.iq, cf.iq, I);
    }
  });

  it('SPM: MTPA is id = 0 and the locus is flat in id (common practice (no source))', () => {
    const out = new Float64Array(2);
    mtpaCurrentsNumeric(numericOnly(SPM_CASE.m), 40, out);
    expect(Math.abs(out[0]!)).toBeLessThan(1e-9 * 40);
    expectClose(out[1]!, 40, 40);
    const k = 1.5 * SPM_CASE.m.polePairs * SPM_CASE.m.psiM;
    expectClose(constantTorqueIqNumeric(numericOnly(SPM_CASE.m), 3, -20), 3 / k, 3 / k);
  });

  it('no motoring point: NaN where the torque falls with iq (inverse saliency beyond -psiM/(Ld-Lq))', () => {
    // invented inverse-saliency machine: psiM + (Ld - Lq) id <= 0 for id <= -50 A (common practice (no source))
    const inv = numericOnly({ polePairs: 2, Rs: 0.1, Ld: 2e-3, Lq: 1e-3, psiM: 0.05 });
    expect(constantTorqueIqNumeric(inv, 10, -60)).toBeNaN();
    expect(constantTorqueIqNumeric(inv, 10, -40)).toBeCloseTo(10 / (1.5 * 2 * (0.05 + 1e-3 * -40)), 9);
  });
});
