/**
 * Maximum torque under both limits (|i_dq| <= Imax, |v_dq| <= Vmax) at one speed, Rs included.
 * Linear model (fast path, no grids): the torque has no interior maximum, so the best feasible point
 * lies on a boundary.
 *  1. MTPA at Imax (closed form); if its voltage fits, it is the answer (region 'mtpa').
 *  2. Otherwise the candidates are
 *     - the crossings of the current circle with the voltage boundary: |v(theta)|² - Vmax² along
 *       i = Imax (cos theta, sin theta) is a trigonometric polynomial of degree 2 (at most 4 roots),
 *       bracketed by 32 samples (and by a golden-section minimum where a pair of roots hides between
 *       samples) and refined by Newton's method safeguarded by bisection to 1e-15 rad, keeping the feasible end
 *       (region 'field-weakening');
 *     - the local maxima of torque along the voltage boundary (parametrised by the voltage angle),
 *       bracketed by 32 samples and refined by golden section, kept when inside the current circle
 *       (region 'mtpv');
 *     - the local maxima of torque along the current circle (closed form), kept when the voltage fits.
 *     The best candidate wins. No candidate: the two sets do not meet (beyond the maximum speed).
 * Any other model: the same candidates found through the model's methods (max-torque-numeric.ts).
 * Every loop has a fixed bound. Relative torque accuracy: better than ENVELOPE_ACCURACY. Morimoto, Takeda,
 * Hirasa, Taniguchi (1990), Expansion of operating limits ..., IEEE Trans. Ind. Appl. 26(5).
 */
import type { LinearTerms, MachineModel } from '../machine/machine-model';
import { GOLD, parabolaZero } from '../mathematics/root-finding';
import { mtpaCosLinear } from './mtpa';
import { type MaxTorqueResult, type NumericMaxTorqueWork, maxTorqueNumeric, numericMaxTorqueWork } from './max-torque-numeric';

export type { MaxTorqueResult } from './max-torque-numeric';
/** Relative torque tolerance the envelope solver achieves (checked against a dense search in the tests). */
export const ENVELOPE_ACCURACY = 1e-9;

const NS = 32;
const STEP = (2 * Math.PI) / NS;
const GOLDEN_STEPS = 40;
const ROOT_STEPS = 100;
/** cos and sin of the NS sample angles: constant tables, filled here once and never written again. */
const COS: ArrayLike<number> = Float64Array.from({ length: NS }, (_, k) => Math.cos(k * STEP));
const SIN: ArrayLike<number> = Float64Array.from({ length: NS }, (_, k) => Math.sin(k * STEP));

/** Result and work of the max-torque search, owned by one run (never shared between runs). */
export interface MaxTorqueScratch extends MaxTorqueResult {
  /** the linear fast path with its own work arrays and machine terms */
  readonly linear: LinearMaxTorque;
  /** the numeric path's work, made on first use (a linear model never needs it) */
  numeric: NumericMaxTorqueWork | null;
}

export const newScratch = (): MaxTorqueScratch => ({ ok: false, id: 0, iq: 0, J: 0, region: 0, linear: new LinearMaxTorque(), numeric: null });

/**
 * Core: the largest sign*torque at electrical speed we under Imax (may be Infinity) and Vmax.
 * No validation (callers validate). Writes the answer into `out`; out.ok is false when no point within
 * both limits gives sign*torque >= floor (candidates below the floor are not refined).
 * The linear model's terms are read once per call.
 */
export function maxTorqueCore(m: MachineModel, Vmax: number, Imax: number, we: number, sign: 1 | -1, out: MaxTorqueScratch, floor = 0): void {
  const L = m.linear;
  if (L !== null) out.linear.solve(L, m.polePairs, m.Rs, Vmax, Imax, we, sign, out, floor);
  else maxTorqueNumeric(m, Vmax, Imax, we, sign, out, (out.numeric ??= numericMaxTorqueWork()), floor);
}

