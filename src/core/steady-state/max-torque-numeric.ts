/**
 * Maximum torque under both limits at one speed for any machine model (the generic numeric path of
 * max-torque.ts): only the model's torque, steady voltage and incremental inductances are used. The
 * candidates are those of the closed-form search, each found numerically:
 *  - local maxima of torque along the current circle (64 samples, golden section, Newton polish),
 *    kept when the voltage fits (region 0; the best of them is MTPA at Imax); found once per model,
 *    Imax and sign and kept in the run's work (they do not depend on speed);
 *  - local maxima of torque along the voltage boundary, the boundary current by Newton on the
 *    steady voltage (32 samples of the voltage angle, golden section, polish), kept inside the
 *    circle (region 2, MTPV);
 *  - crossings of the circle with the voltage boundary (64 samples; pairs hidden between samples
 *    by a golden-section minimum of |v|²), refined by the Illinois regula falsi to the last bit keeping
 *    the feasible end (region 1).
 * Golden sections take 30 steps (the bracket shrinks to 2e-6 of itself) before the polish.
 * The best candidate wins. Morimoto, Takeda, Hirasa, Taniguchi (1990), Expansion of operating limits
 * for permanent magnet motor by current vector control considering inverter capacity, IEEE Trans.
 * Ind. Appl. 26(5).
 */
import type { MachineModel } from '../machine/machine-model';
import { type NumericScratch, numericScratch } from '../machine/model-numeric';
import { goldenSectionMax, polishMax } from '../mathematics/root-finding';
import { currentOnVoltageBoundaryNumeric } from './voltage-boundary';

/** The answer of a max-torque search. */
export interface MaxTorqueResult {
  ok: boolean;
  id: number;
  iq: number;
  /** objective sign * torque */
  J: number;
  /** 0 mtpa, 1 field-weakening, 2 mtpv */
  region: 0 | 1 | 2;
}

/** Work of the numeric path, owned by one run. */
export interface NumericMaxTorqueWork {
  readonly s: NumericScratch;
  readonly v: Float64Array;
  readonly c: Float64Array;
  readonly g: Float64Array;
  readonly L: Float64Array;
  readonly samples: Float64Array;
  readonly radius: Float64Array;
  readonly best: MaxTorqueResult;
  /**
   * The torque maxima along the current circle do not depend on speed: kept for the model, Imax and
   * sign they were found for (a model's flux never changes), so an envelope finds them once.
   */
  readonly circle: CircleMaxima;
}

/** Local torque maxima along the circle of radius Imax: their angles, and the best (MTPA at Imax). */
interface CircleMaxima {
  model: MachineModel | null;
  Imax: number;
  sign: number;
  count: number;
  readonly t: Float64Array;
  mtpaT: number;
  mtpaJ: number;
}

const NC = 64;
const NV = 32;
const NX = 64;
const GOLDEN_STEPS = 30;

export const numericMaxTorqueWork = (): NumericMaxTorqueWork => ({
  s: numericScratch(), v: new Float64Array(2), c: new Float64Array(2), g: new Float64Array(2), L: new Float64Array(4),
  samples: new Float64Array(NX), radius: new Float64Array(NV), best: { ok: false, id: 0, iq: 0, J: -Infinity, region: 0 },
  circle: { model: null, Imax: Number.NaN, sign: 0, count: 0, t: new Float64Array(NC), mtpaT: 0, mtpaJ: -Infinity },
});

/** The local torque maxima along the circle (golden section, Newton polish) into w.circle, unless already there. */
function circleMaxima(m: MachineModel, Imax: number, sign: 1 | -1, w: NumericMaxTorqueWork): CircleMaxima {
  const c = w.circle;
  if (c.model === m && c.Imax === Imax && c.sign === sign) return c;
  const jc = (t: number): number => sign * m.torque(Imax * Math.cos(t), Imax * Math.sin(t));
  const h = (2 * Math.PI) / NC;
  for (let k = 0; k < NC; k++) w.samples[k] = jc(k * h);
  c.count = 0; c.mtpaJ = -Infinity; c.mtpaT = 0;
  for (let k = 0; k < NC; k++) {
    const a = w.samples[(k + NC - 1) % NC]!, b = w.samples[k]!, cc = w.samples[(k + 1) % NC]!;
    if (!(b >= a && b >= cc)) continue;
    goldenSectionMax(jc, (k - 1) * h, (k + 1) * h, GOLDEN_STEPS, w.g);
    const t = polishMax(jc, w.g[0]!, (k - 1) * h, (k + 1) * h, 1e-3);
    const j = jc(t);
    if (j > c.mtpaJ) { c.mtpaJ = j; c.mtpaT = t; }
    c.t[c.count++] = t;
  }
  c.model = m; c.Imax = Imax; c.sign = sign;
  return c;
}

