import { describe, expect, it } from 'vitest';
import { LinearDqModel } from '../src/core/machine/linear-dq';
import { efficiencies, newPointLossScratch, PL, pointLosses } from '../src/core/steady-state/point-losses';
import { inverterLosses } from '../src/core/drive/inverter-losses';

describe('losses of one operating point', () => {
  it('copper, iron, inverter and AC power of a dq current by hand', () => {
    const m = new LinearDqModel({ polePairs: 4, Rs: 0.02, Ld: 3e-4, Lq: 7.5e-4, psiM: 0.057 });
    const inv = { Vce0: 0.8, rce: 0.002, Vf0: 0.9, rd: 0.0015, EonEoff_J: 0.022, Err_J: 0.006, Vref_V: 300, Iref_A: 200, fsw_Hz: 10000 };
    const c = { Vdc: 350, friction: { B: 0, Tc: 0 }, losses: { iron: { kh: 100, beta: 2, ke: 0.5 }, inverter: inv } };
    const sc = newPointLossScratch();
    const w = 400, id = -120, iq = 150, we = 4 * w;
    const total = pointLosses(m, c, w, id, iq, sc);
    // steady dq voltage, amplitude-invariant power 1.5 (vd id + vq iq) (Krause, Wasynczuk and Sudhoff (2002), Analysis of Electric Machinery, ch. 5)
    const psid = 3e-4 * id + 0.057, psiq = 7.5e-4 * iq;
    const vd = 0.02 * id - we * psiq, vq = 0.02 * iq + we * psid;
    expect(sc.r[PL.acPower]).toBeCloseTo(1.5 * (vd * id + vq * iq), 9);
    expect(sc.r[PL.copper]).toBeCloseTo(1.5 * 0.02 * (id * id + iq * iq), 9);
    // Steinmetz (1892) and Bertotti (1988) terms in |psi_dq| and f = we / 2 pi
    const f = we / (2 * Math.PI), psi2 = psid * psid + psiq * psiq;
    expect(sc.r[PL.iron]).toBeCloseTo(100 * f * psi2 + 0.5 * f * f * psi2, 9);
    // m = |v| / (Vdc/2), cos(phi) of v against i (common practice (no source))
    const I = Math.hypot(id, iq), V = Math.hypot(vd, vq);
    expect(sc.r[PL.modulation]).toBeCloseTo(V / 175, 12);
    expect(sc.r[PL.powerFactor]).toBeCloseTo((vd * id + vq * iq) / (I * V), 12);
    // Kolar, Ertl and Zach (1991) forms, six positions
    expect(sc.r[PL.inverter]).toBeCloseTo(inverterLosses(inv, I, V / 175, (vd * id + vq * iq) / (I * V), 350).bridge_W, 9);
    expect(total).toBeCloseTo(sc.r[PL.copper]! + sc.r[PL.iron]! + sc.r[PL.inverter]!, 9);
  });
  it('absent parts are zero; zero current has power factor 0', () => {
    const m = new LinearDqModel({ polePairs: 4, Rs: 0.02, Ld: 3e-4, Lq: 7.5e-4, psiM: 0.057 });
    const sc = newPointLossScratch();
    // common practice (no source): no data, no loss; no current, no power
    expect(pointLosses(m, { Vdc: 350, friction: { B: 0, Tc: 0 }, losses: {} }, 300, 0, 0, sc)).toBe(0);
    expect(sc.r[PL.powerFactor]).toBe(0);
    expect(sc.r[PL.acPower]).toBe(0);
  });
});

describe('efficiencies', () => {
  it('output over input, motoring and generating', () => {
    const e = new Float64Array(3);
    // IEC 60034-2-1 (2014): efficiency = output power / input power
    efficiencies(900, 950, 1000, e);
    expect([...e]).toEqual([900 / 950, 950 / 1000, 900 / 1000]);
    efficiencies(-1000, -950, -900, e);
    expect([...e]).toEqual([950 / 1000, 900 / 950, 900 / 1000]);
    // losses above the mechanical input: no electrical output, efficiency 0 (common practice (no source))
    efficiencies(-10, 5, 8, e);
    expect([...e]).toEqual([0, 0, 0]);
    efficiencies(0, 5, 8, e);
    expect([...e]).toEqual([0, 0, 0]);
  });
});