/** The linear fast path: the machine terms of the current call and the work arrays (one per scratch, never shared). */
class LinearMaxTorque {
  // four sample arrays on one buffer (one allocation per scratch)
  readonly gS: Float64Array; readonly jS: Float64Array; readonly rS: Float64Array; readonly jC: Float64Array;
  P = 1; RS = 0; LD = 1; LQ = 1; PSI = 0; WE = 0; VM = 1; IM = 1; SG = 1;
  eId = 0; eIq = 0;
  bestJ = -Infinity; bestId = 0; bestIq = 0; bestRegion: 0 | 1 | 2 = 0;
  constructor() {
    const b = new ArrayBuffer(32 * NS);
    this.gS = new Float64Array(b, 0, NS); this.jS = new Float64Array(b, 8 * NS, NS); this.rS = new Float64Array(b, 16 * NS, NS); this.jC = new Float64Array(b, 24 * NS, NS);
  }

  vCircle2(theta: number): number {
    return this.vCircleCS(Math.cos(theta), Math.sin(theta));
  }
  vCircleCS(c: number, s: number): number {
    const id = this.IM * c;
    const iq = this.IM * s;
    const vd = this.RS * id - this.WE * this.LQ * iq;
    const vq = this.RS * iq + this.WE * (this.LD * id + this.PSI);
    return vd * vd + vq * vq - this.VM * this.VM;
  }

  onEllipse(phi: number): void {
    this.onEllipseCS(Math.cos(phi), Math.sin(phi));
  }
  onEllipseCS(c: number, s: number): void {
    const Xd = this.WE * this.LD;
    const Xq = this.WE * this.LQ;
    const D = this.RS * this.RS + Xd * Xq;
    const ud = this.VM * c;
    const uq = this.VM * s - this.WE * this.PSI;
    this.eId = (this.RS * ud + Xq * uq) / D;
    this.eIq = (-Xd * ud + this.RS * uq) / D;
  }
  jEllipse(phi: number): number {
    this.onEllipse(phi);
    return this.SG * 1.5 * this.P * this.eIq * (this.PSI + (this.LD - this.LQ) * this.eId);
  }
  jOf(id: number, iq: number): number {
    return this.SG * 1.5 * this.P * iq * (this.PSI + (this.LD - this.LQ) * id);
  }
  v2Of(id: number, iq: number): number {
    const vd = this.RS * id - this.WE * this.LQ * iq;
    const vq = this.RS * iq + this.WE * (this.LD * id + this.PSI);
    return vd * vd + vq * vq;
  }

  /**
   * Root of |v(theta)|² - Vmax² on the circle in [a, b] (values of opposite sign at the ends):
   * Newton with the analytic derivative, safeguarded by bisection inside the bracket. Stops when
   * -1e-13 Vmax² <= g <= 0 or the bracket is below 1e-15 rad; always returns a point with g <= 0.
   */
  circleRoot(a: number, b: number, ga: number, gb: number): number {
    const tol = 1e-13 * this.VM * this.VM;
    // lo: the end with g <= 0 (feasible), hi: the other
    let lo = ga <= 0 ? a : b;
    let hi = ga <= 0 ? b : a;
    let x = (a * gb - b * ga) / (gb - ga);
    if (!(x > Math.min(a, b) && x < Math.max(a, b))) x = 0.5 * (a + b);
    for (let it = 0; it < ROOT_STEPS; it++) {
      const c = Math.cos(x), sn = Math.sin(x);
      const id = this.IM * c, iq = this.IM * sn;
      const vd = this.RS * id - this.WE * this.LQ * iq;
      const vq = this.RS * iq + this.WE * (this.LD * id + this.PSI);
      const g = vd * vd + vq * vq - this.VM * this.VM;
      if (g <= 0) {
        if (g >= -tol) return x;
        lo = x;
      } else hi = x;
      const dvd = this.IM * (-this.RS * sn - this.WE * this.LQ * c);
      const dvq = this.IM * (-this.WE * this.LD * sn + this.RS * c);
      const dg = 2 * (vd * dvd + vq * dvq);
      const step = g / dg;
      if (Math.abs(step) <= 1e-15 * (1 + Math.abs(x))) {
        if (g <= 0) return x;
        // converged from the infeasible side: step over onto the feasible side
        const xs = x + Math.sign(lo - x) * Math.max(2 * Math.abs(step), 4e-16 * (1 + Math.abs(x)));
        if (xs > Math.min(lo, hi) && xs < Math.max(lo, hi)) { x = xs; continue; }
        return lo;
      }
      let xn = x - step;
      if (!(xn > Math.min(lo, hi) && xn < Math.max(lo, hi))) xn = 0.5 * (lo + hi);
      if (Math.abs(hi - lo) <= 1e-15) break;
      x = xn;
    }
    return lo;
  }

