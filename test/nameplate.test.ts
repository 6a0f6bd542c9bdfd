import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { deriveConstants, ktToPeak, nameplateToModel, psiMFromKe, type Nameplate } from '../src/core/machine/nameplate';
import { InputError } from '../src/core/base/errors';

const base = (over: Partial<Nameplate> = {}): Nameplate => ({
  poles: 8,
  R: { value: 0.42, basis: 'line-to-line' },
  Ld: { value: 2e-3, basis: 'line-to-line' },
  Lq: { value: 5e-3, basis: 'line-to-line' },
  Ke: { value: 25.6510, unit: 'V_LL_rms/krpm' },
  inertia: 1e-3,
  ...over,
});

describe('back-EMF constant', () => {
  // Worked numbers: p = 4, psiM = 0.05 Wb. At 1000 rpm omega_m = 104.7198 rad/s, omega_e = 418.879 rad/s,
  // E_ph,peak = psiM omega_e = 20.944 V, E_LL,peak = sqrt3 E_ph,peak = 36.276 V, E_LL,rms = 25.651 V.
  // Line-to-line = sqrt3 x phase and rms = peak/sqrt2 for a balanced sinusoidal set, common practice (no source).
  it('V_LL,rms/krpm, V_LL,peak/krpm and V·s/rad all give psiM = 0.05 Wb', () => {
    expect(psiMFromKe(25.65100, 'V_LL_rms/krpm', 4)).toBeCloseTo(0.05, 6);
    expect(psiMFromKe(36.27599, 'V_LL_peak/krpm', 4)).toBeCloseTo(0.05, 6);
    expect(psiMFromKe(0.05, 'V_ph_peak*s/rad', 4)).toBe(0.05);
  });

  it('V/krpm is per mechanical speed: doubling the pole pairs halves psiM', () => {
    expect(psiMFromKe(25.65100, 'V_LL_rms/krpm', 8)).toBeCloseTo(0.025, 6);
  });

  it('deriveConstants inverts psiMFromKe for every unit', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 30 }), fc.double({ min: 1e-4, max: 5, noNaN: true }), (p, psiM) => {
        const d = deriveConstants({ polePairs: p, Rs: 0.1, Ld: 1e-3, Lq: 1e-3, psiM });
        expect(psiMFromKe(d.Ke_VLLrms_per_krpm, 'V_LL_rms/krpm', p) / psiM).toBeCloseTo(1, 12);
        expect(psiMFromKe(d.Ke_VLLpeak_per_krpm, 'V_LL_peak/krpm', p) / psiM).toBeCloseTo(1, 12);
        expect(psiMFromKe(d.Ke_Vs_per_rad, 'V_ph_peak*s/rad', p) / psiM).toBeCloseTo(1, 12);
      }),
    );
  });
});

describe('deriveConstants', () => {
  const m = { polePairs: 4, Rs: 0.1, Ld: 1e-3, Lq: 2.5e-3, psiM: 0.05 };
  const d = deriveConstants(m);
  it('worked numbers', () => {
    // Kt_peak = 1.5 p psiM = 0.3 N·m/A from T = 1.5 p psiM iq (conventions page)
    expect(d.Kt_Nm_per_Apeak).toBeCloseTo(0.3, 14);
    expect(d.Kt_Nm_per_Arms).toBeCloseTo(0.3 * Math.SQRT2, 14);
    expect(d.Ke_VLLrms_per_krpm).toBeCloseTo(25.65100, 4);
    expect(d.Ke_VLLpeak_per_krpm).toBeCloseTo(36.27599, 4);
    expect(d.Ke_Vs_per_rad).toBe(0.05);
    expect(d.characteristicCurrent_A).toBeCloseTo(50, 12);
    expect(d.saliency).toBeCloseTo(2.5, 14);
    expect(d.tauD_s).toBeCloseTo(0.01, 14);
    expect(d.tauQ_s).toBeCloseTo(0.025, 14);
  });
  it('Kt[N·m/A_rms] = sqrt(3)·Ke[V_LL,rms per mechanical rad/s]', () => {
    // common practice (no source)
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 30 }), fc.double({ min: 1e-4, max: 5, noNaN: true }), (p, psiM) => {
        const c = deriveConstants({ polePairs: p, Rs: 1, Ld: 1, Lq: 1, psiM });
        const keMech = c.Ke_VLLrms_per_krpm / ((1000 * 2 * Math.PI) / 60);
        expect(c.Kt_Nm_per_Arms / (Math.sqrt(3) * keMech)).toBeCloseTo(1, 12);
      }),
    );
  });
});

