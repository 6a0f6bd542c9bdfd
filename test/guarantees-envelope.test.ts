// Numeric guarantees of the envelope solver on a few hundred random machines (fixed seed): SPM,
// IPM, inverse saliency, with and without Rs, motoring and generating, at speeds from standstill
// to beyond the maximum speed.
//  1. every returned point keeps |i| <= Imax and |v| <= Vmax to 1e-9 relative;
//  2. the returned torque is never below the true maximum by more than the stated `accuracy`
//     (relative to the torque scale of the machine, MTPA torque at Imax), the true maximum taken
//     from an independent search of the two boundary curves (below).
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { maxTorquePoint, computeEnvelope, baseSpeed, maximumSpeed, ENVELOPE_ACCURACY } from '../src/core/steady-state/envelope';
import { mtpaTorque } from '../src/core/steady-state/mtpa';
import type { DqMachine } from '../src/core/machine/dq-machine';
import type { DriveLimits } from '../src/core/drive/inverter-spec';

const torque = (m: DqMachine, id: number, iq: number): number => 1.5 * m.polePairs * iq * (m.psiM + (m.Ld - m.Lq) * id);
function volt(m: DqMachine, we: number, id: number, iq: number): number {
  const vd = m.Rs * id - we * m.Lq * iq;
  const vq = m.Rs * iq + we * (m.Ld * id + m.psiM);
  return Math.hypot(vd, vq);
}

/**
 * Independent reference: the torque has no interior maximum on the feasible set (it is linear for
 * SPM and an indefinite quadratic otherwise), so the maximum lies on the current circle or on the
 * voltage ellipse. Each curve is sampled at N angles; at the best feasible sample the maximum is
 * refined by golden section (both neighbours feasible) or by bisection of the feasibility edge
 * (the crossing of the two curves).
 */
function referenceMax(m: DqMachine, lim: DriveLimits, w: number, sign: 1 | -1, N = 4096): number {
  const we = m.polePairs * w;
  const circle = (t: number): [number, number] => [lim.Imax * Math.cos(t), lim.Imax * Math.sin(t)];
  // voltage ellipse: the current whose voltage is Vmax (cos t, sin t): [Rs, -we Lq; we Ld, Rs] i = v - (0, we psiM)
  const det = m.Rs * m.Rs + we * we * m.Ld * m.Lq;
  const ellipse = (t: number): [number, number] => {
    const vd = lim.Vmax * Math.cos(t);
    const vq = lim.Vmax * Math.sin(t) - we * m.psiM;
    return [(m.Rs * vd + we * m.Lq * vq) / det, (-we * m.Ld * vd + m.Rs * vq) / det];
  };
  const okCircle = (i: [number, number]): boolean => volt(m, we, i[0], i[1]) <= lim.Vmax;
  const okEllipse = (i: [number, number]): boolean => Math.hypot(i[0], i[1]) <= lim.Imax;
  let best = -Infinity;
  const curves: Array<[(t: number) => [number, number], (i: [number, number]) => boolean]> = [[circle, okCircle]];
  if (det > 0) curves.push([ellipse, okEllipse]);
  for (const [curve, ok] of curves) {
    const h = (2 * Math.PI) / N;
    const J = (t: number): number => {
      const i = curve(t);
      return ok(i) ? sign * torque(m, i[0], i[1]) : -Infinity;
    };
    let kb = -1, jb = -Infinity;
    for (let k = 0; k < N; k++) {
      const v = J(k * h);
      if (v > jb) { jb = v; kb = k; }
    }
    if (kb < 0) continue;
    best = Math.max(best, jb);
    const t0 = kb * h;
    // the feasible stretch around the best sample: a neighbour, or the bisected crossing of the two curves
    const edge = (dir: -1 | 1): number => {
      if (J(t0 + dir * h) > -Infinity) return t0 + dir * h;
      let inS = t0, outS = t0 + dir * h;
      for (let it = 0; it < 80; it++) {
        const mid = 0.5 * (inS + outS);
        if (J(mid) > -Infinity) inS = mid; else outS = mid;
      }
      return inS;
    };
    let a = edge(-1), b = edge(1);
    best = Math.max(best, J(a), J(b));
    // golden section on that stretch (the torque along a curve has one maximum near the best sample)
    const g = (Math.sqrt(5) - 1) / 2;
    for (let it = 0; it < 100; it++) {
      const c = b - g * (b - a), d = a + g * (b - a);
      if (J(c) > J(d)) b = d; else a = c;
    }
    best = Math.max(best, J(0.5 * (a + b)));
  }
  return best; // sign * torque; -Infinity when the sets do not meet
}