  /**
   * Where |v(theta)|² dips lowest on the circle in [lo, hi] around a sampled minimum x0, or the first
   * point found with |v| <= Vmax: Newton on dg/dtheta with the analytic second derivative
   * (d²v/dtheta² = -(v - b) on the circle), safeguarded by bisection on the sign of dg/dtheta.
   */
  circleMin(lo: number, hi: number, x0: number): number {
    let x = x0;
    for (let it = 0; it < ROOT_STEPS; it++) {
      const c = Math.cos(x), sn = Math.sin(x);
      const id = this.IM * c, iq = this.IM * sn;
      const vd = this.RS * id - this.WE * this.LQ * iq;
      const vq = this.RS * iq + this.WE * (this.LD * id + this.PSI);
      if (vd * vd + vq * vq <= this.VM * this.VM) return x;
      const dvd = this.IM * (-this.RS * sn - this.WE * this.LQ * c);
      const dvq = this.IM * (-this.WE * this.LD * sn + this.RS * c);
      const d1 = 2 * (vd * dvd + vq * dvq);
      const d2 = 2 * (dvd * dvd + dvq * dvq - vd * vd - vq * (vq - this.WE * this.PSI));
      if (d1 > 0) hi = x;
      else lo = x;
      const step = d1 / d2;
      if (d2 > 0 && Math.abs(step) <= 1e-14) return x;
      let xn = x - step;
      if (!(d2 > 0) || !(xn > lo && xn < hi)) xn = 0.5 * (lo + hi);
      if (hi - lo <= 1e-14) return xn;
      x = xn;
    }
    return x;
  }