describe('nameplateToModel', () => {
  it('line-to-line R and L are halved (star equivalent), poles -> pole pairs', () => {
    const r = nameplateToModel(base());
    expect(r.model.polePairs).toBe(4);
    expect(r.model.Rs).toBeCloseTo(0.21, 14);
    expect(r.model.Ld).toBeCloseTo(1e-3, 14);
    expect(r.model.Lq).toBeCloseTo(2.5e-3, 14);
    expect(r.model.psiM).toBeCloseTo(0.05, 6);
    expect(r.findings).toEqual([]);
    const rInt = r.interpretation.find((x) => x.field === 'nameplate.R');
    expect(rInt?.given).toBe('0.42 ohm line-to-line at 20 °C');
    expect(rInt?.takenAs).toContain('Rs = 0.21 ohm/phase');
    expect(r.interpretation.find((x) => x.field === 'nameplate.poles')?.takenAs).toBe('p = 4 pole pairs');
  });

  it('per-phase values are taken as they are; polePairs accepted', () => {
    const r = nameplateToModel(base({ poles: undefined, polePairs: 4, R: { value: 0.21, basis: 'phase' }, Ld: { value: 1e-3, basis: 'phase' }, Lq: undefined }));
    expect(r.model.Rs).toBe(0.21);
    expect(r.model.Ld).toBe(1e-3);
    expect(r.model.Lq).toBe(1e-3);
    expect(r.findings.map((f) => f.code)).toEqual(['spm-assumed']);
  });

  it('R at 100 °C and Ke at 80 °C are brought to 20 °C', () => {
    // R20 = R_T / (1 + 0.00393 (T - 20)) (IEC 60028); psi20 = psi_T / (1 + alpha (T - 20)) (conventions page)
    const r = nameplateToModel(base({ R: { value: 0.42, basis: 'line-to-line', temp_C: 100 }, Ke: { value: 25.65100, unit: 'V_LL_rms/krpm', temp_C: 80 } }), {
      magnetTempCoeff: -0.0012,
    });
    expect(r.model.Rs).toBeCloseTo(0.21 / 1.3144, 12);
    expect(r.model.psiM).toBeCloseTo(0.05 / (1 - 0.072), 6);
  });

  it('a consistent Kt raises no finding; a 10 % disagreement does', () => {
    // Kt_rms = sqrt(3)·Ke[V_LL,rms per mech rad/s] = 0.4243 N·m/A rms here, common practice (no source)
    const ok = nameplateToModel(base({ Kt: { value: 0.4243 * 1.03, unit: 'Nm/A_rms' } }));
    expect(ok.findings).toEqual([]);
    const okPeak = nameplateToModel(base({ Kt: { value: 0.3, unit: 'Nm/A_peak' } }));
    expect(okPeak.findings).toEqual([]);
    const bad = nameplateToModel(base({ Kt: { value: 0.4243 * 0.9, unit: 'Nm/A_rms' } }));
    expect(bad.findings.map((f) => f.code)).toEqual(['kt-ke-mismatch']);
    expect(bad.findings[0].message).toContain('disagree by -10.0 %');
    expect(bad.findings[0].message).toContain('lower through saturation');
    const high = nameplateToModel(base({ Kt: { value: 0.4243 * 1.2, unit: 'Nm/A_rms' } }));
    expect(high.findings[0].message).toContain('disagree by 20.0 %');
    expect(high.findings[0].message).toContain('reluctance torque');
    // a Kt given per rms ampere but labelled per peak ampere is off by sqrt2: caught
    const units = nameplateToModel(base({ Kt: { value: 0.4243, unit: 'Nm/A_peak' } }));
    expect(units.findings[0].code).toBe('kt-ke-mismatch');
  });

  it('Kt alone gives psiM = Kt_peak / (1.5 p)', () => {
    const r = nameplateToModel(base({ Ke: undefined, Kt: { value: 0.6, unit: 'Nm/A_peak' } }));
    expect(r.model.psiM).toBeCloseTo(0.1, 14);
    expect(r.findings.map((f) => f.code)).toEqual(['psim-from-kt']);
  });

  it('currents rms -> peak, speed rpm -> rad/s', () => {
    const r = nameplateToModel(base({ ratedCurrent: { value: 10, basis: 'rms' }, peakCurrent: { value: 30, basis: 'peak' }, ratedSpeed_rpm: 3000, ratedTorque_Nm: 4 }));
    expect(r.rated.current_A).toBeCloseTo(14.142136, 5);
    expect(r.rated.peakCurrent_A).toBe(30);
    expect(r.rated.speed_rad_s).toBeCloseTo(314.159265, 5);
    expect(r.rated.torque_Nm).toBe(4);
  });

  it('synchronous inductance L for a surface-magnet motor', () => {
    const r = nameplateToModel(base({ Ld: undefined, Lq: undefined, L: { value: 3e-3, basis: 'line-to-line' } }));
    expect(r.model.Ld).toBeCloseTo(1.5e-3, 15);
    expect(r.model.Lq).toBeCloseTo(1.5e-3, 15);
  });

  it('contradictions throw InputError naming the field', () => {
    expect(() => nameplateToModel(base({ poles: 7 }))).toThrow('nameplate.poles must be an even whole number');
    expect(() => nameplateToModel(base({ polePairs: 3 }))).toThrow(InputError);
    expect(() => nameplateToModel(base({ poles: undefined }))).toThrow('nameplate.poles is required');
    expect(() => nameplateToModel(base({ Ke: undefined }))).toThrow('nameplate.Ke is required');
    expect(() => nameplateToModel(base({ L: { value: 1e-3, basis: 'phase' } }))).toThrow('nameplate.L');
    expect(() => nameplateToModel(base({ R: { value: -1, basis: 'phase' } }))).toThrow('nameplate.R.value must be > 0 ohm');
    expect(() => nameplateToModel(base(), { path: 'x' })).not.toThrow();
  });
});

