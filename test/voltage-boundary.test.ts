import { describe, expect, it } from 'vitest';
import { currentOnVoltageBoundary, currentOnVoltageBoundaryLinear, currentOnVoltageBoundaryNumeric } from '../src/core/steady-state/voltage-boundary';
import { machineModel } from '../src/core/machine/linear-dq';
import { numericScratch } from '../src/core/machine/model-numeric';
import { SPM_CASE, demoCases, expectClose, numericOnly } from './model-paths';

describe('current on the voltage boundary', () => {
  it('closed form: the current gives back the voltage v = Vmax (cos phi, sin phi) (Krause, Wasynczuk and Sudhoff (2002), Analysis of Electric Machinery and Drive Systems, ch. 5: steady-state dq voltage)', () => {
    const m = { polePairs: 4, Rs: 0.03, Ld: 0.25e-3, Lq: 0.6e-3, psiM: 0.05 }; // invented
    const i = new Float64Array(2), v = new Float64Array(2);
    currentOnVoltageBoundaryLinear(m, m.Rs, 100, 2000, 2.1, i);
    // by hand: vd = Rs id - we Lq iq, vq = Rs iq + we (Ld id + psiM)
    expect(m.Rs * i[0]! - 2000 * m.Lq * i[1]!).toBeCloseTo(100 * Math.cos(2.1), 10);
    expect(m.Rs * i[1]! + 2000 * (m.Ld * i[0]! + m.psiM)).toBeCloseTo(100 * Math.sin(2.1), 10);
    machineModel(m).steadyVoltage(i[0]!, i[1]!, 2000, v);
    expect(Math.hypot(v[0]!, v[1]!)).toBeCloseTo(100, 10);
  });

  it('Newton on the steady voltage agrees with the closed form to 1e-9 on the demos and an SPM (common practice (no source): one Newton step solves an affine map)', () => {
    const s = numericScratch();
    for (const c of [...demoCases(), SPM_CASE]) {
      const lin = machineModel(c.m);
      const we = (2 * c.lim.Vmax) / c.m.psiM;
      const a = new Float64Array(2), b = new Float64Array(2), d = new Float64Array(2);
      for (let k = 0; k < 12; k++) {
        const phi = (k * Math.PI) / 6 + 0.1;
        currentOnVoltageBoundary(c.m, c.lim.Vmax, we, phi, a);
        b[0] = NaN; // not finite: starts from zero
        const its = currentOnVoltageBoundaryNumeric(lin, c.lim.Vmax, we, phi, b, s);
        expect(its).toBeGreaterThan(0);
        expect(its).toBeLessThanOrEqual(3);
        currentOnVoltageBoundary(numericOnly(c.m), c.lim.Vmax, we, phi, d);
        const scale = Math.hypot(a[0]!, a[1]!);
        for (const x of [b, d]) { expectClose(x[0]!, a[0]!, scale); expectClose(x[1]!, a[1]!, scale); }
      }
    }
  });
});
