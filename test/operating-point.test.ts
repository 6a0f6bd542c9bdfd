import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import type { DqMachine } from '../src/core/machine/dq-machine';
import type { DriveLimits } from '../src/core/drive/inverter-spec';
import { canHoldTorque, solveOperatingPoint, solveOperatingPointUnlimitedCurrent } from '../src/core/steady-state/operating-point';
import { baseSpeed, maxTorquePoint } from '../src/core/steady-state/envelope';
import { mtpaCurrentForTorque, mtpvPoint } from '../src/core/steady-state/mtpa';
import { InputError } from '../src/core/base/errors';

// Invented test machines.
const IPM: DqMachine = { polePairs: 4, Rs: 0.02, Ld: 0.12e-3, Lq: 0.3e-3, psiM: 0.045 };
const LIM: DriveLimits = { Vmax: 350 / Math.sqrt(3), Imax: 400 };
const SPM: DqMachine = { polePairs: 5, Rs: 0.08, Ld: 0.5e-3, Lq: 0.5e-3, psiM: 0.04 };
const SPM_LIM: DriveLimits = { Vmax: 30, Imax: 80 };

const torque = (m: DqMachine, id: number, iq: number) => 1.5 * m.polePairs * iq * (m.psiM + (m.Ld - m.Lq) * id);
function volt(m: DqMachine, w: number, id: number, iq: number): number {
  const we = m.polePairs * w;
  return Math.hypot(m.Rs * id - we * m.Lq * iq, m.Rs * iq + we * (m.Ld * id + m.psiM));
}

/**
 * Least current with torque T and |v| <= Vmax by a dense walk along the constant-torque curve
 * (iq from id), then a fine local walk (test only; knows nothing of the solver).
 */
function denseLeastCurrent(m: DqMachine, Vmax: number, w: number, T: number): number {
  let best = Infinity, bestId = 0;
  const dl = m.Ld - m.Lq;
  const scan = (lo: number, hi: number, n: number) => {
    for (let k = 0; k <= n; k++) {
      const id = lo + ((hi - lo) * k) / n;
      const den = 1.5 * m.polePairs * (m.psiM + dl * id);
      if (!(den * Math.sign(m.psiM + dl * id) > 0)) continue;
      const iq = T / den;
      if (volt(m, w, id, iq) > Vmax) continue;
      const c = Math.hypot(id, iq);
      if (c < best) { best = c; bestId = id; }
    }
  };
  scan(-2000, 2000, 400000);
  let h = 4000 / 400000;
  for (let level = 0; level < 5; level++) { scan(bestId - 3 * h, bestId + 3 * h, 3000); h = (6 * h) / 3000; }
  return best;
}

