import { describe, expect, it } from 'vitest';
import { FluxMapModel } from '../src/core/machine/flux-map';
import { apparentInductances } from '../src/core/machine/flux-map-checks';
import { LinearDqModel } from '../src/core/machine/linear-dq';
import { INVENTED_IPM_SATURATION, SaturationModel } from '../src/core/machine/saturation-model';
import { evenGrid, sampleFluxMap } from '../src/core/machine/sample-flux-map';
import { computeEnvelope, maxTorquePoint } from '../src/core/steady-state/envelope';
import { solveOperatingPoint } from '../src/core/steady-state/operating-point';
import { mtpaCurrentForTorque, mtpvPoint } from '../src/core/steady-state/mtpa';
import { sizeDrive } from '../src/core/steady-state/sizing';
import { demoCases, expectClose } from './model-paths';

// The invented saturating IPM (Hinkkanen, Pescetto, Mölsä, Saarakkala, Pellegrino, Bojoi (2017),
// Sensorless self-commissioning of synchronous reluctance motors at standstill without rotor locking,
// IEEE Trans. Ind. Appl. 53(3), with the magnet as a d-axis current), on a 350 V bus with 450 A peak.
const sat = new SaturationModel(INVENTED_IPM_SATURATION, 4, 0.02);
const lim = { Vmax: 190, Imax: 450 };
const map41 = sampleFluxMap(sat, evenGrid(-540, 540, 41), evenGrid(0, 540, 41), 20);

describe('envelope on a 41 x 41 flux map against the continuous saturation model evaluated exactly', () => {
  for (const direction of ['motoring', 'generating'] as const) {
    it(`${direction}: torque within 0.5 % at 20 speeds across MTPA, field weakening and MTPV (Morimoto et al. (1990), IEEE Trans. Ind. Appl. 26(5): the three regions)`, () => {
      const fm = new FluxMapModel(map41, 4, 0.02);
      // 0..6000 rpm: MTPA up to about 2500 rpm, field weakening to about 3800 rpm, MTPV above
      const opts = { points: 20, direction, speedMax: (6000 * Math.PI) / 30 };
      const exact = computeEnvelope(sat, lim, opts);
      const fromMap = computeEnvelope(fm, lim, opts);
      const regions = new Set(exact.region);
      expect([...regions].sort()).toEqual(['field-weakening', 'mtpa', 'mtpv']);
      let worst = 0;
      for (let k = 0; k < 20; k++) {
        expect(Math.sign(exact.torque[k]!)).toBe(direction === 'motoring' ? 1 : -1);
        worst = Math.max(worst, Math.abs(fromMap.torque[k]! - exact.torque[k]!) / Math.abs(exact.torque[k]!));
        expect(fromMap.region[k]).toBe(exact.region[k]);
      }
      expect(worst).toBeLessThan(0.005);
      // the saturation matters: constant inductances from the zero-current terms overstate peak torque by > 10 %
      const a = apparentInductances(sat, 0, 0);
      const unsat = new LinearDqModel({ polePairs: 4, Rs: 0.02, Ld: a.incremental[0], Lq: a.incremental[3], psiM: a.psiM });
      expect(Math.abs(computeEnvelope(unsat, lim, opts).torque[0]!)).toBeGreaterThan(1.1 * Math.abs(exact.torque[0]!));
    });
  }
});

