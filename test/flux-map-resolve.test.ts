// A flux-map project resolved: the same results as the constant project it was tabulated from, the
// apparent terms at zero current, and the findings (temperature shift, reciprocity).
import { describe, expect, it } from 'vitest';
import { loadProjectJson } from '../src/core/project/project';
import { computeEnvelope } from '../src/core/steady-state/envelope';
import { solveOperatingPoint } from '../src/core/steady-state/operating-point';
import { sizeDrive } from '../src/core/steady-state/sizing';
import { safetyReport } from '../src/core/steady-state/safety';
import { mapInductances, RECIPROCITY_TOLERANCE } from '../src/core/project/flux-map-resolve';
import { CONST_MOTOR, constProject, grid, mapProject } from './flux-map-fixtures';

const load = (j: unknown) => loadProjectJson(j).resolved;
const rel = (a: number, b: number): number => Math.abs(a - b) / Math.max(Math.abs(a), Math.abs(b), 1e-12);

/** Largest relative difference of two numbers trees (same shape). */
function worst(a: unknown, b: unknown): number {
  if (typeof a === 'number') return typeof b !== 'number' ? Infinity : a === b ? 0 : rel(a, b);
  if (a && typeof a === 'object' && b && typeof b === 'object') {
    let w = 0;
    for (const k of Object.keys(a)) w = Math.max(w, worst((a as any)[k], (b as any)[k]));
    return w;
  }
  return 0;
}

describe('a map tabulated from constant Ld, Lq, psiM gives the constant project\'s results', () => {
  // Krause, Wasynczuk and Sudhoff (2002), Analysis of Electric Machinery and Drive Systems, ch. 5:
  // psi_d = Ld id + psiM, psi_q = Lq iq; tabulated exactly, a map of it is the same machine.
  const c = load(constProject());
  for (const full of [false, true]) {
    const m = load(mapProject(full));
    const label = full ? 'full plane' : 'iq >= 0 mirrored';
    it(`${label}: apparent terms at zero current are the constant terms at 20 °C, hot and cold`, () => {
      for (const k of ['machine20', 'hot', 'cold'] as const) {
        for (const q of ['polePairs', 'Rs', 'Ld', 'Lq', 'psiM'] as const) expect(rel(m[k][q], c[k][q]), `${k}.${q}`).toBeLessThan(1e-12);
      }
      expect(m.models.hot.linear).toBeNull();
    });
    it(`${label}: envelope (motoring and generating), operating points, sizing and safety within 1e-6`, () => {
      for (const direction of ['motoring', 'generating'] as const) {
        const a = computeEnvelope(c.models.hot, c.peak, { points: 60, direction });
        const b = computeEnvelope(m.models.hot, m.peak, { points: 60, direction });
        expect(a.torque.length).toBe(60);
        expect(Math.max(...a.torque.map(Math.abs))).toBeGreaterThan(100);
        expect(worst(a, b)).toBeLessThan(1e-6);
      }
      for (const [rpm, T] of [[1000, 150], [6000, 60], [11000, 15], [9000, -40]]) {
        const a = solveOperatingPoint(c.models.hot, c.peak, (rpm! * Math.PI) / 30, T!);
        const b = solveOperatingPoint(m.models.hot, m.peak, (rpm! * Math.PI) / 30, T!);
        expect(b.feasible).toBe(a.feasible);
        expect(worst(a, b)).toBeLessThan(1e-6);
      }
      expect(worst(sizeDrive(c.models.cold, c.inverter, c.requirements, c.currentLimits), sizeDrive(m.models.cold, m.inverter, m.requirements, m.currentLimits))).toBeLessThan(1e-6);
      expect(worst(safetyReport(c.models.cold, c.inverter, 1200), safetyReport(m.models.cold, m.inverter, 1200))).toBeLessThan(1e-6);
    });
  }
});