  /**
   * Local maximum of the objective along the voltage boundary in [lo, hi] around a sampled maximum:
   * Newton on dJ/dphi with analytic first and second derivatives, safeguarded by bisection on the sign
   * of dJ/dphi; golden section when the derivative does not change sign across the window.
   * Leaves the point in eId, eIq.
   */
  ellipseMax(k: number): void {
    let lo = (k - 1) * STEP;
    let hi = (k + 1) * STEP;
    const D = this.RS * this.RS + this.WE * this.WE * this.LD * this.LQ;
    const kv = this.VM / D;
    const K = this.SG * 1.5 * this.P;
    const dl = this.LD - this.LQ;
    // dJ/dphi at a sample angle, from the cos/sin tables
    const dJ = (j: number): number => {
      const c = COS[j], sn = SIN[j];
      this.onEllipseCS(c, sn);
      const did = kv * (this.WE * this.LQ * c - this.RS * sn);
      const diq = kv * (this.WE * this.LD * sn + this.RS * c);
      return K * (diq * (this.PSI + dl * this.eId) + this.eIq * dl * did);
    };
    const hl = dJ(k === 0 ? NS - 1 : k - 1);
    const hh = dJ(k + 1 === NS ? 0 : k + 1);
    const hm = dJ(k);
    // start from the zero of the parabola through the three derivative samples (clamped into the window)
    const x0s = parabolaZero(hl, hm, hh);
    const x0 = k * STEP + (Number.isFinite(x0s) && Math.abs(x0s) < 1 ? x0s : 0) * STEP;
    if (hl > 0 && hh < 0) {
      let x = x0;
      for (let it = 0; it < ROOT_STEPS; it++) {
        const c = Math.cos(x), sn = Math.sin(x);
        this.onEllipseCS(c, sn);
        const did = kv * (this.WE * this.LQ * c - this.RS * sn);
        const diq = kv * (this.WE * this.LD * sn + this.RS * c);
        const d2id = kv * (-this.WE * this.LQ * sn - this.RS * c);
        const d2iq = kv * (this.WE * this.LD * c - this.RS * sn);
        const h = K * (diq * (this.PSI + dl * this.eId) + this.eIq * dl * did);
        const h2 = K * (d2iq * (this.PSI + dl * this.eId) + 2 * dl * did * diq + this.eIq * dl * d2id);
        if (h > 0) lo = x;
        else hi = x;
        const step = h / h2;
        if (h2 < 0 && Math.abs(step) <= 1e-14) break;
        let xn = x - step;
        if (!(h2 < 0) || !(xn > lo && xn < hi)) xn = 0.5 * (lo + hi);
        if (hi - lo <= 1e-14) { x = xn; break; }
        x = xn;
      }
      this.onEllipse(x);
      return;
    }
    let x1 = hi - GOLD * (hi - lo);
    let x2 = lo + GOLD * (hi - lo);
    let f1 = this.jEllipse(x1);
    let f2 = this.jEllipse(x2);
    for (let it = 0; it < GOLDEN_STEPS; it++) {
      if (f1 < f2) { lo = x1; x1 = x2; f1 = f2; x2 = lo + GOLD * (hi - lo); f2 = this.jEllipse(x2); }
      else { hi = x2; x2 = x1; f2 = f1; x1 = hi - GOLD * (hi - lo); f1 = this.jEllipse(x1); }
    }
    this.onEllipse(f1 >= f2 ? x1 : x2);
  }

  offer(id: number, iq: number, region: 0 | 1 | 2): void {
    const j = this.jOf(id, iq);
    if (j > this.bestJ) { this.bestJ = j; this.bestId = id; this.bestIq = iq; this.bestRegion = region; }
  }
  offerCircle(theta: number): void {
    this.offer(this.IM * Math.cos(theta), this.IM * Math.sin(theta), 1);
  }

