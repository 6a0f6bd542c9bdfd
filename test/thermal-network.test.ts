import ode45 from 'ode45-cash-karp';
import { describe, expect, it } from 'vitest';
import type { ThermalNetworkSpec } from '../src/core/machine/thermal-network-spec';
import { junctionTemperature, magnetTemperature, statorToCoolantAt, steadyTemperatures, stepTemperatures } from '../src/core/machine/thermal-network';

const spec: ThermalNetworkSpec = {
  coolantTemp_C: 40, windingCapacity_J_per_K: 900, windingToStator_K_per_W: 0.05,
  statorCapacity_J_per_K: 9000, statorToCoolant_K_per_W: 0.02, magnetAboveStator_K: 10,
  windingMax_C: 155, magnetMax_C: 140, junctionToCoolant_K_per_W: 0.15, junctionMax_C: 150,
};

describe('thermal network', () => {
  it('steady state: stator rise (Pcu + Pfe) Rsc, winding above it by Pcu Rws (series resistances, common practice (no source))', () => {
    const out = new Float64Array(2);
    steadyTemperatures(spec, 600, 300, 1000, out);
    expect(out[1]).toBeCloseTo(40 + 900 * 0.02, 12);
    expect(out[0]).toBeCloseTo(40 + 18 + 600 * 0.05, 12);
    expect(magnetTemperature(spec, out[1]!)).toBeCloseTo(68, 12);
    expect(junctionTemperature(spec, 1200)).toBeCloseTo(40 + 0.15 * 200, 12);
    expect(junctionTemperature({ ...spec, junctionToCoolant_K_per_W: undefined }, 1200)).toBe(40);
  });

  it('a merged single node follows T_inf + (T0 - T_inf) exp(-t / RC) (first-order RC response, common practice (no source))', () => {
    // R_ws -> 0 joins the two nodes: C = Cw + Cs behind R_sc
    const s = { ...spec, windingToStator_K_per_W: 1e-9 };
    const T = new Float64Array([40, 40]);
    const P = 500, C = 900 + 9000, R = 0.02, Tinf = 40 + P * R;
    for (const t of [10, 60, 200, 600]) {
      T[0] = 40; T[1] = 40;
      stepTemperatures(s, T, P, 0, 0, t);
      const exact = Tinf + (40 - Tinf) * Math.exp(-t / (R * C));
      expect(Math.abs(T[1]! - exact)).toBeLessThan(1e-6);
      expect(Math.abs(T[0]! - exact)).toBeLessThan(1e-6);
    }
  });

  it('two nodes: the modal closed form (eigenvectors of A, two exponentials; Incropera and DeWitt 2002, Fundamentals of Heat and Mass Transfer, lumped capacitance; solved by hand here)', () => {
    const Cw = 900, Cs = 9000, Rws = 0.05, Rsc = 0.02, Pcu = 800, Pfe = 150;
    const a = -1 / (Cw * Rws), b = 1 / (Cw * Rws), c = 1 / (Cs * Rws), d = -(1 / Rws + 1 / Rsc) / Cs;
    // characteristic polynomial l^2 - (a + d) l + (ad - bc) = 0
    const tr = a + d, det = a * d - b * c;
    const l1 = (tr + Math.sqrt(tr * tr - 4 * det)) / 2, l2 = (tr - Math.sqrt(tr * tr - 4 * det)) / 2;
    // eigenvectors [b, l - a]
    const v1 = [b, l1 - a], v2 = [b, l2 - a];
    const xsInf = (Pcu + Pfe) * Rsc, xwInf = xsInf + Pcu * Rws;
    const y0 = [25 - xwInf, 5 - xsInf]; // start 65 °C winding, 45 °C stator
    // y0 = k1 v1 + k2 v2
    const D = v1[0]! * v2[1]! - v2[0]! * v1[1]!;
    const k1 = (y0[0]! * v2[1]! - v2[0]! * y0[1]!) / D, k2 = (v1[0]! * y0[1]! - y0[0]! * v1[1]!) / D;
    const T = new Float64Array(2);
    for (const t of [0.5, 30, 300, 3000]) {
      T[0] = 65; T[1] = 45;
      stepTemperatures(spec, T, Pcu, Pfe, 0, t);
      const w = 40 + xwInf + k1 * v1[0]! * Math.exp(l1 * t) + k2 * v2[0]! * Math.exp(l2 * t);
      const st = 40 + xsInf + k1 * v1[1]! * Math.exp(l1 * t) + k2 * v2[1]! * Math.exp(l2 * t);
      expect(Math.abs(T[0]! - w)).toBeLessThan(1e-9);
      expect(Math.abs(T[1]! - st)).toBeLessThan(1e-9);
    }
  });

  it('matches ode45-cash-karp on the ODE, heat removed included (general-purpose integrator)', () => {
    const Pcu = 1200, Pfe = 90;
    const f = (dy: number[] | Float64Array, y: number[] | Float64Array): void => {
      dy[0] = (Pcu - (y[0]! - y[1]!) / 0.05) / 900;
      dy[1] = (Pfe + (y[0]! - y[1]!) / 0.05 - (y[1]! - 40) / 0.02) / 9000;
      dy[2] = (y[1]! - 40) / 0.02;
    };
    const integ = ode45([70, 50, 0], f, 0, 0.1, { tol: 1e-12, dtMaxMag: 5 });
    while (integ.step(400)) { /* integrate */ }
    const T = new Float64Array([70, 50]);
    const removed = stepTemperatures(spec, T, Pcu, Pfe, 0, 400);
    expect(T[0]).toBeCloseTo(integ.y[0], 7);
    expect(T[1]).toBeCloseTo(integ.y[1], 7);
    expect(removed / integ.y[2]).toBeCloseTo(1, 9);
  });

  it('steps compose exactly, reach the steady state, and conserve energy (heat stored = losses - heat removed; common practice (no source))', () => {
    const one = new Float64Array([50, 45]), many = new Float64Array([50, 45]);
    stepTemperatures(spec, one, 700, 200, 0, 100);
    let removed = 0;
    for (let k = 0; k < 1000; k++) removed += stepTemperatures(spec, many, 700, 200, 0, 0.1);
    expect(Math.abs(one[0]! - many[0]!)).toBeLessThan(1e-9);
    expect(Math.abs(one[1]! - many[1]!)).toBeLessThan(1e-9);
    const stored = 900 * (many[0]! - 50) + 9000 * (many[1]! - 45);
    expect(Math.abs(stored - (900 * 100 - removed)) / (900 * 100)).toBeLessThan(1e-9);
    const ss = new Float64Array(2), far = new Float64Array([40, 40]);
    steadyTemperatures(spec, 700, 200, 0, ss);
    stepTemperatures(spec, far, 700, 200, 0, 1e5);
    expect(far[0]).toBeCloseTo(ss[0]!, 9);
    expect(far[1]).toBeCloseTo(ss[1]!, 9);
  });

  it('a self-ventilated motor: the resistance by speed, linear in |speed| and held beyond the ends (common practice (no source))', () => {
    const s = { ...spec, statorToCoolantBySpeed: { speed_rpm: [0, 3000, 6000], K_per_W: [0.08, 0.03, 0.02] } };
    expect(statorToCoolantAt(s, 0)).toBe(0.08);
    expect(statorToCoolantAt(s, -1500)).toBeCloseTo(0.055, 15);
    expect(statorToCoolantAt(s, 4500)).toBeCloseTo(0.025, 15);
    expect(statorToCoolantAt(s, 9000)).toBe(0.02);
    expect(statorToCoolantAt(spec, 9000)).toBe(0.02);
  });
});
