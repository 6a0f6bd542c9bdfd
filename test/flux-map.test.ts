import { describe, expect, it } from 'vitest';
import { FluxMapModel, fluxMapAt, fullPlaneGrid, type FluxMapData } from '../src/core/machine/flux-map';
import { LinearDqModel } from '../src/core/machine/linear-dq';
import { INVENTED_IPM_SATURATION, SaturationModel } from '../src/core/machine/saturation-model';
import { evenGrid, sampleFluxMap } from '../src/core/machine/sample-flux-map';

// An invented machine (not a product's data), tabulated from constant Ld, Lq, psiM on a non-uniform grid.
const lin = new LinearDqModel({ polePairs: 4, Rs: 0.02, Ld: 0.3e-3, Lq: 0.75e-3, psiM: 0.06 });
function tabulate(ids: number[], iqs: number[]): FluxMapData {
  const f = new Float64Array(2);
  const psid = ids.map((id) => iqs.map((iq) => (lin.flux(id, iq, f), f[0]!)));
  const psiq = ids.map((id) => iqs.map((iq) => (lin.flux(id, iq, f), f[1]!)));
  return { magnetTemp_C: 20, id_A: ids, iq_A: iqs, psid_Wb: psid, psiq_Wb: psiq };
}
const ids = [-500, -400, -250, -100, 0, 50, 200];
const half = tabulate(ids, [0, 20, 100, 300, 500]);

describe('a flux map of a constant-parameter machine', () => {
  it('mirrors a map of iq >= 0: psi_q odd, psi_d even in iq', () => {
    const g = fullPlaneGrid(half);
    expect([...g.iq]).toEqual([-500, -300, -100, -20, 0, 20, 100, 300, 500]);
    const nq = g.iq.length;
    // at id = -250 (row 2), iq = -300 (column 1): psi_q = Lq iq = -0.225 Wb, psi_d = Ld id + psiM = -0.015 Wb
    expect(g.psiq[2 * nq + 1]).toBeCloseTo(-0.225, 15);
    expect(g.psid[2 * nq + 1]).toBeCloseTo(-0.015, 15);
  });

  it('reproduces the affine flux, torque, voltage and inductances exactly (common practice (no source): interpolation is exact on affine data)', () => {
    const m = new FluxMapModel(half, 4, 0.02);
    const a = new Float64Array(2), b = new Float64Array(2), L = new Float64Array(4);
    for (const [id, iq] of [[-320, 410], [-10, -250], [150, 30], [-480, -480]] as const) {
      m.flux(id, iq, a);
      lin.flux(id, iq, b);
      expect(a[0]).toBeCloseTo(b[0]!, 12);
      expect(a[1]).toBeCloseTo(b[1]!, 12);
      expect(m.torque(id, iq)).toBeCloseTo(lin.torque(id, iq), 9);
      m.incrementalInductance(id, iq, L);
      expect(L[0]).toBeCloseTo(0.3e-3, 12);
      expect(L[3]).toBeCloseTo(0.75e-3, 12);
      expect(Math.abs(L[1]!) + Math.abs(L[2]!)).toBeLessThan(1e-12);
      const c = new Float64Array(2);
      m.current(b[0]!, b[1]!, c);
      expect(c[0]).toBeCloseTo(id, 8);
      expect(c[1]).toBeCloseTo(iq, 8);
    }
  });

  it('shifts psi_d by alphaBr (T - T_map) psi_d(0, 0) at another magnet temperature', () => {
    // psi_d(0,0) = 0.06 Wb; at 120 °C with -0.0012 /K: 0.06 (1 - 0.12) = 0.0528 Wb (sintered NdFeB, from memory)
    const hot = fluxMapAt(half, 4, 0.02, 120, -0.0012);
    const f = new Float64Array(2);
    hot.flux(0, 0, f);
    expect(f[0]).toBeCloseTo(0.0528, 12);
  });
});

