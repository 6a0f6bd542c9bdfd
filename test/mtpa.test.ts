import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import type { DqMachine } from '../src/core/machine/dq-machine';
import {
  assertMachine, mtpaAngle, mtpaCurrentForTorque, mtpaCurrents, mtpaTorque, mtpvLossless, mtpvPoint, torqueOf, constantTorqueIq,
} from '../src/core/steady-state/mtpa';
import { InputError } from '../src/core/base/errors';

// Invented test machines.
const IPM: DqMachine = { polePairs: 4, Rs: 0.02, Ld: 0.12e-3, Lq: 0.3e-3, psiM: 0.045 };
const SPM: DqMachine = { polePairs: 7, Rs: 0.1, Ld: 0.4e-3, Lq: 0.4e-3, psiM: 0.02 };
const INVERSE: DqMachine = { polePairs: 2, Rs: 0.05, Ld: 0.6e-3, Lq: 0.3e-3, psiM: 0.05 };
const RELUCTANCE: DqMachine = { polePairs: 2, Rs: 0.1, Ld: 0.2e-3, Lq: 1.2e-3, psiM: 0 };

/** best torque along the current circle by a fine angle search (test only) */
function bestOnCircle(m: DqMachine, I: number): { id: number; iq: number; T: number } {
  let best = { id: 0, iq: 0, T: -Infinity };
  const n = 200000;
  for (let k = 0; k <= n; k++) {
    const t = (Math.PI * k) / n;
    const id = I * Math.cos(t), iq = I * Math.sin(t);
    const T = torqueOf(m, id, iq);
    if (T > best.T) best = { id, iq, T };
  }
  return best;
}

describe('MTPA', () => {
  it('matches the closed-form MTPA current of an interior PM motor', () => {
    // Morimoto, Takeda, Hirasa, Taniguchi, 1990, Expansion of operating limits for permanent magnet
    // motor by current vector control considering inverter capacity; Jahns, Kliman, Neumann, 1986,
    // Interior permanent-magnet synchronous motors for adjustable-speed drives:
    // id = (psiM - sqrt(psiM² + 8 (Lq - Ld)² I²)) / (4 (Lq - Ld))
    for (const I of [10, 100, 250, 400, 1000]) {
      const dL = IPM.Lq - IPM.Ld;
      const id = (IPM.psiM - Math.sqrt(IPM.psiM ** 2 + 8 * dL * dL * I * I)) / (4 * dL);
      const c = mtpaCurrents(IPM, I);
      expect(c.id).toBeCloseTo(id, 10);
      expect(Math.hypot(c.id, c.iq)).toBeCloseTo(I, 10);
      expect(mtpaAngle(IPM, I)).toBeCloseTo(Math.atan2(Math.sqrt(I * I - id * id), id), 12);
      // and it is the torque maximum along the current circle (dense angle search, test only)
      const b = bestOnCircle(IPM, I);
      expect(mtpaTorque(IPM, I)).toBeGreaterThanOrEqual(b.T * (1 - 1e-12));
      expect(c.id).toBeCloseTo(b.id, 1);
    }
  });

  it('SPM: id = 0; reluctance: 45 degrees; inverse saliency: id > 0', () => {
    // common practice (no source)
    expect(mtpaCurrents(SPM, 30)).toEqual({ id: 0, iq: 30 });
    const r = mtpaCurrents(RELUCTANCE, 50);
    expect(r.id).toBeCloseTo(-50 / Math.SQRT2, 10);
    expect(r.iq).toBeCloseTo(50 / Math.SQRT2, 10);
    const inv = mtpaCurrents(INVERSE, 200);
    expect(inv.id).toBeGreaterThan(0);
    expect(mtpaTorque(INVERSE, 200)).toBeGreaterThanOrEqual(bestOnCircle(INVERSE, 200).T * (1 - 1e-12));
  });

  it('stays exact as Lq -> Ld (no cancellation)', () => {
    const m = { ...SPM, Lq: SPM.Ld * (1 + 1e-12) };
    const c = mtpaCurrents(m, 30);
    expect(Number.isFinite(c.id)).toBe(true);
    expect(Math.abs(c.id)).toBeLessThan(1e-9);
  });

  it('least current for a torque, sign respected', () => {
    for (const m of [IPM, SPM, INVERSE, RELUCTANCE]) {
      for (const T of [0.5, 10, 150, -40]) {
        const r = mtpaCurrentForTorque(m, T);
        expect(torqueOf(m, r.id, r.iq)).toBeCloseTo(T, 8);
        expect(Math.sign(r.iq)).toBe(Math.sign(T));
        expect(Math.hypot(r.id, r.iq)).toBeCloseTo(r.current, 9);
        // a slightly smaller current cannot make that torque on any angle
        expect(bestOnCircle(m, r.current * 0.999).T).toBeLessThan(Math.abs(T));
      }
    }
    expect(mtpaCurrentForTorque(IPM, 0)).toEqual({ id: 0, iq: 0, current: 0 });
    // SPM closed form: I = T / (1.5 p psiM); common practice (no source)
    expect(mtpaCurrentForTorque(SPM, 3).current).toBeCloseTo(3 / (1.5 * 7 * 0.02), 10);
  });

  it('rejects machines that make no torque, and bad fields, with InputError', () => {
    expect(() => assertMachine({ ...SPM, psiM: 0 })).toThrow(InputError);
    expect(() => assertMachine({ ...SPM, polePairs: 2.5 })).toThrow(/motor.polePairs/);
    expect(() => assertMachine({ ...SPM, Rs: -1 })).toThrow(/motor.Rs must be >= 0 ohm/);
    expect(() => mtpaCurrentForTorque(SPM, Number.POSITIVE_INFINITY)).toThrow(InputError);
  });

  it('property: finite, within the current, torque rising with current', () => {
    fc.assert(fc.property(
      fc.double({ min: 1e-5, max: 1e-2, noNaN: true }), fc.double({ min: 0.2, max: 6, noNaN: true }),
      fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: 0, max: 2000, noNaN: true }),
      (Ld, ratio, psiM, I) => {
        const m: DqMachine = { polePairs: 3, Rs: 0, Ld, Lq: Ld * ratio, psiM };
        const c = mtpaCurrents(m, I);
        expect(Number.isFinite(c.id) && Number.isFinite(c.iq)).toBe(true);
        expect(Math.hypot(c.id, c.iq)).toBeLessThanOrEqual(I * (1 + 1e-12) + 1e-300);
        expect(mtpaTorque(m, I * 1.01 + 1e-9)).toBeGreaterThanOrEqual(mtpaTorque(m, I));
      }), { numRuns: 300 });
  });
});

