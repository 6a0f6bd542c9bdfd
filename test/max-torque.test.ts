import { describe, expect, it } from 'vitest';
import { ENVELOPE_ACCURACY, maxTorqueCore, newScratch } from '../src/core/steady-state/max-torque';
import { machineModel } from '../src/core/machine/linear-dq';
import { computeEnvelope } from '../src/core/steady-state/envelope';
import { SPM_CASE, demoCases } from './model-paths';

describe('max torque at one speed (linear fast path)', () => {
  it('SPM in field weakening: the crossing of the circle with the voltage boundary, by hand with Rs = 0 (common practice (no source))', () => {
    // Ld = Lq = L, Rs = 0: |v|² = we² ((L id + psiM)² + (L iq)²) = Vmax² and id² + iq² = I² give
    // id = ((Vmax/we)² - psiM² - L² I²) / (2 L psiM), iq = sqrt(I² - id²), T = 1.5 p psiM iq
    const m = machineModel({ ...SPM_CASE.m, Rs: 0 });
    const { Vmax, Imax } = SPM_CASE.lim;
    const L = SPM_CASE.m.Ld, psi = SPM_CASE.m.psiM, p = SPM_CASE.m.polePairs;
    const wb = Vmax / (p * Math.hypot(psi, L * Imax)); // base speed of this SPM (MTPA id = 0)
    const w = 1.3 * wb, we = p * w;
    const id = ((Vmax / we) ** 2 - psi * psi - L * L * Imax * Imax) / (2 * L * psi);
    const iq = Math.sqrt(Imax * Imax - id * id);
    const sc = newScratch();
    maxTorqueCore(m, Vmax, Imax, we, 1, sc);
    expect(sc.ok).toBe(true);
    expect(sc.region).toBe(1);
    expect(sc.id).toBeCloseTo(id, 9);
    expect(sc.iq).toBeCloseTo(iq, 9);
    expect(Math.abs(sc.J / (1.5 * p * psi * iq) - 1)).toBeLessThan(ENVELOPE_ACCURACY);
    // below base speed: MTPA at Imax, id = 0
    maxTorqueCore(m, Vmax, Imax, 0.5 * wb * p, 1, sc);
    expect(sc.region).toBe(0);
    expect(sc.id).toBe(0);
    expect(sc.J).toBeCloseTo(1.5 * p * psi * Imax, 10);
  });

  it('two runs with their own scratch interleave without disturbing each other (no shared state)', () => {
    const [a, b] = [demoCases()[2]!, demoCases()[1]!];
    const ma = machineModel(a.m), mb = machineModel(b.m);
    const ea = computeEnvelope(a.m, a.lim, { points: 30 });
    const eb = computeEnvelope(b.m, b.lim, { points: 30 });
    const sa = newScratch(), sb = newScratch();
    for (let k = 0; k < 30; k++) {
      maxTorqueCore(ma, a.lim.Vmax, a.lim.Imax, ma.polePairs * ea.speed[k]!, 1, sa);
      maxTorqueCore(mb, b.lim.Vmax, b.lim.Imax, mb.polePairs * eb.speed[k]!, 1, sb);
      if (ea.feasible[k]) { expect(sa.id).toBe(ea.id[k]); expect(sa.iq).toBe(ea.iq[k]); }
      if (eb.feasible[k]) { expect(sb.id).toBe(eb.id[k]); expect(sb.iq).toBe(eb.iq[k]); }
    }
  });
});