describe('no NaN escapes', () => {
  it('any valid nameplate gives a finite model and finite derived constants', () => {
    const pos = (min: number, max: number) => fc.double({ min, max, noNaN: true, noDefaultInfinity: true });
    const b = fc.constantFrom('phase' as const, 'line-to-line' as const);
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 50 }),
        pos(1e-4, 100), b, pos(1e-7, 1), b, fc.option(pos(1e-7, 1), { nil: undefined }),
        pos(1e-3, 1e4), fc.constantFrom('V_LL_rms/krpm' as const, 'V_LL_peak/krpm' as const, 'V_ph_peak*s/rad' as const),
        pos(-60, 250), pos(-60, 250),
        (pp, R, rb, Ld, lb, Lq, ke, unit, tR, tKe) => {
          const r = nameplateToModel({
            poles: 2 * pp,
            R: { value: R, basis: rb, temp_C: tR },
            Ld: { value: Ld, basis: lb },
            ...(Lq !== undefined ? { Lq: { value: Lq, basis: lb } } : {}),
            Ke: { value: ke, unit, temp_C: tKe },
            Kt: { value: 1, unit: 'Nm/A_rms' },
            inertia: 1e-3,
          });
          for (const v of Object.values(r.model)) expect(Number.isFinite(v)).toBe(true);
          for (const v of Object.values(deriveConstants(r.model))) expect(Number.isFinite(v)).toBe(true);
          for (const f of r.findings) expect(f.message).not.toContain('NaN');
          for (const i of r.interpretation) expect(i.takenAs).not.toContain('NaN');
        },
      ),
    );
  });
});
