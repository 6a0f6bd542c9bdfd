import { describe, expect, it } from 'vitest';
import type { DqMachine } from '../src/core/machine/dq-machine';
import type { InverterSpec } from '../src/core/drive/inverter-spec';
import { SAFETY_CAUTION, safetyReport } from '../src/core/steady-state/safety';
import { rpmToRadS } from '../src/core/base/units';
import { InputError } from '../src/core/base/errors';
import { numericOnly } from './model-paths';

// Invented test machine and inverter.
const COLD: DqMachine = { polePairs: 4, Rs: 0.015, Ld: 0.12e-3, Lq: 0.3e-3, psiM: 0.05 };
const INV: InverterSpec = { Vdc: 350, Imax: 400, Icont: 250, modulation: 'svpwm', voltageUtilization: 1, deviceDrop: 0 };

describe('safety report', () => {
  it('says when the speed checked is only the top of the plotted range', () => {
    const w = rpmToRadS(12000);
    const given = safetyReport(COLD, INV, w).findings.find((f) => f.code === 'back-emf-above-bus')!;
    expect(given.message).not.toMatch(/No maximum speed is given/);
    const guessed = safetyReport(COLD, INV, w, false).findings.find((f) => f.code === 'back-emf-above-bus')!;
    expect(guessed.message).toMatch(/No maximum speed is given \(motor\.maxSpeed_rpm or nameplate\.maxSpeed_rpm\): 12000 rpm is only the top of the plotted range/);
  });

  it('back-EMF, uncontrolled-generator speed and characteristic current by hand formula', () => {
    const w = rpmToRadS(12000);
    const r = safetyReport(COLD, INV, w);
    // common practice (no source): line-to-line peak = sqrt(3) x phase peak = sqrt(3) p omega psiM
    const emf = Math.sqrt(3) * 4 * w * 0.05; // 12000 rpm = 1256.6 rad/s -> 435.3 V
    expect(r.backEmfLineLinePeak_V).toBeCloseTo(emf, 9);
    expect(r.backEmfLineLinePeak_V).toBeCloseTo(435.28, 1);
    expect(r.exceedsBus).toBe(true);
    expect(r.uncontrolledGeneratorSpeed_rad_s).toBeCloseTo(350 / (Math.sqrt(3) * 4 * 0.05), 9);
    expect(r.characteristicCurrent_A).toBeCloseTo(0.05 / 0.12e-3, 9);
    expect(r.findings.find((f) => f.code === 'back-emf-above-bus')?.severity).toBe('danger');
    expect(r.findings.some((f) => f.code === 'field-weakening-trip-braking')).toBe(false); // 416.7 A > 400 A
    expect(r.findings.find((f) => f.code === 'short-circuit-current-above-imax')?.severity).toBe('warning');
    expect(r.caution).toBe(SAFETY_CAUTION);
    expect(r.caution).toMatch(/IEC 61800-5-1/);
    expect(r.caution).toMatch(/local codes/);
  });

  it('below the bus: no danger; characteristic current below Imax warns of braking after a trip', () => {
    const m = { ...COLD, psiM: 0.04 }; // psiM/Ld = 333 A < 400 A
    const r = safetyReport(m, INV, rpmToRadS(6000));
    expect(r.backEmfLineLinePeak_V).toBeCloseTo(Math.sqrt(3) * 4 * rpmToRadS(6000) * 0.04, 9);
    expect(r.exceedsBus).toBe(false);
    expect(r.findings.some((f) => f.severity === 'danger')).toBe(false);
    expect(r.findings.find((f) => f.code === 'field-weakening-trip-braking')?.message).toMatch(/braking current/);
  });

  it('a reluctance machine makes no back-EMF', () => {
    const r = safetyReport({ ...COLD, psiM: 0 }, INV, 1000);
    expect(r.backEmfLineLinePeak_V).toBe(0);
    expect(r.uncontrolledGeneratorSpeed_rad_s).toBeNull();
    expect(r.exceedsBus).toBe(false);
  });

  it('rejects bad input', () => {
    expect(() => safetyReport(COLD, INV, -1)).toThrow(InputError);
    expect(() => safetyReport(COLD, { ...INV, Vdc: 0 }, 1)).toThrow(/inverter.Vdc/);
  });
});

describe('safety figures from the machine model', () => {
  it('back-EMF and characteristic current come from the flux at zero current: a model hiding its constant terms gives the same report (common practice (no source): open-circuit back-EMF = we psi(0))', () => {
    const w = rpmToRadS(12000);
    const a = safetyReport(COLD, INV, w);
    const b = safetyReport(numericOnly(COLD), INV, w);
    expect(b).toEqual(a);
    // by hand: sqrt(3) · 4 · 1256.6 rad/s · 0.05 Wb = 435.3 V line-to-line peak; psiM/Ld = 416.7 A peak
    expect(b.backEmfLineLinePeak_V).toBeCloseTo(Math.sqrt(3) * 4 * w * 0.05, 9);
    expect(b.characteristicCurrent_A).toBeCloseTo(0.05 / 0.12e-3, 9);
  });
});