describe('findings of a flux map', () => {
  it('the temperature shift is stated with its size, and the apparent terms at zero current', () => {
    const m = load(mapProject());
    const t = m.findings.find((f) => f.code === 'flux-map-temperature')!;
    // shift = alpha (T - T_map) psi_d(0,0) = -0.0012 x 100 K x 80 mWb = -9.6 mWb (hot); x -40 K = 3.84 mWb (cold)
    expect(t.message).toContain('-9.6 mWb at the hot magnet (120 °C), 3.84 mWb at the cold corner (-20 °C)');
    expect(t.message).toMatch(/An approximation/);
    const a = m.findings.find((f) => f.code === 'flux-map-apparent-terms')!;
    expect(a.message).toContain('psiM 80 mWb (20 °C), Ld 0.3 mH and Lq 0.75 mH');
    expect(m.findings.some((f) => f.code === 'flux-map-not-reciprocal')).toBe(false);
  });

  /** A full-plane map with cross terms: psi_d = Ld id + psiM + Mdq iq, psi_q = Lq iq + Mqd id. */
  function crossMap(Mdq: number, Mqd: number): Record<string, any> {
    const p = mapProject(true);
    const { Ld, Lq, psiM } = CONST_MOTOR;
    const id = grid(-500, 500, 21), iq = grid(-500, 500, 21);
    p.motor.fluxMap = { magnetTemp_C: 20, id_A: id, iq_A: iq, psid_Wb: id.map((x) => iq.map((y) => Ld * x + psiM + Mdq * y)), psiq_Wb: id.map((x) => iq.map((y) => Lq * y + Mqd * x)) };
    return p;
  }

  it('a map whose cross inductances differ by more than the tolerance is said not to be reciprocal, with the size', () => {
    // Mqd = 0.2 sqrt(Ld Lq), Mdq = 0: mismatch 20 % of the inductances
    // (a lossless field has a co-energy, so dpsid/diq = dpsiq/did: White and Woodson (1959), Electromechanical Energy Conversion, ch. 3)
    const s = Math.sqrt(CONST_MOTOR.Ld * CONST_MOTOR.Lq);
    const m = load(crossMap(0, 0.2 * s));
    const f = m.findings.find((x) => x.code === 'flux-map-not-reciprocal')!;
    expect(f.severity).toBe('warning');
    expect(f.message).toMatch(/differ by up to 20 % of the inductances/);
    expect(f.message).toContain(`tolerance ${RECIPROCITY_TOLERANCE * 100} %`);
    // equal cross terms: reciprocal, no finding
    expect(load(crossMap(0.2 * s, 0.2 * s)).findings.some((x) => x.code === 'flux-map-not-reciprocal')).toBe(false);
  });
});

describe('a map the engine cannot take', () => {
  it('psi_d below zero at zero current (the d axis reversed) is refused naming the table', () => {
    // common practice (no source): the d axis is laid along the magnet's flux, so psi_d(0, 0) = psiM >= 0
    const p = mapProject();
    p.motor.fluxMap.psid_Wb = p.motor.fluxMap.psid_Wb.map((r: number[]) => r.map((x) => x - 0.2));
    expect(() => load(p)).toThrow(/^motor\.fluxMap\.psid_Wb gives psi_d = -120 mWb at zero current \(20 °C\): the magnet's flux must point along \+d/);
  });
});

describe('inductances at zero and at the peak current', () => {
  it('a map saturating in q: the apparent Lq at the peak current is psi_q / iq there, the incremental one the slope', () => {
    // invented saturation psi_q = Lq iq / (1 + |iq| / I0); common practice (no source) for the definitions
    // apparent L = psi / i, incremental L = d psi / d i
    const p = mapProject();
    const I0 = 600, Lq = CONST_MOTOR.Lq;
    const f = p.motor.fluxMap;
    f.psiq_Wb = f.id_A.map(() => f.iq_A.map((y: number) => (Lq * y) / (1 + Math.abs(y) / I0)));
    const m = load(p);
    const ipk = 500; // a grid node of the map (its top)
    const r = mapInductances(m.models.at20, ipk);
    expect(r.q[0]!.current_A).toBe(0);
    expect(r.q[1]!.apparent_H).toBeCloseTo(Lq / (1 + ipk / I0), 12);
    // the slope of the last cell of the table (a bilinear or smoother interpolant: within 5 % of the exact slope Lq / (1 + iq/I0)^2)
    expect(Math.abs(r.q[1]!.incremental_H / (Lq / (1 + ipk / I0) ** 2) - 1)).toBeLessThan(0.05);
    expect(r.d[1]!.apparent_H).toBeCloseTo(CONST_MOTOR.Ld, 12);
  });
});