  solve(L: LinearTerms, p: number, rs0: number, Vmax: number, Imax: number, we: number, sign: 1 | -1, out: MaxTorqueResult, floor: number): void {
    const gS = this.gS, jS = this.jS, rS = this.rS, jC = this.jC;
    this.P = p; this.RS = rs0; this.LD = L.Ld; this.LQ = L.Lq; this.PSI = L.psiM; this.WE = we; this.VM = Vmax; this.IM = Imax; this.SG = sign;
    const vm2 = Vmax * Vmax;
    const finiteI = Number.isFinite(Imax);
    out.ok = false;
    // 1. MTPA at Imax
    if (finiteI) {
      const id = Imax * mtpaCosLinear(L, Imax);
      const iq = sign * Math.sqrt(Math.max(0, Imax * Imax - id * id));
      if (this.v2Of(id, iq) <= vm2) {
        out.ok = true; out.id = id; out.iq = iq; out.J = this.jOf(id, iq); out.region = 0;
        return;
      }
    }
    this.bestJ = -Infinity;
    const D = this.RS * this.RS + this.WE * this.WE * this.LD * this.LQ;
    if (finiteI) {
      // local maxima of torque along the circle: 2 (Ld-Lq) I c² + psiM c - (Ld-Lq) I = 0, c = cos(theta)
      const a2 = 2 * (this.LD - this.LQ) * Imax;
      const roots = a2 === 0 ? 1 : 2;
      for (let r = 0; r < roots; r++) {
        let c: number;
        if (a2 === 0) c = 0;
        else {
          const disc = Math.sqrt(this.PSI * this.PSI + 8 * (this.LD - this.LQ) * (this.LD - this.LQ) * Imax * Imax);
          c = r === 0 ? (-this.PSI + disc) / (2 * a2) : (-this.PSI - disc) / (2 * a2);
        }
        if (!(c >= -1 && c <= 1)) continue;
        const s = Math.sqrt(1 - c * c);
        for (let q = -1; q <= 1; q += 2) {
          const id = Imax * c;
          const iq = q * Imax * s;
          if (this.v2Of(id, iq) <= vm2) this.offer(id, iq, 0);
        }
      }
    }
    // local maxima of torque along the voltage boundary, inside the circle
    if (D > 0) {
      const im2 = Imax * Imax;
      {
        const rs = this.RS, xd = we * this.LD, xq = we * this.LQ, e = we * this.PSI, psi = this.PSI, dl = this.LD - this.LQ, kt = sign * 1.5 * this.P;
        const invD = 1 / D;
        for (let k = 0; k < NS; k++) {
          const ud = Vmax * COS[k];
          const uq = Vmax * SIN[k] - e;
          const id = (rs * ud + xq * uq) * invD;
          const iq = (rs * uq - xd * ud) * invD;
          jS[k] = kt * iq * (psi + dl * id);
          rS[k] = id * id + iq * iq;
        }
      }
      // |i(phi) - i(phi_k)| <= ||A^-1|| Vmax |phi - phi_k|: a window that stays outside the circle is skipped
      const reach = ((Math.sqrt(2 * this.RS * this.RS + this.WE * this.WE * (this.LD * this.LD + this.LQ * this.LQ)) / D) * Vmax * STEP) * (1 + 1e-9);
      let outside = -Infinity;
      for (let k = 0; k < NS; k++) {
        const a = jS[k === 0 ? NS - 1 : k - 1];
        const b = jS[k];
        const c = jS[k + 1 === NS ? 0 : k + 1];
        if (!(b >= a && b >= c)) continue;
        // |dJ/dphi| <= 1.5 p (psiM + sqrt(2) |Ld-Lq| r) ||A^-1|| Vmax: a bound on J in the window
        const rw = Math.sqrt(rS[k]) + reach;
        const lj = 1.5 * this.P * (this.PSI + Math.SQRT2 * Math.abs(this.LD - this.LQ) * rw) * (reach / STEP);
        const bound = Math.max(a, b, c) + 0.5 * lj * STEP;
        if (rS[k] > (Imax + reach) * (Imax + reach)) {
          if (bound > outside) outside = bound;
          continue;
        }
        if (bound < Math.max(this.bestJ, floor)) continue;
        this.ellipseMax(k);
        if (this.eId * this.eId + this.eIq * this.eIq <= im2) this.offer(this.eId, this.eIq, 2);
        else {
          const jo = this.SG * 1.5 * this.P * this.eIq * (this.PSI + (this.LD - this.LQ) * this.eId);
          if (jo > outside) outside = jo;
        }
      }
      // When the best candidate is the largest torque on the whole voltage boundary, it is the answer
      // (the feasible set lies inside the voltage region, whose torque maximum is on its boundary):
      // every local maximum outside the circle, refined or skipped, must stay below it.
      if (this.bestRegion === 2 && this.bestJ > -Infinity && outside < this.bestJ) {
        out.ok = this.bestJ >= floor; out.id = this.bestId; out.iq = this.bestIq; out.J = this.bestJ; out.region = 2;
        return;
      }
    }
    if (finiteI) {
      // crossings of the circle with the voltage boundary
      // a window whose torque bound cannot beat the best so far (or the floor) is skipped:
      // T = 1.5 p (psiM I sin(theta) + (Ld-Lq) I² sin(2 theta)/2), so |d²T/dtheta²| <= gc and the largest
      // value between two samples is at most the larger sample + gc h²/8
      const gc = 1.5 * this.P * (this.PSI * Imax + 2 * Math.abs(this.LD - this.LQ) * Imax * Imax);
      {
        const rs = this.RS, xd = we * this.LD, xq = we * this.LQ, e = we * this.PSI, psi = this.PSI, dl = this.LD - this.LQ, kt = sign * 1.5 * this.P;
        for (let k = 0; k < NS; k++) {
          const id = Imax * COS[k];
          const iq = Imax * SIN[k];
          const vd = rs * id - xq * iq;
          const vq = rs * iq + xd * id + e;
          gS[k] = vd * vd + vq * vq - vm2;
          jC[k] = kt * iq * (psi + dl * id);
        }
      }
      for (let k = 0; k < NS; k++) {
        const k1 = k + 1 === NS ? 0 : k + 1;
        const ga = gS[k];
        const gb = gS[k1];
        const a = k * STEP;
        const b = (k + 1) * STEP;
        if ((ga <= 0) !== (gb <= 0)) {
          if (Math.max(jC[k], jC[k1]) + 0.125 * gc * STEP * STEP < Math.max(this.bestJ, floor)) continue;
          this.offerCircle(this.circleRoot(a, b, ga, gb));
        }
      }
      for (let k = 0; k < NS; k++) {
        const k1 = k + 1 === NS ? 0 : k + 1;
        const ga = gS[k];
        const gb = gS[k1];
        const a = k * STEP;
        const b = (k + 1) * STEP;
        if (ga > 0 && gb > 0) {
          // a pair of roots between samples: look at the sampled local minimum
          const k0 = k === 0 ? NS - 1 : k - 1;
          const g0 = gS[k0];
          if (ga <= g0 && ga <= gb) {
            if (Math.max(jC[k0], jC[k], jC[k1]) + 0.125 * gc * STEP * STEP < Math.max(this.bestJ, floor)) continue;
            // Taylor bound: g >= g_k - |g'_k| h - G2 h²/2 on |theta - theta_k| <= h = STEP, with
            // |g''| <= G2 = |first harmonic| + 4 |second harmonic| of the degree-2 trigonometric polynomial
            {
              const c = COS[k], sn = SIN[k];
              const vd = this.RS * this.IM * c - this.WE * this.LQ * this.IM * sn;
              const vq = this.RS * this.IM * sn + this.WE * (this.LD * this.IM * c + this.PSI);
              const dvd = this.IM * (-this.RS * sn - this.WE * this.LQ * c);
              const dvq = this.IM * (-this.WE * this.LD * sn + this.RS * c);
              const dg = 2 * Math.abs(vd * dvd + vq * dvq);
              const e = this.WE * this.PSI, xd = this.WE * this.LD, xq = this.WE * this.LQ;
              const g2 = 2 * Math.abs(e) * this.IM * Math.sqrt(xd * xd + this.RS * this.RS) + 4 * this.IM * this.IM * Math.sqrt(0.25 * (xd * xd - xq * xq) ** 2 + (this.RS * (xd - xq)) ** 2);
              if (ga - dg * STEP - 0.5 * g2 * STEP * STEP > 0) continue;
            }
            const xm = this.circleMin(a - STEP, b, a);
            const fm = this.vCircle2(xm);
            if (fm <= 0) {
              this.offerCircle(this.circleRoot(a - STEP, xm, g0, fm));
              this.offerCircle(this.circleRoot(xm, b, fm, gb));
            }
          }
        }
      }
    }
    if (this.bestJ >= floor) {
      out.ok = true; out.id = this.bestId; out.iq = this.bestIq; out.J = this.bestJ; out.region = this.bestRegion;
    }
  }
}
