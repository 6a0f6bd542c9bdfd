// Energy balance of the flux-state plant (src/core/simulation/plant.ts) over a closed current loop:
// the electrical energy in (the plant's energy state, the integral of 1.5 (vd id + vq iq)) equals
// the mechanical energy out (the rotor's kinetic energy; no friction, no load) plus the copper loss
// 1.5 Rs |i|², because the field's stored energy returns to its start. That holds when the current
// is the gradient of a stored energy W(psi) (a reciprocal, lossless field): the power balance of
// Krause, Wasynczuk and Sudhoff (2002), Analysis of Electric Machinery and Drive Systems, ch. 1
// (energy balance of electromechanical systems) and ch. 5 (the machine in the rotor frame). A map
// whose d psid/d iq differs from d psiq/d id stores no energy function: a closed loop gains or loses
// the circulation of i·dpsi, and the balance breaks.
import { describe, expect, it } from 'vitest';
import { Plant, STATE_SIZE, loadSchedule } from '../src/core/simulation/plant';
import { CashKarpStepper } from '../src/core/simulation/stepper';
import type { MachineModel } from '../src/core/machine/machine-model';

const P = 4, RS = 0.05, J = 2e-3;
// W(psi) = a x²/2 + b q²/2 + c q⁴/4 + e x q²/2, x = psi_d - psif, q = psi_q (invented, saturating in q, cross-saturating)
const A = 1 / 0.3e-3, B = 1 / 0.9e-3, C = 6.9e4, E = 5e3, PSIF = 0.06;

/**
 * A saturating model given by its current as a function of flux: reciprocal (i = grad W) or, with
 * `reciprocal` false, the same d current without the cross term in iq (d id/d q = e q but d iq/d x = 0).
 */
function saturating(reciprocal: boolean): MachineModel {
  const cross = reciprocal ? E : 0;
  const cur = (pd: number, pq: number, out: Float64Array): void => {
    const x = pd - PSIF;
    out[0] = A * x + (E * pq * pq) / 2;
    out[1] = B * pq + C * pq * pq * pq + cross * x * pq;
  };
  // d i / d psi, the inverse of the incremental inductance
  const jac = (pd: number, pq: number, o: Float64Array): void => {
    o[0] = A; o[1] = E * pq; o[2] = cross * pq; o[3] = B + 3 * C * pq * pq + cross * (pd - PSIF);
  };
  const i = new Float64Array(2), G = new Float64Array(4), f = new Float64Array(2);
  const flux = (id: number, iq: number, out: Float64Array): void => {
    // Newton on cur(psi) = i from the linear guess
    let pd = PSIF + id / A, pq = iq / B;
    for (let k = 0; k < 60; k++) {
      cur(pd, pq, i); jac(pd, pq, G);
      const rd = id - i[0]!, rq = iq - i[1]!;
      const det = G[0]! * G[3]! - G[1]! * G[2]!;
      const dd = (G[3]! * rd - G[1]! * rq) / det, dq = (G[0]! * rq - G[2]! * rd) / det;
      pd += dd; pq += dq;
      if (Math.abs(dd) + Math.abs(dq) < 1e-16) break;
    }
    out[0] = pd; out[1] = pq;
  };
  return {
    polePairs: P, Rs: RS, linear: null,
    flux,
    torque: (id, iq) => { flux(id, iq, f); return 1.5 * P * (f[0]! * iq - f[1]! * id); },
    steadyVoltage: (id, iq, we, out) => { flux(id, iq, f); out[0] = RS * id - we * f[1]!; out[1] = RS * iq + we * f[0]!; },
    incrementalInductance: (id, iq, out) => {
      flux(id, iq, f); jac(f[0]!, f[1]!, G);
      const det = G[0]! * G[3]! - G[1]! * G[2]!;
      out[0] = G[3]! / det; out[1] = -G[1]! / det; out[2] = -G[2]! / det; out[3] = G[0]! / det;
    },
    current: (pd, pq, out) => cur(pd, pq, out),
  };
}

