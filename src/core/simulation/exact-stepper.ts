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
 * period among them); the propagator's rounding-error bound (the Rs -> 0 resonance) above 1e-11 Imax;
 * a non-finite state. The quadrature weights integrate the quintic Hermite interpolant of values and
 * derivatives at the three nodes (from memory: Stoer and Bulirsch, Introduction to Numerical
 * Analysis, Hermite interpolation); the first-order correction is common practice (no source).
 */
import { DqPropagator } from './dq-propagator';
import { I_D, I_Q, OMEGA, THETA, ENERGY } from './plant';
import type { Plant } from './plant';
import { LinearNode } from './linear-node';
import { Stepper, makeStepper } from './stepper';
import type { AnySetup } from './simulation-setup';
import { nextLoadBreak, loadLevel } from './load-schedule';
import { cosSmall, sinSmall } from '../mathematics/rotation';

const sinSmallL = sinSmall;
const cosSmallL = cosSmall;

/** largest max(electrical angle, Rs/L dt) per period the closed form takes, rad */
export const MAX_ANGLE = 1;

/**
 * sin and cos of the angle deviation within a period (about p dOmega dt / 8, well below 1e-3 rad):
 * two terms below 1e-3 rad (truncation below 1e-17), the series of rotation.ts above.
 */
function sinTiny(d: number): number {
  return d > -1e-3 && d < 1e-3 ? d * (1 - (d * d) / 6) : sinSmallL(d);
}
function cosTiny(d: number): number {
  return d > -1e-3 && d < 1e-3 ? 1 - 0.5 * d * d * (1 - (d * d) / 12) : cosSmallL(d);
}
export class ExactStepper extends Stepper {
  /** periods handed to the fallback stepper */
  fallbacks = 0;
  /** apply the first-order correction for the speed's change (false only to measure what it does) */
  private readonly prop: DqPropagator;
  /** the plant's derivative at a node (linear-node.ts) */
  private readonly n: LinearNode;
  private readonly pp: number;
  private readonly Rs: number;
  private readonly Ld: number;
  private readonly Lq: number;
  private readonly psiM: number;
  private readonly width: number;
  private readonly free: boolean;
  private readonly errMax: number;
  private readonly rate: number;
  // reciprocals and ratios (no division in the period's arithmetic)
  private readonly iLd: number;
  private readonly iLq: number;
  private readonly rqd: number;
  private readonly rdq: number;
  // the load line of the current piece (LA + LB t) and where the piece ends
  // (double fields start as non-integers: the engine then keeps them as unboxed doubles)
  private nextBreakX = -Infinity;
  private LA = NaN;
  private LB = NaN;
  // node results (see `node`): x', g = omega', g', power, power'
  private nd = NaN; private nq = NaN; private ng = NaN; private ngp = NaN; private np = NaN; private npp = NaN;
  // correction terms (see `corr`): r and r' - A r
  private rd = NaN; private rq = NaN; private sd = NaN; private sq = NaN;