describe('MTPV', () => {
  it('with Rs = 0 the numerical MTPV matches the closed form', () => {
    // from memory: the lossless MTPV flux angle, derived in the mtpa.ts comment
    for (const m of [{ ...IPM, Rs: 0 }, { ...INVERSE, Rs: 0 }, { ...RELUCTANCE, Rs: 0 }, { ...SPM, Rs: 0 }]) {
      for (const w of [500, 2000]) {
        const num = mtpvPoint(m, 200, w)!;
        const cf = mtpvLossless(m, 200, w);
        expect(num.torque / cf.torque).toBeCloseTo(1, 10);
        expect(num.id).toBeCloseTo(cf.id, 4);
        expect(num.iq).toBeCloseTo(cf.iq, 4);
      }
    }
    // SPM lossless MTPV: id = -psiM/L (common practice, no source)
    expect(mtpvLossless({ ...SPM, Rs: 0 }, 50, 3000).id).toBeCloseTo(-SPM.psiM / SPM.Ld, 9);
  });

  it('with Rs the MTPV point lies on |v| = Vmax and beats its neighbours there', () => {
    const w = 3000, Vmax = 200;
    const p = mtpvPoint(IPM, Vmax, w)!;
    const we = IPM.polePairs * w;
    const v = Math.hypot(IPM.Rs * p.id - we * IPM.Lq * p.iq, IPM.Rs * p.iq + we * (IPM.Ld * p.id + IPM.psiM));
    expect(v / Vmax).toBeCloseTo(1, 12);
    // Rs changes the answer: the lossless formula is only a check
    expect(Math.abs(p.torque - mtpvLossless(IPM, Vmax, w).torque)).toBeGreaterThan(1e-3);
    const neg = mtpvPoint(IPM, Vmax, w, -1)!;
    expect(neg.torque).toBeLessThan(0);
    expect(-neg.torque).toBeGreaterThan(p.torque); // generating is helped by the Rs drop
    expect(mtpvPoint({ ...IPM, Rs: 0 }, Vmax, 0)).toBeNull();
  });
});

describe('constant-torque locus', () => {
  it('gives back the torque through the torque equation, and NaN where no motoring point exists', () => {
    // T = 1.5 p (psiM iq + (Ld - Lq) id iq), the conventions page's torque (common practice (no source))
    const m = { polePairs: 4, Rs: 0.02, Ld: 1.2e-4, Lq: 3e-4, psiM: 0.045 };
    for (const id of [-400, -150, 0, 50]) {
      const iq = constantTorqueIq(m, 120, id);
      expect(torqueOf(m, id, iq)).toBeCloseTo(120, 9);
    }
    // inverse saliency (Ld > Lq): psiM + (Ld - Lq) id <= 0 for id <= -psiM / (Ld - Lq) = -50 A
    const inv = { polePairs: 2, Rs: 0.1, Ld: 2e-3, Lq: 1e-3, psiM: 0.05 };
    expect(constantTorqueIq(inv, 10, -60)).toBeNaN();
  });
});
