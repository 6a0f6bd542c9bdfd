import { describe, expect, it } from 'vitest';
import ode45 from 'ode45-cash-karp';
import { DqPropagator, type DqConstants } from '../src/core/simulation/dq-propagator';

/** a small deterministic generator (common practice, no source: the 32-bit mulberry generator) */
function rng(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (s + 0x6d2b79f5) >>> 0;
    let t = s;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
const logU = (r: () => number, lo: number, hi: number): number => lo * Math.pow(hi / lo, r());

/**
 * Reference: the dq current equations with the voltage rotating as vd + j vq = V e^{-j we t},
 * integrated by ode45-cash-karp (Cash and Karp (1990), ACM TOMS 16(3)) at tol 1e-13 with at most
 * dt/200 per step.
 */
function reference(m: DqConstants, we: number, dt: number, id0: number, iq0: number, vd0: number, vq0: number): [number, number] {
  const f = (dy: number[], y: number[], t: number): void => {
    const c = Math.cos(we * t), s = Math.sin(we * t);
    const vd = vd0 * c + vq0 * s, vq = -vd0 * s + vq0 * c;
    dy[0] = (vd - m.Rs * y[0]! + we * m.Lq * y[1]!) / m.Ld;
    dy[1] = (vq - m.Rs * y[1]! - we * (m.Ld * y[0]! + m.psiM)) / m.Lq;
  };
  const integ = ode45([id0, iq0], f as never, 0, dt / 200, { tol: 1e-13, dtMaxMag: dt / 200, verbose: false });
  let g = 0;
  while (g++ < 100000 && integ.step(dt)) { /* to the end */ }
  return [integ.y[0]!, integ.y[1]!];
}

interface Case { m: DqConstants; we: number; dt: number; id0: number; iq0: number; vd0: number; vq0: number }

function check(c: Case, tol = 1e-10, boundMax = 1e-11): number {
  const p = new DqPropagator(c.m);
  p.setStep(c.we, c.dt);
  const out = new Float64Array(2);
  p.propagate(c.id0, c.iq0, c.vd0, c.vq0, out, 0);
  const [rd, rq] = reference(c.m, c.we, c.dt, c.id0, c.iq0, c.vd0, c.vq0);
  // relative to the currents at both ends plus the current the voltage drives through the smaller inductance in dt
  const scale = Math.hypot(c.id0, c.iq0) + Math.hypot(rd, rq) + (Math.hypot(c.vd0, c.vq0) * c.dt) / Math.min(c.m.Ld, c.m.Lq);
  const err = Math.hypot(out[0]! - rd, out[1]! - rq) / scale;
  expect(err, JSON.stringify(c)).toBeLessThan(tol);
  expect(p.errorBound(c.id0, c.iq0, c.vd0, c.vq0) / scale).toBeLessThan(boundMax);
  return err;
}

function randomCase(r: () => number): Case {
  const Ld = logU(r, 2e-5, 5e-3);
  return {
    m: { Rs: logU(r, 1e-3, 2), Ld, Lq: Ld * logU(r, 0.3, 4), psiM: 0.2 * r() },
    we: (r() - 0.5) * 2 * logU(r, 1, 5000),
    dt: logU(r, 1e-5, 5e-4),
    id0: (r() - 0.5) * 400, iq0: (r() - 0.5) * 400,
    vd0: (r() - 0.5) * 600, vq0: (r() - 0.5) * 600,
  };
}

describe('exact dq propagator against ode45-cash-karp (tol 1e-13)', () => {
  it('random machines, speeds, voltages and steps: within 1e-10 of the current scale', () => {
    const r = rng(14);
    for (let k = 0; k < 60; k++) check(randomCase(r));
  });

  it('Ld = Lq (no saliency), we = 0, Rs tiny, large we dt, repeated and overdamped eigenvalues', () => {
    const base = { Rs: 0.05, Ld: 2e-4, Lq: 5e-4, psiM: 0.08 };
    const x = { id0: -40, iq0: 120, vd0: 30, vq0: 210, dt: 1e-4 };
    check({ m: { ...base, Lq: 2e-4 }, we: 1500, ...x });
    check({ m: base, we: 0, ...x });
    // L/(Rs dt) = 2e5: still within 1e-10, and errorBound reports the resonance's amplification
    check({ m: { ...base, Rs: 1e-5 }, we: 800, ...x }, 1e-10, 1e-9);
    const p = new DqPropagator({ ...base, Rs: 1e-5 });
    p.setStep(800, x.dt);
    expect(p.errorBound(x.id0, x.iq0, x.vd0, x.vq0)).toBeGreaterThan(1e-9);
    check({ m: base, we: 40000, ...x }); // 4 rad per step
    check({ m: base, we: -25000, ...x, dt: 5e-4 }); // 12.5 rad per step
    // we^2 = ((Rs/Ld - Rs/Lq)/2)^2: a repeated real eigenvalue, and either side of it
    const q = 0.5 * (base.Rs / base.Ld - base.Rs / base.Lq);
    for (const f of [1, 1 - 1e-9, 1 + 1e-9, 1 - 1e-4, 1 + 1e-4]) check({ m: base, we: q * f, ...x });
    // strongly overdamped: large Rs, strong saliency, low speed (eigenvalue gap x dt >> 1)
    check({ m: { Rs: 20, Ld: 2e-5, Lq: 4e-4, psiM: 0.05 }, we: 50, ...x, dt: 5e-4 });
  });

  it('the step composes: two half steps (the voltage rotated by we dt/2 between them) equal one whole step', () => {
    // e^{A dt} = e^{A dt/2} e^{A dt/2} and the particular solutions chain (common practice, no source)
    const m = { Rs: 0.03, Ld: 1.5e-4, Lq: 4e-4, psiM: 0.07 };
    const p = new DqPropagator(m);
    const o = new Float64Array(4);
    const we = 2200, dt = 1e-4, vd = 50, vq = 180;
    p.setStep(we, dt);
    p.propagate(10, 90, vd, vq, o, 0);
    p.setStep(we, dt / 2);
    p.propagate(10, 90, vd, vq, o, 2);
    p.propagate(o[2]!, o[3]!, vd * p.cw + vq * p.sw, -vd * p.sw + vq * p.cw, o, 2);
    expect(Math.abs(o[0]! - o[2]!)).toBeLessThan(1e-12 * 100);
    expect(Math.abs(o[1]! - o[3]!)).toBeLessThan(1e-12 * 100);
  });

  it('non-salient machine: the particular solutions are Ohm\'s law in the stationary frame and the short-circuit phasor current', () => {
    // Ld = Lq = L: a constant alpha-beta voltage drives the DC current V/Rs (the rotating part in dq is
    // V/Rs, k1 = 1/Rs, k2 = -j/Rs), and the back-EMF alone the phasor current -j we psiM / (Rs + j we L)
    // (steady-state phasor analysis of the synchronous machine; common practice, no source)
    const L = 3e-4, Rs = 0.02, psiM = 0.06, we = 1200;
    const p = new DqPropagator({ Rs, Ld: L, Lq: L, psiM });
    p.setStep(we, 1e-4);
    expect(p.k1r).toBeCloseTo(1 / Rs, 9);
    expect(p.k1i).toBe(0);
    expect(p.k2r).toBe(0);
    expect(p.k2i).toBeCloseTo(-1 / Rs, 9);
    const den = Rs * Rs + we * we * L * L;
    expect(p.xcd).toBeCloseTo((-we * psiM * we * L) / den, 9);
    expect(p.xcq).toBeCloseTo((-we * psiM * Rs) / den, 9);
  });

  it('Rs = 0: the closed form does not apply and errorBound says so (Infinity)', () => {
    const p = new DqPropagator({ Rs: 0, Ld: 2e-4, Lq: 5e-4, psiM: 0.08 });
    p.setStep(1000, 1e-4);
    expect(p.errorBound(10, 20, 30, 40)).toBe(Infinity);
    p.setStep(0, 1e-4);
    expect(p.errorBound(10, 20, 30, 40)).toBe(Infinity);
  });
});
