import { describe, expect, it } from 'vitest';
import { ActiveFluxObserver, correctionWeight } from '../src/core/control/sensorless-active-flux';

// Active flux psi_a = psi_s - Lq i lies on the rotor d axis with magnitude psiM + (Ld - Lq) id
// (Boldea, Paicu and Andreescu (2008), Active flux concept for motion-sensorless unified AC drives,
// IEEE Trans. Power Electronics 23(5), from memory). The synthetic data below are an exact steady
// state of the dq model (Krause, Wasynczuk and Sudhoff (2002), Analysis of Electric Machinery and
// Drive Systems, ch. 5): constant (id, iq) at speed we, the stator flux
// psi_s(t) = e^{j we t} (Ld id + psiM + j Lq iq), and the voltage held over a period whose integral
// is exactly psi_s(t_k) - psi_s(t_k-1) + Rs * (trapezoid of i) (what the observer integrates).
const m = { Rs: 0.02, Ld: 3e-4, Lq: 7.5e-4, psiM: 0.065 };
const Ts = 1e-4;

/** run n periods at speed we with true (id, iq); the observer is handed the angle theta + delta */
function runSteady(obs: ActiveFluxObserver, we: number, id: number, iq: number, n: number, delta = 0): { t: number } {
  const psiD = m.Ld * id + m.psiM, psiQ = m.Lq * iq;
  const at = (k: number) => {
    const th = we * k * Ts, c = Math.cos(th), s = Math.sin(th);
    return { th, c, s, ia: c * id - s * iq, ib: s * id + c * iq, pa: c * psiD - s * psiQ, pb: s * psiD + c * psiQ };
  };
  let prev = at(0);
  obs.reset(delta, prev.ia, prev.ib);
  // the first update is at the reset's instant: it integrates nothing, whatever the voltage
  const a0 = obs.psiA, b0 = obs.psiB;
  obs.update(prev.ia, prev.ib, 1e3, -1e3, Ts, Math.cos(delta), Math.sin(delta));
  expect([obs.psiA, obs.psiB]).toEqual([a0, b0]);
  for (let k = 1; k <= n; k++) {
    const x = at(k);
    const va = (x.pa - prev.pa) / Ts + m.Rs * 0.5 * (x.ia + prev.ia);
    const vb = (x.pb - prev.pb) / Ts + m.Rs * 0.5 * (x.ib + prev.ib);
    obs.update(x.ia, x.ib, va, vb, Ts, Math.cos(x.th + delta), Math.sin(x.th + delta));
    prev = x;
  }
  return { t: n * Ts };
}

describe('active-flux observer', () => {
  it('matched parameters and angle: the active flux is psiM + (Ld - Lq) id on the d axis, to 1e-9 Wb', () => {
    const obs = new ActiveFluxObserver(m, 60, 900);
    const we = 800, id = -100, iq = 150, n = 3000;
    runSteady(obs, we, id, iq, n);
    const th = we * n * Ts;
    const fd = Math.cos(th) * obs.faA + Math.sin(th) * obs.faB;
    const fq = -Math.sin(th) * obs.faA + Math.cos(th) * obs.faB;
    expect(Math.abs(fd - (m.psiM + (m.Ld - m.Lq) * id))).toBeLessThan(1e-9);
    expect(Math.abs(fq)).toBeLessThan(1e-9);
  });

  it('a wrong psiM in the current model moves the flux by W(we) dpsiM, W from the discrete loop (derivation in the source), to 1e-6 relative', () => {
    const dpsi = 0.2 * m.psiM;
    const obs = new ActiveFluxObserver({ ...m, psiM: m.psiM + dpsi }, 60, 900);
    const W = new Float64Array(2);
    for (const we of [150, 800, 2000]) {
      const n = 8000;
      runSteady(obs, we, -50, 120, n);
      const th = we * n * Ts, c = Math.cos(th), s = Math.sin(th);
      // flux error in the rotor frame: the estimate minus the true stator flux
      const ed = c * obs.psiA + s * obs.psiB - (m.Ld * -50 + m.psiM);
      const eq = -s * obs.psiA + c * obs.psiB - m.Lq * 120;
      correctionWeight(60, 900, we, Ts, W);
      expect(Math.abs(ed - W[0]! * dpsi) / (Math.hypot(W[0]!, W[1]!) * dpsi)).toBeLessThan(1e-6);
      expect(Math.abs(eq - W[1]! * dpsi) / (Math.hypot(W[0]!, W[1]!) * dpsi)).toBeLessThan(1e-6);
    }
  });

  it('the discrete weight tends to K/(j we + K), K = kp + ki/(j we), as Ts -> 0 (continuous loop, common practice)', () => {
    const kp = 60, ki = 900, we = 500, W = new Float64Array(2);
    correctionWeight(kp, ki, we, 1e-7, W);
    // K = kp - j ki/we; W = K / (K + j we)
    const Kr = kp, Ki = -ki / we, dr = Kr, di = Ki + we, dd = dr * dr + di * di;
    expect(W[0]!).toBeCloseTo((Kr * dr + Ki * di) / dd, 5);
    expect(W[1]!).toBeCloseTo((Ki * dr - Kr * di) / dd, 5);
  });

  it('at standstill the current model rules: W(0) = 1; refuses bad terms', () => {
    const W = new Float64Array(2);
    correctionWeight(60, 900, 0, Ts, W);
    expect(W[0]).toBe(1);
    expect(() => new ActiveFluxObserver({ ...m, Ld: 0 }, 1, 1)).toThrow(/Ld, Lq > 0/);
  });
});
