/**
 * One control period of the constant-parameter plant by the exact discretisation of its electrical
 * dynamics (dq-propagator.ts) and a Hermite quadrature of its mechanics; the periods it does not
 * cover go to the fallback stepper (ode45-cash-karp, stepper.ts).
 *
 * Over a period [0, dt] (h = dt/2, nodes s = 0, h, dt) the voltage is held in the stationary frame.
 *   1. The speed profile predicted from the start's derivatives, omega0 + g0 s + g0' s^2/2
 *      (g = d omega/dt); one propagation at the frozen electrical speed of its mean (so that the
 *      frozen angle ends where the rotor does), to the mid and end nodes.
 *   2. The first-order correction for the speed's change within the period: with dw(s) = p omega(s) - W
 *      (the speed deviation) and dth(s) its integral (the angle deviation), the error
 *      e = x - x_frozen obeys  e' = A e + r(s),  r = dw (dA/dwe x + dc/dwe) + dth B dv/dtheta,
 *      so e(s1) = integral of e^{A (s1 - s)} r(s) ds, by the quintic Hermite rule over the three
 *      nodes (d/ds of the integrand: e^{A (s1 - s)} (r' - A r); e^{A dt} = e^{A h}^2, the end node
 *      seen from the middle through e^{-A h}).
 *   3. The derivative of the whole state at the mid and end nodes (the voltage at the rotor's
 *      angle), the mechanics by the quintic Hermite quadrature of g (values and derivatives at the
 *      three nodes, exact for quintics): the new speed profile and the angle.
 *   4. The correction of step 2 again on that profile: the end current. The energy drawn by the
 *      same Hermite rule on the power 1.5 (vd id + vq iq) and its derivative.
 * The derivative is evaluated three times per period (start, mid, end): the plant's evaluations.
 *
 * Fallback (the whole period by `fallback`): a load breakpoint inside the period; free mechanics
 * with |omega0| < 20 w + 4 |g0| dt (w the width of the smoothed Coulomb sign: the friction and a
 * k omega |omega| load are not smooth near zero speed); a large angle per period,
 * max(p |omega0|, Rs/Ld, Rs/Lq) dt > MAX_ANGLE (the quadratures lose their order; a stiff overdamped
 * period among them); the propagator's rounding-error bound (the Rs -> 0 resonance), taken with its
 * sizes' bounds over every speed, above 1e-11 Imax;
 * a non-finite state. The quadrature weights integrate the quintic Hermite interpolant of values and
 * derivatives at the three nodes (from memory: Stoer and Bulirsch, Introduction to Numerical
 * Analysis, Hermite interpolation); the first-order correction is common practice (no source).
 */
import { DqPropagator } from './dq-propagator';
import { I_D, I_Q, OMEGA, THETA, ENERGY } from './plant';
import type { Plant } from './plant';
import { Stepper, makeStepper } from './stepper';
import type { AnySetup } from './simulation-setup';
import { nextLoadBreak, loadLevel } from './load-schedule';
import { cosSmall, sinSmall } from '../mathematics/rotation';

const sinSmallL = sinSmall;
const cosSmallL = cosSmall;
// Math.abs: a sign mask, no branch (the sign of a current or a voltage is not predictable)
const abs = Math.abs;
/**
 * The series of dq-propagator.ts (cosS, sincS, coshS, sinhcS: cos, sin(x)/x, cosh, sinh(x)/x of
 * y = x^2, |x| <= 0.5) with the reciprocal factorials as factors: a product where a division by a
 * constant costs a division (the engine keeps x / c as a division); they agree with those to rounding.
 */
function cosP(y: number): number {
  const y2 = y * y, y4 = y2 * y2;
  return 1 - y * 0.5 + y2 * (1 / 24 - y * (1 / 720)) + y4 * (1 / 40320 - y * (1 / 3628800) + y2 * (1 / 479001600 - y * (1 / 87178291200)));
}
function sincP(y: number): number {
  const y2 = y * y, y4 = y2 * y2;
  return 1 - y * (1 / 6) + y2 * (1 / 120 - y * (1 / 5040)) + y4 * (1 / 362880 - y * (1 / 39916800) + y2 * (1 / 6227020800 - y * (1 / 1307674368000)));
}
function coshP(y: number): number {
  const y2 = y * y, y4 = y2 * y2;
  return 1 + y * 0.5 + y2 * (1 / 24 + y * (1 / 720)) + y4 * (1 / 40320 + y * (1 / 3628800) + y2 * (1 / 479001600 + y * (1 / 87178291200)));
}
function sinhcP(y: number): number {
  const y2 = y * y, y4 = y2 * y2;
  return 1 + y * (1 / 6) + y2 * (1 / 120 + y * (1 / 5040)) + y4 * (1 / 362880 + y * (1 / 39916800) + y2 * (1 / 6227020800 + y * (1 / 1307674368000)));
}
/** 8 eps: the propagator's rounding-error bound per unit of the sizes it scales with */
const EPS8 = 8 * 2.220446049250313e-16;

