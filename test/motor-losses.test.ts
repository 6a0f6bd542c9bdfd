import { describe, expect, it } from 'vitest';
import { ironLoss, ironLossAt, mechanicalLoss } from '../src/core/machine/motor-losses';
import { LinearDqModel } from '../src/core/machine/linear-dq';

const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe('iron loss', () => {
  const hyst = { kh: 3, beta: 1.8, ke: 0 };
  const eddy = { kh: 0, beta: 2, ke: 0.02 };
  it('hysteresis term scales with f and psi^beta', () => {
    // Steinmetz (1892), On the law of hysteresis: P_h proportional to f B^beta
    expect(rel(ironLoss(hyst, 200, 0.1), 2 * ironLoss(hyst, 100, 0.1))).toBeLessThan(1e-14);
    expect(rel(ironLoss(hyst, 100, 0.2), 2 ** 1.8 * ironLoss(hyst, 100, 0.1))).toBeLessThan(1e-14);
    expect(ironLoss(hyst, 100, 0.1)).toBeCloseTo(3 * 100 * 0.1 ** 1.8, 12);
  });
  it('eddy term scales with f^2 and psi^2', () => {
    // Bertotti (1988), General properties of power losses in soft ferromagnetic materials: classical term proportional to f^2 B^2
    expect(rel(ironLoss(eddy, 200, 0.1), 4 * ironLoss(eddy, 100, 0.1))).toBeLessThan(1e-14);
    expect(rel(ironLoss(eddy, 100, 0.2), 4 * ironLoss(eddy, 100, 0.1))).toBeLessThan(1e-14);
  });
  it('both terms add; the sign of f does not matter; absent = zero', () => {
    const s = { kh: 3, beta: 2, ke: 0.02 };
    // Steinmetz (1892) plus Bertotti (1988) loss separation
    expect(ironLoss(s, -150, 0.08)).toBeCloseTo(3 * 150 * 0.0064 + 0.02 * 22500 * 0.0064, 12);
    expect(ironLoss(undefined, 150, 0.08)).toBe(0);
  });
  it('takes psi = |psi_dq| from the machine model', () => {
    const m = new LinearDqModel({ polePairs: 4, Rs: 0.01, Ld: 2e-4, Lq: 5e-4, psiM: 0.05 });
    const f = new Float64Array(2);
    const s = { kh: 2, beta: 2, ke: 0.01 };
    const we = 2 * Math.PI * 300;
    // psi_d = Ld id + psiM, psi_q = Lq iq (Krause, Wasynczuk and Sudhoff (2002), Analysis of Electric Machinery, ch. 5)
    const psi = Math.hypot(2e-4 * -100 + 0.05, 5e-4 * 80);
    expect(ironLossAt(m, s, -100, 80, we, f)).toBeCloseTo(2 * 300 * psi * psi + 0.01 * 9e4 * psi * psi, 10);
    expect(ironLossAt(m, s, -100, 80, 0, f)).toBe(0);
  });
});

describe('mechanical loss', () => {
  it('is B w^2 + Tc |w| + kw |w|^3', () => {
    // common practice (no source): viscous, Coulomb and windage powers
    expect(mechanicalLoss({ B: 1e-3, Tc: 0.2 }, { kw: 1e-7 }, -500)).toBeCloseTo(1e-3 * 250000 + 0.2 * 500 + 1e-7 * 1.25e8, 10);
    expect(mechanicalLoss({ B: 1e-3, Tc: 0.2 }, undefined, 500)).toBeCloseTo(350, 10);
    // doubling the speed: windage x8 (common practice (no source))
    expect(mechanicalLoss({ B: 0, Tc: 0 }, { kw: 2e-7 }, 1000)).toBeCloseTo(8 * mechanicalLoss({ B: 0, Tc: 0 }, { kw: 2e-7 }, 500), 9);
  });
});