describe('sizing and MTPV on the 41 x 41 map against the saturation model itself (Morimoto et al. (1990), IEEE Trans. Ind. Appl. 26(5))', () => {
  it('least peak current, continuous current and bus within 0.1 %; the MTPV point within 0.1 % of Imax', () => {
    const fm = new FluxMapModel(map41, 4, 0.02);
    const inv = { Vdc: 350, Imax: 450, Icont: 226, modulation: 'svpwm' as const, voltageUtilization: 0.95, deviceDrop: 1 };
    const reqs = [
      { label: 'hill start', speed_rpm: 500, torque_Nm: 250 },
      { label: 'rated', speed_rpm: 3000, torque_Nm: 90, duty: 'continuous' as const },
      { label: 'field weakening', speed_rpm: 3500, torque_Nm: 160 },
      { label: 'braking', speed_rpm: 6000, torque_Nm: -60 },
      { label: 'top speed', speed_rpm: 12000, torque_Nm: 41 },
    ];
    const a = sizeDrive(sat, inv, reqs), b = sizeDrive(fm, inv, reqs);
    expect(a.minImax).not.toBeNull();
    expect(Math.abs(b.minImax! - a.minImax!) / a.minImax!).toBeLessThan(1e-3);
    expect(Math.abs(b.minIcont! - a.minIcont!) / a.minIcont!).toBeLessThan(1e-3);
    expect(Math.abs(b.minVdc! - a.minVdc!) / a.minVdc!).toBeLessThan(1e-3);
    b.points.forEach((p, k) => expect(p.met).toBe(a.points[k]!.met));
    const w = (10000 * Math.PI) / 30;
    const pa = mtpvPoint(sat, 190, w, 1, true)!, pb = mtpvPoint(fm, 190, w, 1, true)!;
    expect(Math.abs(pb.id - pa.id) + Math.abs(pb.iq - pa.iq)).toBeLessThan(0.45);
    expect(Math.abs(pb.torque - pa.torque) / pa.torque).toBeLessThan(1e-3);
  });
});

describe('a flux map generated from constant Ld, Lq, psiM gives the closed forms\' results within 1e-6 (common practice (no source): the interpolant is exact on affine data)', () => {
  const trac = demoCases().find((c) => c.name === 'demo-ipm-traction')!;
  const { m } = trac;
  const I = 1.2 * trac.lim.Imax;
  const ids = evenGrid(-I, I, 41), iqs = evenGrid(0, I, 41);
  const data = {
    magnetTemp_C: 20, id_A: ids, iq_A: iqs,
    psid_Wb: ids.map((id) => iqs.map(() => m.Ld * id + m.psiM)),
    psiq_Wb: ids.map(() => iqs.map((iq) => m.Lq * iq)),
  };
  const fm = new FluxMapModel(data, m.polePairs, m.Rs);

  it('envelope, motoring and generating, 60 speeds', () => {
    for (const direction of ['motoring', 'generating'] as const) {
      const a = computeEnvelope(m, trac.lim, { points: 60, direction });
      const b = computeEnvelope(fm, trac.lim, { points: 60, direction, speedMax: a.speed[59] });
      const scale = Math.abs(a.torque[0]!);
      for (let k = 0; k < 60; k++) {
        expectClose(b.torque[k]!, a.torque[k]!, scale, 1e-6);
        expectClose(b.id[k]!, a.id[k]!, trac.lim.Imax, 1e-6);
        expectClose(b.iq[k]!, a.iq[k]!, trac.lim.Imax, 1e-6);
      }
      expectClose(b.baseSpeed, a.baseSpeed, a.baseSpeed, 1e-6);
    }
  });

  it('operating points of the demo requirements and MTPA currents', () => {
    for (const [rpm, T] of [[500, 200], [4000, 90], [6000, -60], [8000, 40], [12000, 45]] as const) {
      const w = (rpm * Math.PI) / 30;
      const a = solveOperatingPoint(m, trac.lim, w, T);
      const b = solveOperatingPoint(fm, trac.lim, w, T);
      expect(b.feasible).toBe(a.feasible);
      expect(b.region).toBe(a.region);
      expectClose(b.id, a.id, trac.lim.Imax, 1e-6);
      expectClose(b.iq, a.iq, trac.lim.Imax, 1e-6);
      expectClose(b.voltage, a.voltage, trac.lim.Vmax, 1e-6);
      const pa = maxTorquePoint(m, trac.lim, w, 'motoring'), pb = maxTorquePoint(fm, trac.lim, w, 'motoring');
      expectClose(pb.torque, pa.torque, Math.abs(pa.torque), 1e-6);
    }
    for (const T of [20, 100, 200, 300]) {
      const a = mtpaCurrentForTorque(m, T), b = mtpaCurrentForTorque(fm, T);
      expectClose(b.id, a.id, a.current, 1e-6);
      expectClose(b.iq, a.iq, a.current, 1e-6);
    }
  });
});
