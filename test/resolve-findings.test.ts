// Findings of a resolved machine against its drive (src/core/project/resolve-findings.ts), on
// invented machines. Surface-magnet torque T = 1.5 p psiM iq and the rms of a sinusoid peak/sqrt(2):
// Krause, Wasynczuk, Sudhoff (2013), "Analysis of Electric Machinery and Drive Systems", 3rd ed.
import { describe, expect, it } from 'vitest';
import { oddMachineFindings, ratedFindings } from '../src/core/project/resolve-findings';
import type { InverterSpec } from '../src/core/drive/inverter-spec';
import type { DqMachine } from '../src/core/machine/dq-machine';

const spm: DqMachine = { polePairs: 4, Rs: 0.05, Ld: 1e-4, Lq: 1e-4, psiM: 0.01 };
const inv: InverterSpec = { Vdc: 48, Imax: 15, Icont: 12, modulation: 'svpwm', voltageUtilization: 1, deviceDrop: 0 };
const peak = { Vmax: 48 / Math.sqrt(3), Imax: 15 };
const still = { inertia: 1e-4, viscousFriction: 0, coulombFriction: 0 };
const codes = (f: Array<{ code: string }>) => f.map((x) => x.code);

describe('ratedFindings', () => {
  it('a rated current above Imax, in A peak and rms', () => {
    const f = ratedFindings({ current_A: 20 }, spm, inv, peak, 'motor');
    expect(codes(f)).toEqual(['rated-current-above-imax']);
    expect(f[0]!.message).toBe("The motor's rated current 20 A peak (14.14 A rms) is above the inverter's peak current 15 A peak (10.61 A rms): the motor cannot reach its rated torque on this inverter.");
    expect(f[0]!.field).toBe('motor.ratedCurrent');
  });

  it('an inverter above the motor peak current (danger) and above its rated current (1 % allowed for rounding)', () => {
    const f = ratedFindings({ current_A: 10, peakCurrent_A: 14 }, spm, inv, peak, 'nameplate');
    expect(codes(f)).toEqual(['imax-above-motor-peak', 'icont-above-motor-rated']);
    expect(f[0]!.severity).toBe('danger');
    expect(ratedFindings({ current_A: 11.9, peakCurrent_A: 14.9 }, spm, inv, peak, 'motor')).toEqual([]);
  });

  it('a rated point out of reach at the hot corner: 1 N·m at 30000 rpm needs more than the bus', () => {
    const f = ratedFindings({ speed_rad_s: (30000 * Math.PI) / 30, torque_Nm: 1 }, spm, inv, peak, 'nameplate');
    expect(codes(f)).toEqual(['rated-point-infeasible']);
    expect(f[0]!.message).toMatch(/^The rated point \(1 N·m at 30000 rpm\) is outside this inverter at the hot corner: /);
  });
});

describe('oddMachineFindings', () => {
  it('a lossless winding and inverse saliency (Lq/Ld = 0.5)', () => {
    const m = { ...spm, Rs: 0, Ld: 2e-4, Lq: 1e-4 };
    const f = oddMachineFindings('motor', m, m, still, peak, []);
    expect(codes(f)).toEqual(['lossless-winding', 'inverse-saliency']);
    expect(f[1]!.message).toContain('Lq/Ld = 0.5');
  });

  it('a reluctance machine says so', () => {
    const m = { ...spm, psiM: 0, Lq: 3e-4 };
    expect(codes(oddMachineFindings('nameplate', m, m, still, peak, []))).toEqual(['reluctance-machine']);
  });

  it('Imax below friction: 1.5 p psiM Imax = 0.06 N·m at 1 A against 0.1 N·m', () => {
    const f = oddMachineFindings('motor', spm, spm, { ...still, coulombFriction: 0.1 }, { ...peak, Imax: 1 }, []);
    expect(codes(f)).toEqual(['imax-below-friction']);
    expect(f[0]!.message).toBe('At Imax 1 A peak the motor makes at most 0.06 N·m (hot corner), below its Coulomb friction 0.1 N·m: it cannot start even without load.');
  });

  it('a bus that reaches no requirement; one reachable point is enough', () => {
    const stiff = { ...spm, Ld: 1e-5, Lq: 1e-5 }; // psiM/Ld = 1000 A, far beyond Imax: a bounded speed
    const far = { speed_rpm: 30000, torque_Nm: 0.5 };
    const f = oddMachineFindings('motor', stiff, stiff, still, peak, [far]);
    expect(codes(f)).toEqual(['bus-reaches-no-requirement']);
    expect(f[0]!.message).toMatch(/^No requirement is reachable at the hot corner \(1 of 1 fail on the voltage limit 27\.71 V peak phase\)/);
    expect(oddMachineFindings('motor', stiff, stiff, still, peak, [far, { speed_rpm: 100, torque_Nm: 0.5 }])).toEqual([]);
  });
});