  constructor(plant: Plant, Ts: number, private readonly fallback: Stepper, Imax: number) {
    super(plant, Ts);
    const m = plant.model.linear!;
    this.n = new LinearNode(plant);
    this.prop = new DqPropagator({ Rs: plant.model.Rs, Ld: m.Ld, Lq: m.Lq, psiM: m.psiM });
    this.pp = plant.model.polePairs;
    this.Rs = plant.model.Rs;
    this.Ld = m.Ld;
    this.Lq = m.Lq;
    this.psiM = m.psiM;
    const pr = plant.params;
    this.width = pr.coulombWidth_rad_s;
    this.free = pr.mechanics === 'free';
    this.errMax = 1e-11 * Imax;
    this.rate = Math.max(this.Rs / m.Ld, this.Rs / m.Lq);
    this.iLd = 1 / m.Ld;
    this.iLq = 1 / m.Lq;
    this.rqd = m.Lq / m.Ld;
    this.rdq = m.Ld / m.Lq;
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

  /** the load line LA + LB t of the piece that starts at t0 (as Plant.setLoadSegment) */
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

  /**
   * The plant's derivative at a node: current (id, iq), speed w, dq voltage (vd, vq), time t in
   * arg[0..5] (doubles cross the call through a typed array: no boxing when the call is not inlined).
   * Sets nd, nq (di/dt), ng (d omega/dt), ngp (its time derivative), np (power), npp (its derivative).
   */
  private node(): void {
    const n = this.n;
    n.LA = this.LA;
    n.LB = this.LB;
    n.at(this.arg);
    this.nd = n.nd; this.nq = n.nq; this.np = n.np; this.npp = n.npp; this.ng = n.ng; this.ngp = n.ngp;
  }

  /**
   * The correction's forcing at a node (frozen speed W): rd, rq = r, and sd, sq = r' - A r, from
   * arg[0..9]: the frozen current x and its derivative xp, the frozen voltage (vd, vq), W, the speed
   * deviation dw, its derivative dwp and the angle deviation dth.
   */
  private corr(): void {
    const a = this.arg;
    const xd = a[0]!, xq = a[1]!, xpd = a[2]!, xpq = a[3]!, vd = a[4]!, vq = a[5]!, W = a[6]!, dw = a[7]!, dwp = a[8]!, dth = a[9]!;
    const iLd = this.iLd, iLq = this.iLq, Rs = this.Rs;
    const ud = this.rqd * xq, uq = -(this.Ld * xd + this.psiM) * iLq;
    const upd = this.rqd * xpq, upq = -this.rdq * xpd;
    const zd = vq * iLd, zq = -vd * iLq;
    const zpd = -W * vd * iLd, zpq = -W * vq * iLq;
    const rd = dw * ud + dth * zd, rq = dw * uq + dth * zq;
    const rpd = dwp * ud + dw * upd + dw * zd + dth * zpd;
    const rpq = dwp * uq + dw * upq + dw * zq + dth * zpq;
    this.rd = rd;
    this.rq = rq;
    // A r with A = [[-Rs/Ld, W Lq/Ld], [-W Ld/Lq, -Rs/Lq]]
    this.sd = rpd - (-Rs * rd * iLd + W * this.rqd * rq);
    this.sq = rpq - (-W * this.rdq * rd - Rs * rq * iLq);
  }

  /**
   * One iteration of a period: the first-order correction on the current speed profile, the mid and
   * end nodes, the mechanics by the quintic Hermite rule (the new profile). Reads and writes `fz`.
   */
  private iterate(nodes: boolean): void {
    const fz = this.fz;
    const ag = this.arg;
    const p = this.pp;
    const xbhd = fz[0]!, xbhq = fz[1]!, xb1d = fz[2]!, xb1q = fz[3]!, xphd = fz[4]!, xphq = fz[5]!, xp1d = fz[6]!, xp1q = fz[7]!, vbd = fz[8]!, vbq = fz[9]!, v1bd = fz[10]!, v1bq = fz[11]!, W = fz[12]!, h = fz[13]!, dt = fz[14]!, t0 = fz[15]!, w0 = fz[16]!, g0 = fz[17]!, gp0 = fz[18]!, R0d = fz[19]!, R0q = fz[20]!, S0d = fz[21]!, S0q = fz[22]!, M0d = fz[23]!, M0q = fz[24]!, N0d = fz[25]!, N0q = fz[26]!, a11 = fz[27]!, a12 = fz[28]!, a21 = fz[29]!, a22 = fz[30]!, i11 = fz[31]!, i12 = fz[32]!, i21 = fz[33]!, i22 = fz[34]!;
    let wh = fz[35]!, w1 = fz[36]!, gh = fz[37]!, g1 = fz[38]!, intW = fz[39]!, intWh = fz[40]!;
    const hh = h * h;
    const t1 = t0 + dt;
    let x1d: number, x1q: number;
    // the first-order correction for the speed's change within the period, on the current profile
    const dthh = p * intWh - W * h, dth1 = p * intW - W * dt;
    ag[0] = xbhd; ag[1] = xbhq; ag[2] = xphd; ag[3] = xphq; ag[4] = vbd; ag[5] = vbq; ag[6] = W; ag[7] = p * wh - W; ag[8] = p * gh; ag[9] = dthh;
    this.corr();
    const rhd = this.rd, rhq = this.rq, shd = this.sd, shq = this.sq;
    ag[0] = xb1d; ag[1] = xb1q; ag[2] = xp1d; ag[3] = xp1q; ag[4] = v1bd; ag[5] = v1bq; ag[6] = W; ag[7] = p * w1 - W; ag[8] = p * g1; ag[9] = dth1;
    this.corr();
    const r1d = this.rd, r1q = this.rq, s1d = this.sd, s1q = this.sq;
    // e(dt): full-period weights h (7/15, 16/15, 7/15), h^2 (1/15, 0, -1/15)
    x1d = xb1d + h * ((7 / 15) * (R0d + r1d) + (16 / 15) * (a11 * rhd + a12 * rhq)) + (hh / 15) * (S0d - s1d);
    x1q = xb1q + h * ((7 / 15) * (R0q + r1q) + (16 / 15) * (a21 * rhd + a22 * rhq)) + (hh / 15) * (S0q - s1q);
    // e(h): first-half weights h (101/240, 8/15, 11/240), h^2 (13/240, -1/6, -1/80); the node at dt through e^{-A h}
    const xhd = xbhd + h * ((101 / 240) * M0d + (8 / 15) * rhd + (11 / 240) * (i11 * r1d + i12 * r1q))
      + hh * ((13 / 240) * N0d - shd / 6 - (1 / 80) * (i11 * s1d + i12 * s1q));
    const xhq = xbhq + h * ((101 / 240) * M0q + (8 / 15) * rhq + (11 / 240) * (i21 * r1d + i22 * r1q))
      + hh * ((13 / 240) * N0q - shq / 6 - (1 / 80) * (i21 * s1d + i22 * s1q));
    if (!nodes) { fz[41] = x1d; fz[42] = x1q; return; }
    // the nodes at the rotor's angle (frozen angle plus its deviation)
    let sd = sinTiny(dthh), cd = cosTiny(dthh);
    ag[0] = xhd; ag[1] = xhq; ag[2] = wh; ag[3] = vbd * cd + vbq * sd; ag[4] = -vbd * sd + vbq * cd; ag[5] = t0 + h;
    this.node();
    gh = this.ng; const gph = this.ngp, Ph = this.np, Pph = this.npp;
    sd = sinTiny(dth1); cd = cosTiny(dth1);
    ag[0] = x1d; ag[1] = x1q; ag[2] = w1; ag[3] = v1bd * cd + v1bq * sd; ag[4] = -v1bd * sd + v1bq * cd; ag[5] = t1;
    this.node();
    g1 = this.ng; const gp1 = this.ngp, P1 = this.np, Pp1 = this.npp;
    // mechanics: quintic Hermite quadrature of g over the nodes
    wh = w0 + h * ((101 / 240) * g0 + (8 / 15) * gh + (11 / 240) * g1) + hh * ((13 / 240) * gp0 - gph / 6 - gp1 / 80);
    w1 = w0 + h * ((7 / 15) * (g0 + g1) + (16 / 15) * gh) + (hh / 15) * (gp0 - gp1);
    intW = w0 * dt + hh * ((79 / 105) * g0 + (16 / 15) * gh + (19 / 105) * g1) + hh * h * ((2 / 21) * gp0 - (16 / 105) * gph - (4 / 105) * gp1);
    intWh = w0 * h + hh * ((13 / 42) * g0 + gh / 6 + g1 / 42) + hh * h * ((59 / 1680) * gp0 - (8 / 105) * gph - (11 / 1680) * gp1);
    fz[35] = wh; fz[36] = w1; fz[37] = gh; fz[38] = g1; fz[39] = intW; fz[40] = intWh; fz[41] = x1d; fz[42] = x1q; fz[43] = gph; fz[44] = gp1; fz[45] = Ph; fz[46] = Pph; fz[47] = P1; fz[48] = Pp1;
  }

  /** The period by the closed form; false (y untouched) when it does not apply. */
  private exact(y: Float64Array): boolean {
    const t0 = this.span[0]!, t1 = this.span[1]!;
    const plant = this.plant;
    const ag = this.arg;
    if (t0 >= this.nextBreakX) {
      this.nextBreakX = nextLoadBreak(plant.params.load, t0);
      this.loadLine(t0, Math.min(this.nextBreakX, t0 + this.Ts));
    }
    const dt = t1 - t0;
    if (this.nextBreakX < t1 - 1e-9 * this.Ts) return false;
    const h = 0.5 * dt;
    const iDt = 1 / dt;
    const p = this.pp;
    const id0 = y[I_D]!, iq0 = y[I_Q]!, w0 = y[OMEGA]!, th0 = y[THETA]!;
    const u = plant.input;
    const c0 = plant.c0, s0 = plant.s0;
    const vd0 = u[0]! * c0 + u[1]! * s0, vq0 = -u[0]! * s0 + u[1]! * c0;
    const aw0 = w0 < 0 ? -w0 : w0;
    if ((p * aw0 > this.rate ? p * aw0 : this.rate) * dt > MAX_ANGLE) return false;
    if (!Number.isFinite(id0 + iq0 + w0 + th0 + vd0 + vq0)) return false;
    ag[0] = id0; ag[1] = iq0; ag[2] = w0; ag[3] = vd0; ag[4] = vq0; ag[5] = t0;
    this.node();
    const g0 = this.ng, gp0 = this.ngp, P0 = this.np, Pp0 = this.npp;
    if (this.free) {
      const ag = g0 < 0 ? -g0 : g0;
      if (aw0 < 20 * this.width + 4 * ag * dt) return false;
    }
    const prop = this.prop;
    const hh = h * h;
    // the speed profile predicted from the start's derivatives: omega0 + g0 s + g0' s^2/2
    let wh = w0 + g0 * h + 0.5 * gp0 * hh, w1 = w0 + g0 * dt + 2 * gp0 * hh;
    let gh = g0 + gp0 * h, g1 = g0 + gp0 * dt;
    let intW = w0 * dt + 2 * g0 * hh + (4 / 3) * gp0 * hh * h;
    let intWh = w0 * h + 0.5 * g0 * hh + (1 / 6) * gp0 * hh * h;
    // one propagation at the frozen speed of the predicted mean
    const W = p * intW * iDt;
    prop.setStep(W, h);
    // the propagator's rounding-error bound (see DqPropagator.errorBound), inline
    const bound = 8 * 2.220446049250313e-16 * (Math.sqrt(id0 * id0 + iq0 * iq0) + prop.gain * Math.sqrt(vd0 * vd0 + vq0 * vq0) + prop.xcAbs);
    if (!(bound <= this.errMax)) return false;
    const cw = prop.cw, sw = prop.sw;
    // frozen voltage at the nodes (rotating by -W s in dq)
    const vbd = vd0 * cw + vq0 * sw, vbq = -vd0 * sw + vq0 * cw;
    const v1bd = vbd * cw + vbq * sw, v1bq = -vbd * sw + vbq * cw;
    // DqPropagator.propagate to h and on to dt, inline (no doubles boxed across a call)
    const k1r = prop.k1r, k1i = prop.k1i, k2r = prop.k2r, k2i = prop.k2i, xcd = prop.xcd, xcq = prop.xcq;
    const p11 = prop.p11, p12 = prop.p12, p21 = prop.p21, p22 = prop.p22;
    let x1r = vd0 * k1r - vq0 * k1i, x1i = vd0 * k1i + vq0 * k1r, x2r = vd0 * k2r - vq0 * k2i, x2i = vd0 * k2i + vq0 * k2r;
    let zd = id0 - x1r - xcd, zq = iq0 - x2r - xcq;
    const xbhd = p11 * zd + p12 * zq + xcd + x1r * cw + x1i * sw;
    const xbhq = p21 * zd + p22 * zq + xcq + x2r * cw + x2i * sw;
    x1r = vbd * k1r - vbq * k1i; x1i = vbd * k1i + vbq * k1r; x2r = vbd * k2r - vbq * k2i; x2i = vbd * k2i + vbq * k2r;
    zd = xbhd - x1r - xcd; zq = xbhq - x2r - xcq;
    const xb1d = p11 * zd + p12 * zq + xcd + x1r * cw + x1i * sw;
    const xb1q = p21 * zd + p22 * zq + xcq + x2r * cw + x2i * sw;
    const Ld = this.Ld, Lq = this.Lq, Rs = this.Rs, psiM = this.psiM, iLd = this.iLd, iLq = this.iLq;
    // frozen derivatives at the mid and end nodes
    const xphd = (vbd - Rs * xbhd + W * Lq * xbhq) * iLd, xphq = (vbq - Rs * xbhq - W * (Ld * xbhd + psiM)) * iLq;
    const xp1d = (v1bd - Rs * xb1d + W * Lq * xb1q) * iLd, xp1q = (v1bq - Rs * xb1q - W * (Ld * xb1d + psiM)) * iLq;
    const a11 = prop.p11, a12 = prop.p12, a21 = prop.p21, a22 = prop.p22;
    // e^{A dt} = e^{A h}^2, e^{-A h} = its inverse
    const b11 = a11 * a11 + a12 * a21, b12 = a11 * a12 + a12 * a22, b21 = a21 * a11 + a22 * a21, b22 = a21 * a12 + a22 * a22;
    const idet = 1 / (a11 * a22 - a12 * a21);
    const i11 = a22 * idet, i12 = -a12 * idet, i21 = -a21 * idet, i22 = a11 * idet;
    // the start node's correction terms (the same for every profile: no angle deviation at s = 0)
    ag[0] = id0; ag[1] = iq0; ag[2] = (vd0 - Rs * id0 + W * Lq * iq0) * iLd; ag[3] = (vq0 - Rs * iq0 - W * (Ld * id0 + psiM)) * iLq; ag[4] = vd0; ag[5] = vq0; ag[6] = W; ag[7] = p * w0 - W; ag[8] = p * g0; ag[9] = 0;
    this.corr();
    const r0d = this.rd, r0q = this.rq, s0d = this.sd, s0q = this.sq;
    // e^{A dt} (r0, s0), e^{A h} (r0, s0)
    const R0d = b11 * r0d + b12 * r0q, R0q = b21 * r0d + b22 * r0q, S0d = b11 * s0d + b12 * s0q, S0q = b21 * s0d + b22 * s0q;
    const M0d = a11 * r0d + a12 * r0q, M0q = a21 * r0d + a22 * r0q, N0d = a11 * s0d + a12 * s0q, N0q = a21 * s0d + a22 * s0q;
    // the iterations (correction on the current profile, the nodes, the mechanics) read the period's
    // frozen terms from a typed array: doubles cross the call unboxed
    const fz = this.fz;
    fz[0] = xbhd; fz[1] = xbhq; fz[2] = xb1d; fz[3] = xb1q; fz[4] = xphd; fz[5] = xphq; fz[6] = xp1d; fz[7] = xp1q; fz[8] = vbd; fz[9] = vbq; fz[10] = v1bd; fz[11] = v1bq; fz[12] = W; fz[13] = h; fz[14] = dt; fz[15] = t0; fz[16] = w0; fz[17] = g0; fz[18] = gp0; fz[19] = R0d; fz[20] = R0q; fz[21] = S0d; fz[22] = S0q; fz[23] = M0d; fz[24] = M0q; fz[25] = N0d; fz[26] = N0q; fz[27] = a11; fz[28] = a12; fz[29] = a21; fz[30] = a22; fz[31] = i11; fz[32] = i12; fz[33] = i21; fz[34] = i22;
    fz[35] = wh; fz[36] = w1; fz[37] = gh; fz[38] = g1; fz[39] = intW; fz[40] = intWh;
    this.iterate(true);
    this.iterate(false);
    const x1d = fz[41]!, x1q = fz[42]!, P1 = fz[47]!, Ph = fz[45]!, Pp1 = fz[48]!;
    intW = fz[39]!;
    const w1r = fz[36]!;
    y[I_D] = x1d;
    y[I_Q] = x1q;
    y[OMEGA] = w1r;
    y[THETA] = th0 + p * intW;
    y[ENERGY] = y[ENERGY]! + h * ((7 / 15) * (P0 + P1) + (16 / 15) * Ph) + ((h * h) / 15) * (Pp0 - Pp1);
    return true;
  }

  /** the frozen terms and the profile of a period (see `iterate`) */
  private readonly fz = new Float64Array(49);
  /** the arguments of `node` and `corr` */
  private readonly arg = new Float64Array(10);
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