describe('a flux map of a saturating machine (Hinkkanen et al. (2017), IEEE Trans. Ind. Appl. 53(3), invented parameters)', () => {
  const sat = new SaturationModel(INVENTED_IPM_SATURATION, 4, 0.02);
  const m = new FluxMapModel(sampleFluxMap(sat, evenGrid(-540, 540, 41), evenGrid(0, 540, 41), 20), 4, 0.02);
  const pts = [[0, 0], [-250, 374], [-449, -20], [120, 300], [-600, 560], [700, -10]] as const;

  it('follows the model within 1e-4 of its flux inside the grid (C1 bicubic Hermite, common practice (no source))', () => {
    const a = new Float64Array(2), b = new Float64Array(2);
    for (const [id, iq] of pts.slice(0, 4)) {
      m.flux(id, iq, a);
      sat.flux(id, iq, b);
      expect(Math.abs(a[0]! - b[0]!) + Math.abs(a[1]! - b[1]!)).toBeLessThan(1e-4 * 0.3);
    }
  });

  it('its incremental inductances are the exact derivatives of its flux, beyond the grid too (central differences)', () => {
    const L = new Float64Array(4), a = new Float64Array(2), b = new Float64Array(2);
    const h = 1e-4;
    for (const [id, iq] of pts) {
      m.incrementalInductance(id, iq, L);
      m.flux(id + h, iq, a); m.flux(id - h, iq, b);
      expect((a[0]! - b[0]!) / (2 * h)).toBeCloseTo(L[0]!, 9);
      expect((a[1]! - b[1]!) / (2 * h)).toBeCloseTo(L[2]!, 9);
      m.flux(id, iq + h, a); m.flux(id, iq - h, b);
      expect((a[0]! - b[0]!) / (2 * h)).toBeCloseTo(L[1]!, 9);
      expect((a[1]! - b[1]!) / (2 * h)).toBeCloseTo(L[3]!, 9);
      expect(L[0]!).toBeGreaterThan(0);
      expect(L[3]!).toBeGreaterThan(0);
    }
  });

  it('the inverse (bounded Newton) returns the current of a flux, from any previous answer', () => {
    const f = new Float64Array(2), c = new Float64Array(2);
    for (const [id, iq] of [...pts, ...pts.slice().reverse()]) {
      m.flux(id, iq, f);
      m.current(f[0]!, f[1]!, c);
      expect(c[0]).toBeCloseTo(id, 7);
      expect(c[1]).toBeCloseTo(iq, 7);
    }
  });

  it('the warm-started inverse follows a slow current trajectory to 1e-9 A and reproduces its flux to 1e-13 of the flux scale (common practice (no source): Newton from a first-order prediction)', () => {
    const f = new Float64Array(2), back = new Float64Array(2), c = new Float64Array(2);
    const fresh = new FluxMapModel(sampleFluxMap(sat, evenGrid(-540, 540, 41), evenGrid(0, 540, 41), 20), 4, 0.02);
    let worst = 0, worstFlux = 0;
    for (let k = 0; k <= 2000; k++) {
      // a circle of 400 A into saturation, in small steps (as consecutive integrator stages ask)
      const a = (2 * Math.PI * k) / 2000;
      const id = -100 + 400 * Math.cos(a), iq = 400 * Math.sin(a);
      fresh.flux(id, iq, f);
      fresh.current(f[0]!, f[1]!, c);
      worst = Math.max(worst, Math.abs(c[0]! - id), Math.abs(c[1]! - iq));
      fresh.flux(c[0]!, c[1]!, back);
      worstFlux = Math.max(worstFlux, Math.abs(back[0]! - f[0]!) + Math.abs(back[1]! - f[1]!));
    }
    expect(worst).toBeLessThan(1e-9);
    // the flux scale of this map (its largest |psi|) is about 0.28 Wb
    expect(worstFlux).toBeLessThan(1e-13 * 0.5);
  });
});

describe('a map too small to interpolate', () => {
  it('is refused naming the field (common practice (no source): a cell needs two points per axis)', () => {
    const one: FluxMapData = { magnetTemp_C: 20, id_A: [0], iq_A: [0, 10], psid_Wb: [[0.06, 0.06]], psiq_Wb: [[0, 0.01]] };
    expect(() => new FluxMapModel(one, 4, 0.02)).toThrow(/fluxMap/);
  });
});