/** The largest sign*torque within Imax (may be Infinity) and Vmax at electrical speed we, into out. */
export function maxTorqueNumeric(m: MachineModel, Vmax: number, Imax: number, we: number, sign: 1 | -1, out: MaxTorqueResult, w: NumericMaxTorqueWork, floor = 0): void {
  const vm2 = Vmax * Vmax;
  const finiteI = Number.isFinite(Imax);
  const best = w.best;
  best.J = -Infinity;
  const v2 = (id: number, iq: number): number => {
    m.steadyVoltage(id, iq, we, w.v);
    return w.v[0]! * w.v[0]! + w.v[1]! * w.v[1]!;
  };
  const offer = (id: number, iq: number, region: 0 | 1 | 2): void => {
    const j = sign * m.torque(id, iq);
    if (j > best.J) { best.J = j; best.id = id; best.iq = iq; best.region = region; }
  };
  out.ok = false;
  if (finiteI) {
    // torque maxima along the circle; the best is MTPA at Imax: the answer when its voltage fits
    const c = circleMaxima(m, Imax, sign, w);
    const mtpaJ = c.mtpaJ, mtpaT = c.mtpaT;
    for (let k = 0; k < c.count; k++) {
      const t = c.t[k]!;
      if (v2(Imax * Math.cos(t), Imax * Math.sin(t)) <= vm2) offer(Imax * Math.cos(t), Imax * Math.sin(t), 0);
    }
    const id = Imax * Math.cos(mtpaT), iq = Imax * Math.sin(mtpaT);
    if (mtpaJ > -Infinity && v2(id, iq) <= vm2) {
      out.ok = true; out.id = id; out.iq = iq; out.J = mtpaJ; out.region = 0;
      return;
    }
  }
  // torque maxima along the voltage boundary, inside the circle
  m.incrementalInductance(0, 0, w.L);
  if (m.Rs * m.Rs + we * we * w.L[0]! * w.L[3]! > 0) {
    w.c[0] = 0; w.c[1] = 0;
    const jv = (phi: number): number => {
      currentOnVoltageBoundaryNumeric(m, Vmax, we, phi, w.c, w.s);
      return sign * m.torque(w.c[0]!, w.c[1]!);
    };
    const h = (2 * Math.PI) / NV;
    for (let k = 0; k < NV; k++) {
      w.samples[k] = jv(k * h);
      w.radius[k] = Math.hypot(w.c[0]!, w.c[1]!);
    }
    for (let k = 0; k < NV; k++) {
      const a = w.samples[(k + NV - 1) % NV]!, b = w.samples[k]!, c = w.samples[(k + 1) % NV]!;
      if (!(b >= a && b >= c)) continue;
      goldenSectionMax(jv, (k - 1) * h, (k + 1) * h, GOLDEN_STEPS, w.g);
      const phi = polishMax(jv, w.g[0]!, (k - 1) * h, (k + 1) * h, 1e-3);
      jv(phi);
      const id = w.c[0]!, iq = w.c[1]!;
      if (id * id + iq * iq <= Imax * Imax) offer(id, iq, 2);
    }
  }
  if (finiteI) {
    // crossings of the circle with the voltage boundary
    const g = (t: number): number => v2(Imax * Math.cos(t), Imax * Math.sin(t)) - vm2;
    const cross = (a: number, b: number, ga: number, gb: number): void => {
      // the Illinois variant of regula falsi, bracketing and keeping the feasible end (g <= 0) to the
      // last bit; a bisection step whenever the false-position point is not strictly inside.
      // Dowell and Jarratt (1971), A modified regula falsi method for computing the root of an equation, BIT 11.
      let lo = ga <= 0 ? a : b, hi = ga <= 0 ? b : a;
      let glo = ga <= 0 ? ga : gb, ghi = ga <= 0 ? gb : ga;
      let side = 0;
      for (let it = 0; it < 200; it++) {
        let mid = lo - (glo * (hi - lo)) / (ghi - glo);
        if (!(mid > Math.min(lo, hi) && mid < Math.max(lo, hi))) mid = 0.5 * (lo + hi);
        if (mid === lo || mid === hi) break;
        const gm = g(mid);
        if (gm <= 0) { lo = mid; glo = gm; if (side === -1) ghi *= 0.5; side = -1; }
        else { hi = mid; ghi = gm; if (side === 1) glo *= 0.5; side = 1; }
        if (Math.abs(hi - lo) <= 2.3e-16 * Math.max(Math.abs(lo), Math.abs(hi))) break;
      }
      offer(Imax * Math.cos(lo), Imax * Math.sin(lo), 1);
    };
    const h = (2 * Math.PI) / NX;
    for (let k = 0; k < NX; k++) w.samples[k] = g(k * h);
    for (let k = 0; k < NX; k++) {
      const k1 = (k + 1) % NX;
      const ga = w.samples[k]!, gb = w.samples[k1]!;
      if ((ga <= 0) !== (gb <= 0)) cross(k * h, (k + 1) * h, ga, gb);
      else if (ga > 0 && gb > 0 && ga <= gb && ga <= w.samples[(k + NX - 1) % NX]!) {
        // a pair of roots may hide around a sampled minimum
        const neg = (t: number): number => -g(t);
        goldenSectionMax(neg, (k - 1) * h, (k + 1) * h, GOLDEN_STEPS, w.g);
        const xm = w.g[0]!, gm = g(xm);
        if (gm <= 0) { cross((k - 1) * h, xm, w.samples[(k + NX - 1) % NX]!, gm); cross(xm, (k + 1) * h, gm, gb); }
      }
    }
  }
  if (best.J >= floor) {
    out.ok = true; out.id = best.id; out.iq = best.iq; out.J = best.J; out.region = best.region;
  }
}
