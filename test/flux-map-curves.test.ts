import { describe, expect, it } from 'vitest';
import { FluxMapModel, type FluxMapData } from '../src/core/machine/flux-map';
import { LinearDqModel } from '../src/core/machine/linear-dq';
import { fluxMapCurves } from '../src/core/reports/flux-map-curves';

// An invented interior-magnet machine (not a product's data), tabulated from constant Ld, Lq, psiM
// on a non-uniform grid of iq >= 0 (the model mirrors it).
const Ld = 0.3e-3, Lq = 0.75e-3, psiM = 0.06, p = 4;
const lin = new LinearDqModel({ polePairs: p, Rs: 0.02, Ld, Lq, psiM });
function tabulate(model: { flux(id: number, iq: number, out: Float64Array): void }, ids: number[], iqs: number[]): FluxMapData {
  const f = new Float64Array(2);
  const psid = ids.map((id) => iqs.map((iq) => (model.flux(id, iq, f), f[0]!)));
  const psiq = ids.map((id) => iqs.map((iq) => (model.flux(id, iq, f), f[1]!)));
  return { magnetTemp_C: 20, id_A: ids, iq_A: iqs, psid_Wb: psid, psiq_Wb: psiq };
}
const map = new FluxMapModel(tabulate(lin, [-500, -400, -250, -100, 0, 50, 200, 500], [0, 20, 100, 300, 500]), p, 0.02);
const Imax = 400;

describe('the flux-map view curves of a map tabulated from constant Ld, Lq, psiM', () => {
  const c = fluxMapCurves(map, Imax);

  it('psi_d against id is a straight line of slope Ld through psiM at every iq; psi_q against iq one of slope Lq through 0 at every id', () => {
    // Krause, Wasynczuk and Sudhoff (2002), Analysis of Electric Machinery and Drive Systems, ch. 5:
    // psi_d = Ld id + psiM, psi_q = Lq iq (bilinear interpolation is exact on affine data)
    expect(c.psid.map((l) => l.level_A)).toEqual([0, 100, 200, 300, 400]);
    expect(c.psiq.map((l) => l.level_A)).toEqual([-0, -100, -200, -300, -400]);
    for (const l of c.psid) {
      expect(l.current_A[0]).toBe(-Imax);
      expect(l.current_A.at(-1)).toBe(Imax);
      l.current_A.forEach((id, k) => expect(l.psi_Wb[k]).toBeCloseTo(Ld * id + psiM, 12));
    }
    for (const l of c.psiq) {
      expect(l.current_A[0]).toBe(0);
      l.current_A.forEach((iq, k) => expect(l.psi_Wb[k]).toBeCloseTo(Lq * iq, 12));
    }
  });

  it('apparent and incremental inductances are Ld and Lq at every current along MTPA, no cross term', () => {
    // same source: constant parameters mean apparent = incremental inductance
    const L = c.inductance;
    expect(L.current_A.length).toBe(61);
    for (let k = 0; k < L.current_A.length; k++) {
      expect(L.LdApparent_H[k]).toBeCloseTo(Ld, 12);
      expect(L.LqApparent_H[k]).toBeCloseTo(Lq, 12);
      expect(L.LdIncremental_H[k]).toBeCloseTo(Ld, 12);
      expect(L.LqIncremental_H[k]).toBeCloseTo(Lq, 12);
      expect(L.LdqIncremental_H[k]).toBeCloseTo(0, 12);
    }
  });

  it('the MTPA trajectory is the closed form of the constant machine, and its torque 1.5 p iq (psiM + (Ld - Lq) id)', () => {
    // Morimoto, Takeda, Hirasa, Taniguchi (1990), Expansion of operating limits for permanent
    // magnet motor by current vector control considering inverter capacity, IEEE Trans. Ind. Appl.
    // 26(5): id = (psiM - sqrt(psiM² + 8 (Lq - Ld)² I²)) / (4 (Lq - Ld))
    const m = c.mtpa;
    for (let k = 0; k < m.current_A.length; k++) {
      const I = m.current_A[k]!;
      const id = (psiM - Math.sqrt(psiM * psiM + 8 * (Lq - Ld) ** 2 * I * I)) / (4 * (Lq - Ld));
      const iq = Math.sqrt(Math.max(0, I * I - id * id));
      expect(m.id_A[k]).toBeCloseTo(id, 6);
      expect(m.iq_A[k]).toBeCloseTo(iq, 6);
      expect(m.torque_Nm[k]).toBeCloseTo(1.5 * p * iq * (psiM + (Ld - Lq) * id), 6);
    }
    expect(m.current_A.at(-1)).toBe(Imax);
  });

  it('the torque grid is the torque formula at each node, over id in [-Imax, Imax/4], iq in [0, Imax]', () => {
    // same source as above (T = 1.5 p (psi_d iq - psi_q id))
    const t = c.torque;
    expect(t.id_A[0]).toBe(-Imax);
    expect(t.id_A.at(-1)).toBe(0.25 * Imax);
    expect(t.iq_A.at(-1)).toBe(Imax);
    expect(t.torque_Nm.length).toBe(41);
    for (const [i, j] of [[0, 40], [20, 13], [40, 40], [7, 0]] as const) {
      const id = t.id_A[i]!, iq = t.iq_A[j]!;
      expect(t.torque_Nm[j]![i]).toBeCloseTo(1.5 * p * iq * (psiM + (Ld - Lq) * id), 9);
    }
  });
});

describe('the flux-map view curves of a saturating q axis', () => {
  // psi_q = Lq0 b tanh(iq / b): apparent Lq = Lq0 b tanh(x) / iq, incremental Lq0 sech²(x), x = iq / b
  // (a saturating curve of common practice (no source), evaluated exactly here, tabulated finely)
  const b = 300, Lq0 = 0.75e-3;
  const sat = {
    flux(id: number, iq: number, out: Float64Array): void {
      out[0] = Ld * id + psiM;
      out[1] = Lq0 * b * Math.tanh(iq / b);
    },
  };
  const ids = Array.from({ length: 41 }, (_, k) => -500 + 25 * k);
  const iqs = Array.from({ length: 201 }, (_, k) => 2.5 * k);
  const m = new FluxMapModel(tabulate(sat, ids, iqs), p, 0.02);
  const c = fluxMapCurves(m, Imax, { levels: [0, 1] });

  it('the apparent Lq falls less than the incremental one, each as the saturation curve says', () => {
    const L = c.inductance;
    const k = L.current_A.length - 1;
    const iq = c.mtpa.iq_A[k]!;
    const x = iq / b;
    expect(L.LqApparent_H[k]).toBeCloseTo((Lq0 * b * Math.tanh(x)) / iq, 7);
    // the incremental one within 1 %: the interpolant's slope in a 2.5 A cell, not the curve's own
    expect(Math.abs(L.LqIncremental_H[k]! / (Lq0 / Math.cosh(x) ** 2) - 1)).toBeLessThan(0.01);
    expect(L.LqIncremental_H[k]!).toBeLessThan(L.LqApparent_H[k]!);
    expect(L.LqApparent_H[k]!).toBeLessThan(Lq0);
    // at zero current both are Lq0 (the initial slope), within the first cell's chord
    expect(L.LqApparent_H[0]! / Lq0).toBeCloseTo(1, 4);
  });

  it('rejects a current limit that is not a positive finite current', () => {
    // common practice (no source)
    expect(() => fluxMapCurves(m, 0)).toThrow(/Imax/);
    expect(() => fluxMapCurves(m, NaN)).toThrow(/Imax/);
  });
});