describe('operating point', () => {
  it('below base speed it is MTPA with slack voltage', () => {
    const p = solveOperatingPoint(IPM, LIM, 200, 100);
    const mt = mtpaCurrentForTorque(IPM, 100);
    expect(p.feasible).toBe(true);
    expect(p.region).toBe('mtpa');
    expect(p.limitedBy).toBe('none');
    expect(p.id).toBeCloseTo(mt.id, 9);
    expect(p.iq).toBeCloseTo(mt.iq, 9);
    expect(p.torque).toBeCloseTo(100, 9);
    expect(p.voltage).toBeLessThan(LIM.Vmax);
    expect(p.voltage).toBeCloseTo(volt(IPM, 200, p.id, p.iq), 9);
  });

  it('in field weakening it is the least current on the constant-torque curve with |v| = Vmax (Rs included)', () => {
    // common practice (no source): the least-current point with a binding voltage limit; checked by a dense walk
    for (const [w, T] of [[900, 60], [1500, 40], [1500, -40], [2500, 15], [2500, 0], [2500, 0.01], [2500, -0.01], [-2500, 0.01], [-1800, 30]] as const) {
      const p = solveOperatingPoint(IPM, LIM, w, T);
      expect(p.feasible).toBe(true);
      expect(p.region).toBe('field-weakening');
      expect(p.limitedBy).toBe('voltage');
      expect(p.voltage / LIM.Vmax).toBeCloseTo(1, 9);
      expect(p.torque).toBeCloseTo(T, 8);
      const ref = denseLeastCurrent(IPM, LIM.Vmax, w, T);
      expect(p.current).toBeLessThanOrEqual(ref * (1 + 1e-9));
      expect(p.current / ref).toBeCloseTo(1, 6);
    }
  });

  it('with Rs the voltage limit can force torque of one sign: a tiny torque costs the zero-torque current', () => {
    // common practice (no source): continuity of the least current in the torque
    const m: DqMachine = { polePairs: 2, Rs: 0.0001, Ld: 0.00001, Lq: 0.00001, psiM: 0.001 };
    const lim = { Vmax: 5, Imax: 1 };
    const z = solveOperatingPoint(m, lim, -2500.0041679052392, 0);
    const t = solveOperatingPoint(m, lim, -2500.0041679052392, 1e-12);
    expect(t.torque).toBeCloseTo(1e-12, 20);
    expect(t.current / z.current).toBeCloseTo(1, 8);
    expect(t.voltage).toBeLessThanOrEqual(lim.Vmax * (1 + 1e-12));
  });

  it('with a large Rs the voltage limit can force a least generating torque: smaller torques are infeasible (voltage)', () => {
    // common practice (no source): only the Rs drop of a generating current brings |v| under Vmax here;
    // the dense check below finds the reachable torque range [about 758, 1010] N·m (test only)
    const m: DqMachine = { polePairs: 5, Rs: 0.6256, Ld: 1.0787e-5, Lq: 1.0787e-5, psiM: 0.17984 };
    const lim = { Vmax: 528.97, Imax: 749.24 };
    const w = -983.67;
    const we = m.polePairs * w;
    let tmin = Infinity, tmax = -Infinity;
    for (let a = 0; a <= 600; a++) for (let b = 0; b <= 600; b++) {
      const id = -lim.Imax + (2 * lim.Imax * a) / 600, iq = -lim.Imax + (2 * lim.Imax * b) / 600;
      if (id * id + iq * iq > lim.Imax ** 2) continue;
      if (Math.hypot(m.Rs * id - we * m.Lq * iq, m.Rs * iq + we * (m.Ld * id + m.psiM)) > lim.Vmax) continue;
      const T = torque(m, id, iq);
      tmin = Math.min(tmin, T); tmax = Math.max(tmax, T);
    }
    expect(tmin).toBeGreaterThan(700);
    const small = solveOperatingPoint(m, lim, w, 92);
    expect(small.feasible).toBe(false);
    expect(small.limitedBy).toBe('voltage');
    expect(solveOperatingPointUnlimitedCurrent(m, lim.Vmax, w, 92).feasible).toBe(false);
    const mid = solveOperatingPoint(m, lim, w, 0.5 * (tmin + tmax));
    expect(mid.feasible).toBe(true);
    expect(mid.torque).toBeCloseTo(0.5 * (tmin + tmax), 8);
    const top = maxTorquePoint(m, lim, w, 'generating');
    expect(top.torque).toBeGreaterThanOrEqual(tmax * (1 - 1e-9));
    expect(top.torque / tmax).toBeCloseTo(1, 2);
  });

  it('zero torque with the open-circuit voltage below the limit needs no current', () => {
    const p = solveOperatingPoint(IPM, LIM, 100, 0);
    expect(p.current).toBe(0);
    expect(p.voltage).toBeCloseTo(IPM.polePairs * 100 * IPM.psiM, 12);
  });

  it('reports infeasible points with the limit that binds and what they would need', () => {
    // more torque than MTPA at Imax gives: current
    const tMax = maxTorquePoint(IPM, LIM, 100, 'motoring').torque;
    const c = solveOperatingPoint(IPM, LIM, 100, tMax * 1.1);
    expect(c.feasible).toBe(false);
    expect(c.limitedBy).toBe('current');
    expect(c.current).toBeGreaterThan(LIM.Imax);
    expect(c.torque).toBeCloseTo(tMax * 1.1, 8);
    // reachable by MTPA current within Imax, but field weakening needs more than Imax: both bind
    const w = 2 * baseSpeed(IPM, LIM);
    const tFw = maxTorquePoint(IPM, LIM, w, 'motoring').torque;
    const v = solveOperatingPoint(IPM, LIM, w, tFw * 1.05);
    expect(mtpaCurrentForTorque(IPM, tFw * 1.05).current).toBeLessThan(LIM.Imax);
    expect(v.feasible).toBe(false);
    expect(v.limitedBy).toBe('current-and-voltage');
    expect(v.current).toBeGreaterThan(LIM.Imax);
    expect(v.voltage / LIM.Vmax).toBeCloseTo(1, 9);
    // more than the MTPV torque at that speed: no current can do it
    const tMtpv = mtpvPoint(IPM, LIM.Vmax, w)!.torque;
    const b = solveOperatingPoint(IPM, LIM, w, tMtpv * 1.01);
    expect(b.feasible).toBe(false);
    expect(b.limitedBy).toBe('beyond-mtpv');
    expect(b.voltage).toBeGreaterThan(LIM.Vmax);
    // just below the MTPV torque the current-unlimited variant succeeds, in region mtpv or field weakening
    const u = solveOperatingPointUnlimitedCurrent(IPM, LIM.Vmax, w, tMtpv * 0.999);
    expect(u.feasible).toBe(true);
    expect(u.current).toBeGreaterThan(LIM.Imax);
    expect(u.torque).toBeCloseTo(tMtpv * 0.999, 8);
  });

  it('at the envelope torque it needs exactly Imax (consistency with maxTorquePoint)', () => {
    for (const f of [0.5, 1.5, 3]) {
      const w = f * baseSpeed(IPM, LIM);
      const e = maxTorquePoint(IPM, LIM, w, 'motoring');
      const p = solveOperatingPoint(IPM, LIM, w, e.torque * (1 - 1e-9));
      expect(p.feasible).toBe(true);
      expect(p.current / LIM.Imax).toBeCloseTo(1, 6);
    }
  });

  it('negative speed mirrors positive speed (iq and torque change sign, |v| the same)', () => {
    const a = solveOperatingPoint(IPM, LIM, 1500, 40);
    const b = solveOperatingPoint(IPM, LIM, -1500, -40);
    expect(b.id).toBeCloseTo(a.id, 8);
    expect(b.iq).toBeCloseTo(-a.iq, 8);
    expect(b.voltage).toBeCloseTo(a.voltage, 8);
    // generating at positive speed: Rs helps, less current than motoring in field weakening
    const g = solveOperatingPoint(IPM, LIM, 1500, -40);
    expect(g.torque).toBeCloseTo(-40, 8);
    expect(g.current).toBeLessThan(a.current);
  });

  it('SPM, reluctance and inverse-saliency machines give sensible points', () => {
    const s = solveOperatingPoint(SPM, SPM_LIM, 10, 5);
    expect(s.id).toBeCloseTo(0, 12);
    expect(s.current).toBeCloseTo(5 / (1.5 * 5 * 0.04), 9); // common practice (no source): I = T / (1.5 p psiM)
    const rel: DqMachine = { polePairs: 2, Rs: 0.1, Ld: 0.2e-3, Lq: 1.2e-3, psiM: 0 };
    const r = solveOperatingPoint(rel, { Vmax: 100, Imax: 300 }, 300, 10);
    expect(r.feasible).toBe(true);
    expect(r.torque).toBeCloseTo(10, 8);
    const inv: DqMachine = { polePairs: 2, Rs: 0.05, Ld: 0.6e-3, Lq: 0.3e-3, psiM: 0.05 };
    const q = solveOperatingPoint(inv, { Vmax: 100, Imax: 300 }, 50, 20);
    expect(q.id).toBeGreaterThan(0);
    expect(q.torque).toBeCloseTo(20, 8);
  });

  it('rejects bad input with InputError', () => {
    expect(() => solveOperatingPoint(IPM, { Vmax: 0, Imax: 10 }, 1, 1)).toThrow(InputError);
    expect(() => solveOperatingPoint(IPM, LIM, Number.NaN, 1)).toThrow(/speed/);
    expect(() => solveOperatingPoint({ ...IPM, Lq: -1 }, LIM, 1, 1)).toThrow(/motor.Lq must be > 0 H/);
  });

  it('property: no NaN; feasible points meet the torque within both limits', () => {
    const machine = fc.record({
      polePairs: fc.integer({ min: 1, max: 10 }),
      Rs: fc.oneof(fc.constant(0), fc.double({ min: 1e-4, max: 1, noNaN: true })),
      Ld: fc.double({ min: 1e-5, max: 1e-2, noNaN: true }),
      ratio: fc.oneof(fc.constant(1), fc.double({ min: 0.3, max: 5, noNaN: true })),
      psiM: fc.oneof(fc.constant(0), fc.double({ min: 1e-3, max: 0.5, noNaN: true })),
    }).filter((r) => r.psiM > 0 || r.ratio !== 1)
      .map((r): DqMachine => ({ polePairs: r.polePairs, Rs: r.Rs, Ld: r.Ld, Lq: r.Ld * r.ratio, psiM: r.psiM }));
    fc.assert(fc.property(machine, fc.double({ min: 5, max: 800, noNaN: true }), fc.double({ min: 1, max: 800, noNaN: true }),
      fc.double({ min: -5000, max: 5000, noNaN: true }), fc.double({ min: -500, max: 500, noNaN: true }),
      (m, Vmax, Imax, w, T) => {
        const p = solveOperatingPoint(m, { Vmax, Imax }, w, T);
        for (const x of [p.torque, p.id, p.iq, p.current, p.vd, p.vq, p.voltage]) expect(Number.isFinite(x)).toBe(true);
        // the quick feasibility test agrees with the solver (away from the boundary itself)
        const hold = canHoldTorque(m, { Vmax, Imax }, w, T);
        if (p.feasible && p.current < Imax * (1 - 1e-6)) expect(hold).toBe(true);
        if (!p.feasible && p.current > Imax * (1 + 1e-6)) expect(hold).toBe(false);
        if (p.feasible) {
          expect(p.current).toBeLessThanOrEqual(Imax * (1 + 1e-9));
          expect(p.voltage).toBeLessThanOrEqual(Vmax * (1 + 1e-9));
          expect(Math.abs(p.torque - T)).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(T)));
        } else {
          expect(['current', 'current-and-voltage', 'voltage', 'beyond-mtpv']).toContain(p.limitedBy);
        }
      }), { numRuns: 300 });
  });
});
