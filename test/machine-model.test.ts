import { describe, expect, it } from 'vitest';
import { LinearDqModel, machineModel } from '../src/core/machine/linear-dq';
import { isMachineModel } from '../src/core/machine/machine-model';
import { currentFromFluxNumeric, incrementalInductanceNumeric, numericScratch, steadyVoltageFromFlux, torqueFromFlux } from '../src/core/machine/model-numeric';

// An invented interior-magnet machine (not a product's data).
const ipm = { polePairs: 4, Rs: 0.03, Ld: 0.25e-3, Lq: 0.6e-3, psiM: 0.05 };
const rel = (a: number, b: number): number => Math.abs(a - b) / Math.max(1, Math.abs(b));

describe('the linear dq machine model', () => {
  const m = new LinearDqModel(ipm);
  const f = new Float64Array(2);
  const v = new Float64Array(2);
  const L = new Float64Array(4);
  const s = numericScratch();

  it('flux, torque and voltage are the textbook dq forms', () => {
    // Krause, Wasynczuk and Sudhoff (2002), Analysis of Electric Machinery and Drive Systems, ch. 5:
    // psi_d = Ld id + psiM, psi_q = Lq iq; T = 1.5 p (psiM iq + (Ld - Lq) id iq); by hand at id = -100, iq = 200:
    m.flux(-100, 200, f);
    expect(f[0]).toBeCloseTo(0.25e-3 * -100 + 0.05, 15); // 0.025 Wb
    expect(f[1]).toBeCloseTo(0.12, 15);
    // 1.5·4·200·(0.05 + (0.25e-3 - 0.6e-3)·(-100)) = 1200·0.085 = 102 N·m
    expect(m.torque(-100, 200)).toBeCloseTo(102, 10);
    // vd = Rs id - we Lq iq = -3 - 1000·0.12 = -123; vq = Rs iq + we psi_d = 6 + 25 = 31 at we = 1000 rad/s
    m.steadyVoltage(-100, 200, 1000, v);
    expect(v[0]).toBeCloseTo(-123, 10);
    expect(v[1]).toBeCloseTo(31, 10);
    expect(m.linear).toEqual({ Ld: ipm.Ld, Lq: ipm.Lq, psiM: ipm.psiM });
  });

  it('the generic numeric paths agree with the closed forms to 1e-9 (common practice (no source): central differences are exact on an affine map)', () => {
    for (const [id, iq, we] of [[-100, 200, 1000], [0, 0, 0], [-350, -120, -2500], [40, 5, 300]] as const) {
      expect(rel(torqueFromFlux(m, id, iq, s), m.torque(id, iq))).toBeLessThan(1e-9);
      steadyVoltageFromFlux(m, id, iq, we, v, s);
      const v2 = new Float64Array(2);
      m.steadyVoltage(id, iq, we, v2);
      expect(rel(v[0]!, v2[0]!)).toBeLessThan(1e-9);
      expect(rel(v[1]!, v2[1]!)).toBeLessThan(1e-9);
      incrementalInductanceNumeric(m, id, iq, 1, L, s);
      expect(Math.abs(L[0]! - ipm.Ld)).toBeLessThan(1e-9 * ipm.Ld);
      expect(Math.abs(L[3]! - ipm.Lq)).toBeLessThan(1e-9 * ipm.Lq);
      expect(Math.abs(L[1]!)).toBeLessThan(1e-15);
      expect(Math.abs(L[2]!)).toBeLessThan(1e-15);
      // the inverse: the closed form and Newton from a zero guess give back the current
      m.flux(id, iq, f);
      const c = new Float64Array(2);
      m.current(f[0]!, f[1]!, c);
      expect(rel(c[0]!, id)).toBeLessThan(1e-9);
      expect(rel(c[1]!, iq)).toBeLessThan(1e-9);
      const n = new Float64Array(2);
      const its = currentFromFluxNumeric(m, f[0]!, f[1]!, n, s);
      expect(its).toBeGreaterThan(0);
      expect(its).toBeLessThanOrEqual(2); // one Newton step solves an affine map; the second confirms
      expect(rel(n[0]!, id)).toBeLessThan(1e-9);
      expect(rel(n[1]!, iq)).toBeLessThan(1e-9);
    }
  });

  it('Newton on a saturating flux converges to the current that makes it (from memory: psi = a·atan(i/b) is a common saturation sketch)', () => {
    const sat = {
      polePairs: 4, Rs: 0.03, linear: null,
      flux(id: number, iq: number, out: Float64Array) { out[0] = 0.05 + 0.1 * Math.atan(id / 400); out[1] = 0.3 * Math.atan(iq / 500) * (1 - 1e-4 * Math.abs(id)); },
      torque(id: number, iq: number) { return torqueFromFlux(this, id, iq, numericScratch()); },
      steadyVoltage(id: number, iq: number, we: number, out: Float64Array) { steadyVoltageFromFlux(this, id, iq, we, out, numericScratch()); },
      incrementalInductance(id: number, iq: number, out: Float64Array) { incrementalInductanceNumeric(this, id, iq, 1e-3, out, numericScratch()); },
      current(psid: number, psiq: number, out: Float64Array) { out[0] = 0; out[1] = 0; currentFromFluxNumeric(this, psid, psiq, out, numericScratch()); },
    };
    expect(isMachineModel(sat)).toBe(true);
    sat.flux(-150, 320, f);
    const c = new Float64Array(2);
    sat.current(f[0]!, f[1]!, c);
    expect(c[0]).toBeCloseTo(-150, 6);
    expect(c[1]).toBeCloseTo(320, 6);
  });

  it('machineModel wraps constant terms and keeps a model as it is', () => {
    const w = machineModel(ipm);
    expect(w).toBeInstanceOf(LinearDqModel);
    expect(machineModel(w)).toBe(w);
    expect(isMachineModel(ipm)).toBe(false);
  });
});

describe('the magnet terms at zero current', () => {
  it('are psiM and Ld for the linear model', async () => {
    const { zeroCurrentTerms } = await import('../src/core/machine/model-numeric');
    // Krause, Wasynczuk and Sudhoff (2002): psi_d = Ld id + psiM is psiM at id = 0, d psi_d / d id = Ld
    expect(zeroCurrentTerms(new LinearDqModel(ipm))).toEqual({ psi0: ipm.psiM, Ld0: ipm.Ld });
  });
});