const machineArb = fc
  .record({
    kind: fc.constantFrom('spm', 'ipm', 'inverse'),
    polePairs: fc.integer({ min: 1, max: 8 }),
    logLd: fc.double({ min: Math.log(1e-5), max: Math.log(1e-2), noNaN: true }),
    ratio: fc.double({ min: 1.3, max: 5, noNaN: true }),
    // characteristic current psiM/Ld relative to Imax: from deep field weakening to none
    charRatio: fc.double({ min: 0.2, max: 3, noNaN: true }),
    rsRatio: fc.oneof(fc.constant(0), fc.double({ min: 1e-3, max: 0.3, noNaN: true })),
    Imax: fc.double({ min: 5, max: 500, noNaN: true }),
    Vmax: fc.double({ min: 10, max: 400, noNaN: true }),
  })
  .map((r) => {
    const Ld = Math.exp(r.logLd);
    const Lq = r.kind === 'spm' ? Ld : r.kind === 'ipm' ? Ld * r.ratio : Ld / r.ratio;
    const m: DqMachine = { polePairs: r.polePairs, Rs: (r.rsRatio * r.Vmax) / r.Imax, Ld, Lq, psiM: r.charRatio * Ld * r.Imax };
    return { kind: r.kind, m, lim: { Vmax: r.Vmax, Imax: r.Imax } as DriveLimits };
  });

const MACHINES = fc.sample(machineArb, { seed: 424242, numRuns: 300 });
const SPEED_FRACTIONS = [0, 0.5, 0.999, 1.001, 1.5, 3, 8];

describe('envelope solver: limits and optimality on 300 random machines', () => {
  it('covers SPM, IPM and inverse saliency, with and without Rs', () => {
    const kinds = new Set(MACHINES.map((x) => x.kind));
    expect(kinds).toEqual(new Set(['spm', 'ipm', 'inverse']));
    expect(MACHINES.filter((x) => x.m.Rs > 0).length).toBeGreaterThan(100);
    expect(MACHINES.filter((x) => x.m.Rs === 0).length).toBeGreaterThan(20);
  });

  it('never exceeds |i| <= Imax or |v| <= Vmax by more than 1e-9 relative, and never misses the maximum by more than `accuracy`', () => {
    let solves = 0;
    let worstViolation = 0;
    let worstMiss = 0;
    const misses: string[] = [];
    for (const { m, lim, kind } of MACHINES) {
      const scale = mtpaTorque(m, lim.Imax);
      const wb = baseSpeed(m, lim);
      const wmax = maximumSpeed(m, lim);
      const ref = wb > 0 ? wb : lim.Vmax / (m.polePairs * Math.max(m.psiM, m.Ld * lim.Imax));
      const speeds = [...SPEED_FRACTIONS.map((f) => f * ref), ...(wmax !== null ? [0.9 * wmax, 0.999 * wmax, 1.01 * wmax] : [])];
      for (const w of speeds) {
        for (const dir of ['motoring', 'generating'] as const) {
          const sign = dir === 'motoring' ? 1 : -1;
          const op = maxTorquePoint(m, lim, w, dir);
          solves++;
          // a feasible answer keeps both limits (beyond the maximum speed the answer is the
          // open-circuit point, marked infeasible, whose voltage is the back-EMF)
          if (op.feasible) worstViolation = Math.max(worstViolation, op.current / lim.Imax - 1, op.voltage / lim.Vmax - 1);
          else expect(op.torque).toBe(0);
          const truth = referenceMax(m, lim, w, sign);
          const got = op.feasible ? sign * op.torque : 0;
          const best = Math.max(truth, 0); // no torque of the direction: the solver answers 0
          const miss = (best - got) / scale;
          if (miss > worstMiss) worstMiss = miss;
          if (miss > ENVELOPE_ACCURACY) misses.push(`${kind} ${JSON.stringify(m)} ${JSON.stringify(lim)} w=${w} ${dir}: got ${got}, reference ${best}, miss ${miss.toExponential(2)}`);
          // and the solver's point is feasible, so it cannot beat the true maximum beyond rounding
          if (got > best + 1e-9 * scale) misses.push(`reference below the solver: ${kind} ${JSON.stringify(m)} ${JSON.stringify(lim)} w=${w} ${dir}: got ${got} (|i| ${op.current}, |v| ${op.voltage}), reference ${best}`);
        }
      }
    }
    if (process.env.TRUST_FIGURES) console.log(JSON.stringify({ solves, worstViolation, worstMiss }));
    expect(solves).toBeGreaterThan(4000);
    expect(worstViolation).toBeLessThanOrEqual(1e-9);
    expect(misses.slice(0, 5)).toEqual([]);
    expect(worstMiss).toBeLessThanOrEqual(ENVELOPE_ACCURACY);
  });

  it('the envelope arrays keep both limits at every point and report the stated accuracy', () => {
    for (const { m, lim } of MACHINES.slice(0, 100)) {
      const env = computeEnvelope(m, lim, { points: 60 });
      expect(env.accuracy).toBe(ENVELOPE_ACCURACY);
      for (let k = 0; k < 60; k++) {
        if (!env.feasible[k]) {
          expect(env.torque[k]).toBe(0);
          continue;
        }
        expect(env.current[k]).toBeLessThanOrEqual(lim.Imax * (1 + 1e-9));
        expect(env.voltage[k]).toBeLessThanOrEqual(lim.Vmax * (1 + 1e-9));
        expect(Number.isFinite(env.torque[k])).toBe(true);
      }
    }
  });
});