/**
 * Drive the plant (dq voltage, free rotor from rest, no friction, no load) so that the current goes
 * once around the loop i(s) = (-40 (1 - cos s), 60 (1 - cos s) + 50 sin s) A, s = 2 pi t / T, back
 * to zero: each hold period a dead-beat voltage aims the flux at the next target (then 40 more periods at zero current). Returns the
 * imbalance E_in - E_mech - E_cu relative to E_in, the copper loss by Simpson's rule on 8 sub-steps
 * per hold period.
 */
function loopImbalance(model: MachineModel): { rel: number; Ein: number; Ecu: number; Emech: number; iEnd: number } {
  const plant = new Plant({
    machine: model, inertia: J, viscousFriction: 0, coulombFriction: 0, load: loadSchedule(), mechanics: 'free',
    inputFrame: 'dq', coulombWidth_rad_s: 1e-3, states: 'flux',
  });
  const Ts = 1e-4, N = 400, T = N * Ts, SUB = 8, h = Ts / SUB, SETTLE = 40;
  const y = new Float64Array(STATE_SIZE);
  plant.setCurrents(y, 0, 0);
  const st = new CashKarpStepper(plant, h, y, 1e-11, Float64Array.from([1e-9, 1e-9, 1e-9, 1, Infinity]));
  const yi = new Float64Array(STATE_SIZE), target = new Float64Array(2);
  const i2 = (): number => { plant.currentState(y, yi); return yi[0]! * yi[0]! + yi[1]! * yi[1]!; };
  let Ecu = 0;
  // the loop, then SETTLE hold periods at its end (zero current) so the stored energy is back at its start
  for (let k = 0; k < N + SETTLE; k++) {
    const s = (2 * Math.PI * Math.min(k + 1, N)) / N;
    model.flux(-40 * (1 - Math.cos(s)), 60 * (1 - Math.cos(s)) + 50 * Math.sin(s), target);
    plant.currentState(y, yi);
    const we = P * y[2]!;
    plant.input[0] = (target[0]! - y[0]!) / Ts + RS * yi[0]! - we * y[1]!;
    plant.input[1] = (target[1]! - y[1]!) / Ts + RS * yi[1]! + we * y[0]!;
    let f0 = i2();
    for (let m = 0; m < SUB; m += 2) {
      const t = k * Ts + m * h;
      st.period(y, t, t + h);
      const f1 = i2();
      st.period(y, t + h, t + 2 * h);
      const f2 = i2();
      Ecu += 1.5 * RS * ((2 * h) / 6) * (f0 + 4 * f1 + f2);
      f0 = f2;
    }
  }
  expect(T).toBeCloseTo(0.04, 12);
  plant.currentState(y, yi);
  const Ein = y[4]!;
  const Emech = 0.5 * J * y[2]! * y[2]!;
  return { rel: Math.abs(Ein - Emech - Ecu) / Ein, Ein, Ecu, Emech, iEnd: Math.hypot(yi[0]!, yi[1]!) };
}

describe('energy balance of the flux-state plant over a closed current loop', () => {
  it('reciprocal saturating model: E_in = E_mech + E_cu within the integrator tolerance (1e-9 of E_in; measured 2.6e-12)', () => {
    const r = loopImbalance(saturating(true));
    // the loop closes (the current is back at zero) and every term is substantial
    expect(r.iEnd).toBeLessThan(1e-3);
    expect(r.Ecu).toBeGreaterThan(0.05 * r.Ein);
    expect(r.Emech).toBeGreaterThan(0.1 * r.Ein);
    expect(r.rel).toBeLessThan(1e-9);
  });

  it('a non-reciprocal map breaks the balance: the imbalance is orders of magnitude larger (measured 1.0e-3 of E_in)', () => {
    const good = loopImbalance(saturating(true));
    const bad = loopImbalance(saturating(false));
    expect(bad.iEnd).toBeLessThan(1e-3);
    expect(bad.rel).toBeGreaterThan(5e-4);
    expect(bad.rel).toBeGreaterThan(1e3 * good.rel);
  });
});