/** largest max(electrical angle, Rs/L dt) per period the closed form takes, rad */
export const MAX_ANGLE = 1;

/**
 * sin and cos of the angle deviation within a period (about p dOmega dt / 8, well below 1e-3 rad):
 * two terms below 1e-3 rad (truncation below 1e-17), the series of rotation.ts above.
 */
function sinTiny(d: number): number {
  return d > -1e-3 && d < 1e-3 ? d * (1 - d * d * (1 / 6)) : sinSmallL(d);
}
function cosTiny(d: number): number {
  return d > -1e-3 && d < 1e-3 ? 1 - 0.5 * d * d * (1 - d * d * (1 / 12)) : cosSmallL(d);
}
export class ExactStepper extends Stepper {
  /** periods handed to the fallback stepper */
  fallbacks = 0;
  /** the propagator for the periods outside the series branch (see `exact`) */
  private readonly prop: DqPropagator;
  private readonly pp: number;
  private readonly Rs: number;
  private readonly Ld: number;
  private readonly Lq: number;
  private readonly psiM: number;
  private readonly width: number;
  private readonly free: boolean;
  private readonly errMax: number;
  /** bounds over every speed W of |k1r| + |k1i| + |k2r| + |k2i| and |xcd| + |xcq| (DqPropagator.setStep's) */
  private readonly gainMax: number;
  private readonly xcMax: number;
  private readonly rate: number;
  // reciprocals, ratios and the propagator's constants (see DqPropagator.setStep): no division in a period
  private readonly iLd: number; private readonly iLq: number; private readonly rqd: number; private readonly rdq: number;
  private readonly m: number; private readonly q: number; private readonly Rs2: number; private readonly iRs: number;
  private readonly S2: number; private readonly LqS2: number; private readonly LdS2: number; private readonly dL: number;
  private readonly LdLq: number;
  // the mechanics: Coulomb friction, 1/width, viscous friction, the k omega |omega| load's k, 1/J
  private readonly Tc: number; private readonly iW: number; private readonly B: number; private readonly k2: number;
  private readonly iJ: number;
  // the load line of the current piece (LA + LB t)
  private LA = NaN;
  private LB = NaN;
  // what depends on the period's length alone, for the length `cDt`: e^{m h} (h = dt/2; m = tr A / 2
  // does not depend on the speed), 1/det e^{A h} = e^{-2 m h}, 1/dt (double fields start as non-integers)
  private cDt = NaN; private cE = NaN; private cIdet = NaN; private cIDt = NaN;
  // where the load's current piece ends
  private nextBreakX = -Infinity;

  constructor(plant: Plant, Ts: number, private readonly fallback: Stepper, Imax: number) {
    super(plant, Ts);
    const m = plant.model.linear!;
    const Rs = plant.model.Rs, Ld = m.Ld, Lq = m.Lq;
    this.prop = new DqPropagator({ Rs, Ld, Lq, psiM: m.psiM });
    this.pp = plant.model.polePairs;
    this.Rs = Rs;
    this.Ld = Ld;
    this.Lq = Lq;
    this.psiM = m.psiM;
    const pr = plant.params;
    this.width = pr.coulombWidth_rad_s;
    this.free = pr.mechanics === 'free';
    this.errMax = 1e-11 * Imax;
    // with N = Rs^2 + W^2 S^2 >= 2 Rs |W| S: |k1r| <= max(1, 2 Lq/S)/Rs, |k2i| <= max(1, 2 Ld/S)/Rs,
    // |k1i| = |k2r| <= |Ld - Lq|/(2 Rs S); |xcd| <= psiM/Ld, |xcq| <= psiM/(2 sqrt(Ld Lq)) (Rs = 0: infinite)
    const S = Ld + Lq;
    this.gainMax = (Math.max(1, (2 * Lq) / S) + Math.max(1, (2 * Ld) / S) + Math.abs(Ld - Lq) / S) / Rs;
    this.xcMax = m.psiM * (1 / Ld + 0.5 / Math.sqrt(Ld * Lq));
    this.rate = Math.max(Rs / Ld, Rs / Lq);
    this.iLd = 1 / Ld;
    this.iLq = 1 / Lq;
    this.rqd = Lq / Ld;
    this.rdq = Ld / Lq;
    this.m = -0.5 * Rs * (1 / Ld + 1 / Lq);
    this.q = -0.5 * Rs * (1 / Ld - 1 / Lq);
    this.Rs2 = Rs * Rs;
    this.iRs = 1 / Rs;
    this.S2 = S * S;
    this.LqS2 = 2 * Lq * S;
    this.LdS2 = 2 * Ld * S;
    this.dL = Ld - Lq;
    this.LdLq = Ld * Lq;
    this.Tc = pr.coulombFriction;
    this.iW = 1 / pr.coulombWidth_rad_s;
    this.B = pr.viscousFriction;
    this.k2 = pr.load.quadraticK;
    this.iJ = 1 / pr.inertia;
  }

