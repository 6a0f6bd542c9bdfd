import { describe, expect, it } from 'vitest';
import { INVENTED_IPM_SATURATION, SaturationModel } from '../src/core/machine/saturation-model';

// Hinkkanen, Pescetto, Mölsä, Saarakkala, Pellegrino, Bojoi (2017), Sensorless self-commissioning of
// synchronous reluctance motors at standstill without rotor locking, IEEE Trans. Ind. Appl. 53(3): current
// as a closed-form function of flux, the gradient of one magnetic energy (reciprocal by construction).
const m = new SaturationModel(INVENTED_IPM_SATURATION, 4, 0.02);
const pts = [[0, 0], [0, 450], [-250, 380], [-450, 0], [100, -200], [-300, -300], [40, 10]] as const;

describe('the algebraic saturation model', () => {
  it('flux(current) inverts the closed-form current(flux) to 1e-12 relative', () => {
    const f = new Float64Array(2), c = new Float64Array(2);
    for (const [id, iq] of pts) {
      m.flux(id, iq, f);
      m.current(f[0]!, f[1]!, c);
      expect(Math.abs(c[0]! - id) + Math.abs(c[1]! - iq)).toBeLessThan(1e-9 * (1 + Math.abs(id) + Math.abs(iq)) + 1e-9);
    }
  });

  it('is reciprocal: d psi_d/d i_q = d psi_q/d i_d, exact and by central differences of the flux', () => {
    const L = new Float64Array(4), a = new Float64Array(2), b = new Float64Array(2);
    const h = 1e-3;
    for (const [id, iq] of pts) {
      m.incrementalInductance(id, iq, L);
      expect(Math.abs(L[1]! - L[2]!)).toBeLessThan(1e-15);
      m.flux(id, iq + h, a); m.flux(id, iq - h, b);
      const dpsid_diq = (a[0]! - b[0]!) / (2 * h);
      const dpsiq_diq = (a[1]! - b[1]!) / (2 * h);
      m.flux(id + h, iq, a); m.flux(id - h, iq, b);
      const dpsiq_did = (a[1]! - b[1]!) / (2 * h);
      const dpsid_did = (a[0]! - b[0]!) / (2 * h);
      expect(dpsid_diq).toBeCloseTo(L[1]!, 9);
      expect(dpsiq_did).toBeCloseTo(L[2]!, 9);
      expect(dpsid_did).toBeCloseTo(L[0]!, 9);
      expect(dpsiq_diq).toBeCloseTo(L[3]!, 9);
    }
  });

  it('saturates as an interior-magnet traction motor: Lq falls 30-50 % at full current, psi_d falls with iq', () => {
    const f = new Float64Array(2), L = new Float64Array(4);
    m.flux(0, 0, f);
    const psi0 = f[0]!;
    expect(psi0).toBeCloseTo(0.0658, 4);
    m.incrementalInductance(0, 0, L);
    const Lq0 = L[3]!;
    m.flux(0, 450, f);
    const LqApp = f[1]! / 450;
    expect(1 - LqApp / Lq0).toBeGreaterThan(0.3);
    expect(1 - LqApp / Lq0).toBeLessThan(0.5);
    expect(f[0]! / psi0).toBeLessThan(0.92); // cross-saturation
    // torque from the flux: T = 1.5 p (psi_d iq - psi_q id), Krause, Wasynczuk and Sudhoff (2002), ch. 5
    m.flux(-250, 380, f);
    expect(m.torque(-250, 380)).toBeCloseTo(1.5 * 4 * (f[0]! * 380 + f[1]! * 250), 9);
  });

  it('closed current loop: the electrical energy in, the integral of i·d psi, returns to zero (lossless field)', () => {
    // around a circle in the flux plane the line integral of i(psi)·d psi vanishes for a gradient field
    const c = new Float64Array(2);
    let W = 0;
    const n = 20000;
    const cx = 0.03, cy = 0.12, r = 0.08;
    for (let k = 0; k < n; k++) {
      const t = ((k + 0.5) / n) * 2 * Math.PI;
      const pd = cx + r * Math.cos(t), pq = cy + r * Math.sin(t);
      m.current(pd, pq, c);
      W += (c[0]! * -r * Math.sin(t) + c[1]! * r * Math.cos(t)) * ((2 * Math.PI) / n);
    }
    expect(Math.abs(W)).toBeLessThan(1e-9);
  });
});