  protected piece(): void {
    throw new Error('ExactStepper integrates whole periods');
  }

  protected override integrate(y: Float64Array): void {
    if (!this.exact(y)) {
      this.fallbacks++;
      this.fallback.period(y, this.span[0]!, this.span[1]!);
    }
  }

  /** the load line LA + LB t of the piece that starts at t0 (as Plant.setLoadSegment), into the node */
  private loadLine(t0: number, t1: number): void {
    const s = this.plant.params.load;
    const tm = 0.5 * (t0 + t1);
    const n = s.times.length;
    let slope = 0;
    if (tm < s.times[n - 1]!) {
      let i = 0;
      while (i < n - 2 && s.times[i + 1]! <= tm) i++;
      const d = s.times[i + 1]! - s.times[i]!;
      slope = d > 0 ? (s.levels[i + 1]! - s.levels[i]!) / d : 0;
    }
    this.LB = slope;
    this.LA = loadLevel(s, tm) - slope * tm;
  }

  /** the terms that depend on the period's length dt alone */
  private stepConstants(dt: number): void {
    const E = Math.exp(this.m * 0.5 * dt);
    this.cE = E;
    this.cIdet = 1 / (E * E);
    this.cIDt = 1 / dt;
    this.cDt = dt;
  }

  /**
   * The period by the closed form; false (y untouched) when it does not apply. One function, its
   * terms in locals: the propagation, the correction and the quadratures written out (no call but
   * the node's and the rare propagator's, no double crossing a call). The correction's forcing at a
   * node is linear in the speed deviation dw, its derivative dwp and the angle deviation dth:
   * r = dw U + dth Z, r' - A r = dwp U + dw V + dth Y, with U = dA/dwe x + dc/dwe, Z = B dv/dtheta,
   * V = U' + Z - A U, Y = Z' - A Z on the frozen solution (the same for both passes).
   */
  private exact(y: Float64Array): boolean {
    const t0 = this.span[0]!, t1 = this.span[1]!;
    const plant = this.plant;
    if (t0 >= this.nextBreakX) {
      this.nextBreakX = nextLoadBreak(plant.params.load, t0);
      this.loadLine(t0, Math.min(this.nextBreakX, t0 + this.Ts));
    }
    const dt = t1 - t0;
    if (this.nextBreakX < t1 - 1e-9 * this.Ts) return false;
    // the period's length varies in its last bits (t1 - t0 of k Ts): the constants of the length
    // cached, to first order in the difference (its square below 1e-30)
    let dd = dt - this.cDt;
    if (!(dd < 1e-9 * dt && dd > -1e-9 * dt)) { this.stepConstants(dt); dd = 0; }
    const h = 0.5 * dt, hh = h * h;
    const p = this.pp;
    const id0 = y[I_D]!, iq0 = y[I_Q]!, w0 = y[OMEGA]!, th0 = y[THETA]!;
    const u = plant.input;
    const c0 = plant.c0, s0 = plant.s0;
    const vd0 = u[0]! * c0 + u[1]! * s0, vq0 = -u[0]! * s0 + u[1]! * c0;
    const aw0 = abs(w0);
    if ((p * aw0 > this.rate ? p * aw0 : this.rate) * dt > MAX_ANGLE) return false;
    if (!Number.isFinite(id0 + iq0 + w0 + th0 + vd0 + vq0)) return false;
    // the propagator's rounding-error bound (DqPropagator.errorBound) with 1-norms and its sizes'
    // bounds over every speed (see the constructor): at least the bound itself
    if (!(EPS8 * (abs(id0) + abs(iq0) + this.gainMax * (abs(vd0) + abs(vq0)) + this.xcMax) <= this.errMax)) return false;
    // the plant's derivative at the nodes (as linear-node.ts: di/dt, g = omega' and g', the power over 1.5 and its derivative)
    const Rs = this.Rs, Ld = this.Ld, Lq = this.Lq, psiM = this.psiM, iLd = this.iLd, iLq = this.iLq, dL = this.dL;
    const free = this.free, Tc = this.Tc, iW = this.iW, B = this.B, k2 = this.k2, iJ = this.iJ, kT = 1.5 * p, LA = this.LA, LB = this.LB;
    let g0 = 0, gp0 = 0, P0 = 0, Pp0 = 0;
    const we0 = p * w0;
    const did0 = (vd0 - Rs * id0 + we0 * Lq * iq0) * iLd, diq0 = (vq0 - Rs * iq0 - we0 * (Ld * id0 + psiM)) * iLq;
    P0 = vd0 * id0 + vq0 * iq0; Pp0 = we0 * (vq0 * id0 - vd0 * iq0) + vd0 * did0 + vq0 * diq0;
    if (free) {
      const aw = abs(w0);
      let fr = 0, dfr = 0;
      if (Tc > 0) { const x = w0 * iW, r = 1 / Math.sqrt(1 + x * x); fr = Tc * x * r; dfr = Tc * r * r * r * iW; }
      g0 = (kT * iq0 * (psiM + dL * id0) - B * w0 - fr - (LA + LB * t0) - k2 * w0 * aw) * iJ;
      gp0 = (kT * (psiM * diq0 + dL * (did0 * iq0 + id0 * diq0)) - (B + dfr + 2 * k2 * aw) * g0 - LB) * iJ;
    }
    plant.evaluations++;
    if (free) {
      const ag0 = abs(g0);
      if (aw0 < 20 * this.width + 4 * ag0 * dt) return false;
    }
    // the speed profile predicted from the start's derivatives: omega0 + g0 s + g0' s^2/2
    const wh = w0 + g0 * h + 0.5 * gp0 * hh, w1 = w0 + g0 * dt + 2 * gp0 * hh;
    let gh = g0 + gp0 * h, g1 = g0 + gp0 * dt;
    const intW = w0 * dt + 2 * g0 * hh + (4 / 3) * gp0 * hh * h;
    const intWh = w0 * h + 0.5 * g0 * hh + (1 / 6) * gp0 * hh * h;
    // the friction at the node speeds (known now: a square root and a division each, whose latency
    // then overlaps the propagation)
    let frh = 0, dfrh = 0, fr1 = 0, dfr1 = 0;
    if (free && Tc > 0) {
      const xh = wh * iW, rh = 1 / Math.sqrt(1 + xh * xh), x1 = w1 * iW, r1 = 1 / Math.sqrt(1 + x1 * x1);
      frh = Tc * xh * rh; dfrh = Tc * rh * rh * rh * iW; fr1 = Tc * x1 * r1; dfr1 = Tc * r1 * r1 * r1 * iW;
    }
    // one propagation at the frozen speed of the predicted mean: DqPropagator.setStep written out
    // for the series branch (|delta h| <= 0.5, |W h| < 0.5: nearly every period), the propagator otherwise
    const iDt = this.cIDt, iDe = 1 - dd * iDt;
    const W = p * intW * (iDt * iDe);
    const q = this.q, Rs2 = this.Rs2, rqd = this.rqd, rdq = this.rdq;
    const yy = (q * q - W * W) * hh, wt = W * h;
    let a11: number, a12: number, a21: number, a22: number, cw: number, sw: number;
    if (yy > -0.25 && yy < 0.25 && wt > -0.5 && wt < 0.5) {
      const E = this.cE * (1 + 0.5 * this.m * dd);
      let EC: number, ES: number;
      if (yy >= 0) { EC = E * coshP(yy); ES = E * h * sinhcP(yy); } else { EC = E * cosP(-yy); ES = E * h * sincP(-yy); }
      a11 = EC + ES * q; a12 = ES * W * rqd; a21 = -ES * W * rdq; a22 = EC - ES * q;
      const wt2 = wt * wt;
      cw = cosP(wt2); sw = wt * sincP(wt2);
    } else {
      const pr = this.prop;
      pr.setStep(W, h);
      a11 = pr.p11; a12 = pr.p12; a21 = pr.p21; a22 = pr.p22; cw = pr.cw; sw = pr.sw;
    }
    const w2 = W * W;
    const iN = 1 / (Rs2 + w2 * this.S2);
    const iRN = iN * this.iRs;
    const k1r = (Rs2 + w2 * this.LqS2) * iRN, k1i = W * this.dL * iN;
    const k2r = -k1i, k2i = -(Rs2 + w2 * this.LdS2) * iRN;
    const f = (W * this.psiM) / (Rs2 + w2 * this.LdLq);
    const xcd = -W * Lq * f, xcq = -Rs * f;
    // frozen voltage at the nodes (rotating by -W s in dq)
    const vbd = vd0 * cw + vq0 * sw, vbq = -vd0 * sw + vq0 * cw;
    const c2 = cw * cw - sw * sw, s2 = 2 * sw * cw;
    const v1bd = vd0 * c2 + vq0 * s2, v1bq = -vd0 * s2 + vq0 * c2;
    // DqPropagator.propagate to h and to dt (e^{A dt} = e^{A h}^2, the rotation by 2 W h: both from the start)
    const b11 = a11 * a11 + a12 * a21, b12 = a11 * a12 + a12 * a22, b21 = a21 * a11 + a22 * a21, b22 = a21 * a12 + a22 * a22;
    const x1r = vd0 * k1r - vq0 * k1i, x1i = vd0 * k1i + vq0 * k1r, x2r = vd0 * k2r - vq0 * k2i, x2i = vd0 * k2i + vq0 * k2r;
    const zd = id0 - x1r - xcd, zq = iq0 - x2r - xcq;
    const xbhd = a11 * zd + a12 * zq + xcd + x1r * cw + x1i * sw;
    const xbhq = a21 * zd + a22 * zq + xcq + x2r * cw + x2i * sw;
    const xb1d = b11 * zd + b12 * zq + xcd + x1r * c2 + x1i * s2;
    const xb1q = b21 * zd + b22 * zq + xcq + x2r * c2 + x2i * s2;
    // A = [[ad, bw], [cw_, aq]]
    const ad = -Rs * iLd, aq = -Rs * iLq, bw = W * rqd, cW = -W * rdq;
    // U, V, Z, Y (see above) at a node from the frozen current x, its derivative x' and the frozen voltage v
    const Z0d = vq0 * iLd, Z0q = -vd0 * iLq;
    const U0d = rqd * iq0, U0q = -(Ld * id0 + psiM) * iLq;
    const xp0d = (vd0 - Rs * id0 + W * Lq * iq0) * iLd, xp0q = (vq0 - Rs * iq0 - W * (Ld * id0 + psiM)) * iLq;
    const V0d = rqd * xp0q + Z0d - (ad * U0d + bw * U0q), V0q = -rdq * xp0d + Z0q - (cW * U0d + aq * U0q);
    const Zhd = vbq * iLd, Zhq = -vbd * iLq;
    const Uhd = rqd * xbhq, Uhq = -(Ld * xbhd + psiM) * iLq;
    const xphd = (vbd - Rs * xbhd + W * Lq * xbhq) * iLd, xphq = (vbq - Rs * xbhq - W * (Ld * xbhd + psiM)) * iLq;
    const Vhd = rqd * xphq + Zhd - (ad * Uhd + bw * Uhq), Vhq = -rdq * xphd + Zhq - (cW * Uhd + aq * Uhq);
    const Yhd = -W * vbd * iLd - (ad * Zhd + bw * Zhq), Yhq = -W * vbq * iLq - (cW * Zhd + aq * Zhq);
    const Z1d = v1bq * iLd, Z1q = -v1bd * iLq;
    const U1d = rqd * xb1q, U1q = -(Ld * xb1d + psiM) * iLq;
    const xp1d = (v1bd - Rs * xb1d + W * Lq * xb1q) * iLd, xp1q = (v1bq - Rs * xb1q - W * (Ld * xb1d + psiM)) * iLq;
    const V1d = rqd * xp1q + Z1d - (ad * U1d + bw * U1q), V1q = -rdq * xp1d + Z1q - (cW * U1d + aq * U1q);
    const Y1d = -W * v1bd * iLd - (ad * Z1d + bw * Z1q), Y1q = -W * v1bq * iLq - (cW * Z1d + aq * Z1q);
    // e^{-A h}, the inverse of e^{A h} (det e^{A h} = e^{2 m h})
    const idet = this.cIdet * (1 - this.m * dd);
    const i11 = a22 * idet, i12 = -a12 * idet, i21 = -a21 * idet, i22 = a11 * idet;
    // the start node's correction (the same for every profile: no angle deviation at s = 0)
    const dw0 = p * w0 - W, dwp0 = p * g0;
    const r0d = dw0 * U0d, r0q = dw0 * U0q, s0d = dwp0 * U0d + dw0 * V0d, s0q = dwp0 * U0q + dw0 * V0q;
    // e^{A dt} (r0, s0), e^{A h} (r0, s0)
    const R0d = b11 * r0d + b12 * r0q, R0q = b21 * r0d + b22 * r0q, S0d = b11 * s0d + b12 * s0q, S0q = b21 * s0d + b22 * s0q;
    const M0d = a11 * r0d + a12 * r0q, M0q = a21 * r0d + a22 * r0q, N0d = a11 * s0d + a12 * s0q, N0q = a21 * s0d + a22 * s0q;
    let gph = 0, gp1 = 0, Ph = 0, Pph = 0, P1 = 0, Pp1 = 0;
    // the first-order correction for the speed's change within the period, on the predicted profile
    const dwh = p * wh - W, dwph = p * gh, dthh = p * intWh - W * h;
    const g1p = g1, dw1 = p * w1 - W, dwp1 = p * g1, dth1 = p * intW - W * dt;
    const rhd = dwh * Uhd + dthh * Zhd, rhq = dwh * Uhq + dthh * Zhq;
    const shd = dwph * Uhd + dwh * Vhd + dthh * Yhd, shq = dwph * Uhq + dwh * Vhq + dthh * Yhq;
    const r1d = dw1 * U1d + dth1 * Z1d, r1q = dw1 * U1q + dth1 * Z1q;
    const s1d = dwp1 * U1d + dw1 * V1d + dth1 * Y1d, s1q = dwp1 * U1q + dw1 * V1q + dth1 * Y1q;
    // e(dt): full-period weights h (7/15, 16/15, 7/15), h^2 (1/15, 0, -1/15)
    let x1d = xb1d + h * ((7 / 15) * (R0d + r1d) + (16 / 15) * (a11 * rhd + a12 * rhq)) + (hh * (1 / 15)) * (S0d - s1d);
    let x1q = xb1q + h * ((7 / 15) * (R0q + r1q) + (16 / 15) * (a21 * rhd + a22 * rhq)) + (hh * (1 / 15)) * (S0q - s1q);
    // e(h): first-half weights h (101/240, 8/15, 11/240), h^2 (13/240, -1/6, -1/80); the node at dt through e^{-A h}
    const xhd = xbhd + h * ((101 / 240) * M0d + (8 / 15) * rhd + (11 / 240) * (i11 * r1d + i12 * r1q))
      + hh * ((13 / 240) * N0d - shd * (1 / 6) - (1 / 80) * (i11 * s1d + i12 * s1q));
    const xhq = xbhq + h * ((101 / 240) * M0q + (8 / 15) * rhq + (11 / 240) * (i21 * r1d + i22 * r1q))
      + hh * ((13 / 240) * N0q - shq * (1 / 6) - (1 / 80) * (i21 * s1d + i22 * s1q));
    // the nodes at the rotor's angle (frozen angle plus its deviation)
    let sd = sinTiny(dthh), cd = cosTiny(dthh);
    const vhd = vbd * cd + vbq * sd, vhq = -vbd * sd + vbq * cd, th = t0 + h;
    const weh = p * wh;
    const didh = (vhd - Rs * xhd + weh * Lq * xhq) * iLd, diqh = (vhq - Rs * xhq - weh * (Ld * xhd + psiM)) * iLq;
    Ph = vhd * xhd + vhq * xhq; Pph = weh * (vhq * xhd - vhd * xhq) + vhd * didh + vhq * diqh;
    if (free) {
      const aw = abs(wh);
      gh = (kT * xhq * (psiM + dL * xhd) - B * wh - frh - (LA + LB * th) - k2 * wh * aw) * iJ;
      gph = (kT * (psiM * diqh + dL * (didh * xhq + xhd * diqh)) - (B + dfrh + 2 * k2 * aw) * gh - LB) * iJ;
    }
    sd = sinTiny(dth1); cd = cosTiny(dth1);
    const v1d = v1bd * cd + v1bq * sd, v1q = -v1bd * sd + v1bq * cd;
    const we1 = p * w1;
    const did1 = (v1d - Rs * x1d + we1 * Lq * x1q) * iLd, diq1 = (v1q - Rs * x1q - we1 * (Ld * x1d + psiM)) * iLq;
    P1 = v1d * x1d + v1q * x1q; Pp1 = we1 * (v1q * x1d - v1d * x1q) + v1d * did1 + v1q * diq1;
    if (free) {
      const aw = abs(w1);
      g1 = (kT * x1q * (psiM + dL * x1d) - B * w1 - fr1 - (LA + LB * t1) - k2 * w1 * aw) * iJ;
      gp1 = (kT * (psiM * diq1 + dL * (did1 * x1q + x1d * diq1)) - (B + dfr1 + 2 * k2 * aw) * g1 - LB) * iJ;
    }
    plant.evaluations += 2;
    // mechanics: quintic Hermite quadrature of g over the nodes (the new profile)
    const wh2 = w0 + h * ((101 / 240) * g0 + (8 / 15) * gh + (11 / 240) * g1) + hh * ((13 / 240) * gp0 - gph * (1 / 6) - gp1 * (1 / 80));
    const w12 = w0 + h * ((7 / 15) * (g0 + g1) + (16 / 15) * gh) + (hh * (1 / 15)) * (gp0 - gp1);
    const intW2 = w0 * dt + hh * ((79 / 105) * g0 + (16 / 15) * gh + (19 / 105) * g1) + hh * h * ((2 / 21) * gp0 - (16 / 105) * gph - (4 / 105) * gp1);
    const intWh2 = w0 * h + hh * ((13 / 42) * g0 + gh * (1 / 6) + g1 * (1 / 42)) + hh * h * ((59 / 1680) * gp0 - (8 / 105) * gph - (11 / 1680) * gp1);
    // the correction again on the new profile, by its change (linear in the profile's change): the end current
    const Dwh = p * (wh2 - wh), Dthh = p * (intWh2 - intWh), Dw1 = p * (w12 - w1), Dwp1 = p * (g1 - g1p), Dth1 = p * (intW2 - intW);
    const Drhd = Dwh * Uhd + Dthh * Zhd, Drhq = Dwh * Uhq + Dthh * Zhq;
    x1d += h * ((7 / 15) * (Dw1 * U1d + Dth1 * Z1d) + (16 / 15) * (a11 * Drhd + a12 * Drhq)) - (hh * (1 / 15)) * (Dwp1 * U1d + Dw1 * V1d + Dth1 * Y1d);
    x1q += h * ((7 / 15) * (Dw1 * U1q + Dth1 * Z1q) + (16 / 15) * (a21 * Drhd + a22 * Drhq)) - (hh * (1 / 15)) * (Dwp1 * U1q + Dw1 * V1q + Dth1 * Y1q);
    y[I_D] = x1d;
    y[I_Q] = x1q;
    y[OMEGA] = w12;
    y[THETA] = th0 + p * intW2;
    // the power 1.5 (vd id + vq iq): its factor 1.5 once here
    y[ENERGY] = y[ENERGY]! + 1.5 * (h * ((7 / 15) * (P0 + P1) + (16 / 15) * Ph) + (hh * (1 / 15)) * (Pp0 - Pp1));
    return true;
  }
}

/**
 * The stepper of a run: the exact periods (with the setup's own stepper as the fallback) for a
 * constant-parameter plant in current states with the voltage held in the stationary frame, the
 * Cash-Karp solver and `solver.exactPeriods` true; the setup's stepper alone otherwise
 * (flux maps, flux states, RK4, a dq-frame input).
 */
export function makePeriodStepper(setup: AnySetup, plant: Plant, y: Float64Array): Stepper {
  const base = makeStepper(setup, plant, y);
  const ok = setup.solver.method === 'cash-karp' && setup.solver.exactPeriods === true && plant.model.linear !== null
    && !plant.fluxStates && plant.params.inputFrame === 'alpha-beta';
  return ok ? new ExactStepper(plant, setup.controller.Ts, base, setup.Imax) : base;
}
