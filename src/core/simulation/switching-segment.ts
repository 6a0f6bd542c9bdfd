/**
 * One segment of the switching model (the legs' states, hence the stationary-frame voltage, held)
 * for a constant-parameter plant in current states, between two load breakpoints at most:
 *   - the currents by the exact propagator (dq-propagator.ts: its setStep, errorBound and propagate
 *     written out here, its series branch only; equal to it, test/switching-segment.test.ts) at the segment's frozen electrical
 *     speed, the mean of the speed profile predicted from the segment start's derivatives
 *     (p (omega0 + g0 h/2 + g0' h²/6)), the voltage projected on the rotor's angle at the start;
 *   - the mechanics as the exact stepper takes them (exact-stepper.ts), on the segment's two ends:
 *     the torque's derivative from di/dt under the segment's voltage, the speed by the cubic Hermite
 *     rule h/2 (g0 + g1) + h²/12 (g0' - g1'), the angle by the same rule on the speed's integral,
 *     h²(7 g0/20 + 3 g1/20) + h³(g0'/20 - g1'/30), the energy by the rule on the bridge's power.
 *     The end speed for the end's derivative is predicted from the start's (the friction's and the
 *     load's dependence on the speed over a segment is of third order).
 * The rules integrate the cubic Hermite interpolant of values and derivatives at the two ends (from
 * memory: Stoer and Bulirsch, Introduction to Numerical Analysis, Hermite interpolation).
 *
 * `step` returns false (y untouched) where the closed form or the rules do not apply, and the caller
 * integrates the segment otherwise (RK4 in switching-period.ts): free mechanics near zero speed
 * (|omega0| < 20 w + 4 |g0| h, w the smoothed Coulomb sign's width), a large angle per segment
 * (max(p |omega0|, Rs/L) h > MAX_ANGLE; |delta h| or |we h| above 0.5, the series' range), the
 * propagator's rounding-error bound (with 1-norms) above 1e-11 Imax
 * (the Rs -> 0 resonance), a non-finite state. Allocation-free; an instance belongs to one run.
 */
import { cosS, sincS, coshS, sinhcS } from './dq-propagator';
import { MAX_ANGLE } from './exact-stepper';
import type { Plant } from './plant';
import { LinearNode } from './linear-node';
import { cosSmall, sinSmall } from '../mathematics/rotation';

const sinSmallL = sinSmall;
const cosSmallL = cosSmall;
const cosSL = cosS, sincSL = sincS, coshSL = coshS, sinhcSL = sinhcS;
const EPS8 = 8 * 2.220446049250313e-16;

export class ExactSegment {
  /** the segment [span[0], span[1]] the next `step` integrates, s (doubles cross the call unboxed) */
  readonly span = new Float64Array(2);
  /** the angle and its cos and sin the caller last computed (the start's rotation when the angle is the start's) */
  readonly rot = new Float64Array(3).fill(NaN);
  /** segments the closed form declined */
  fallbacks = 0;
  // constants start as NaN (a double): declared without a value a field starts as undefined, and
  // the engine then keeps its doubles boxed behind a check at every read
  private readonly pp: number = NaN;
  private readonly Rs: number = NaN;
  private readonly Ld: number = NaN;
  private readonly Lq: number = NaN;
  private readonly psiM: number = NaN;
  private readonly iLd: number = NaN;
  private readonly iLq: number = NaN;
  /** 20 times the smoothed Coulomb sign's width, rad/s (the free-mechanics test below) */
  private readonly width20: number = NaN;
  private readonly free: boolean;
  private readonly errMax: number = NaN;
  private readonly rate: number = NaN;
  // the propagator's constants (see DqPropagator.setStep), for its arithmetic written out in `step`
  private readonly m: number = NaN;
  private readonly q: number = NaN;
  private readonly qq: number = NaN;
  private readonly rqd: number = NaN;
  private readonly rdq: number = NaN;
  private readonly Rs2: number = NaN;
  private readonly iRs: number = NaN;
  private readonly S2: number = NaN;
  private readonly LqS2: number = NaN;
  private readonly LdS2: number = NaN;
  private readonly dL: number = NaN;
  private readonly LdLq: number = NaN;
  /** the plant's derivative at a node (linear-node.ts; its inputs and results in its fields) */
  private readonly n: LinearNode;

  constructor(private readonly plant: Plant, Imax: number) {
    const m = plant.model.linear;
    if (m === null || plant.fluxStates) throw new Error('ExactSegment needs a constant-parameter plant in current states');
    this.n = new LinearNode(plant);
    this.pp = plant.model.polePairs;
    this.Rs = plant.model.Rs;
    this.Ld = m.Ld;
    this.Lq = m.Lq;
    this.psiM = m.psiM;
    this.iLd = 1 / m.Ld;
    this.iLq = 1 / m.Lq;
    const pr = plant.params;
    this.width20 = 20 * pr.coulombWidth_rad_s;
    this.free = pr.mechanics === 'free';
    this.errMax = 1e-11 * Imax;
    this.rate = Math.max(this.Rs / m.Ld, this.Rs / m.Lq);
    const a = -this.Rs / m.Ld, d = -this.Rs / m.Lq, S = m.Ld + m.Lq;
    this.m = 0.5 * (a + d);
    this.q = 0.5 * (a - d);
    this.qq = this.q * this.q;
    this.rqd = m.Lq / m.Ld;
    this.rdq = m.Ld / m.Lq;
    this.Rs2 = this.Rs * this.Rs;
    this.iRs = 1 / this.Rs; // Infinity for Rs = 0: every segment then declines (the bound below is not finite)
    this.S2 = S * S;
    this.LqS2 = 2 * m.Lq * S;
    this.LdS2 = 2 * m.Ld * S;
    this.dL = m.Ld - m.Lq;
    this.LdLq = m.Ld * m.Lq;
  }

  /** Integrate y over [span[0], span[1]] with the plant's input (alpha-beta) held; false (y untouched) where it does not apply. */
  step(y: Float64Array): boolean {
    const ta = this.span[0]!, tb = this.span[1]!;
    const h = tb - ta;
    const plant = this.plant;
    const p = this.pp;
    const id0 = y[0]!, iq0 = y[1]!, w0 = y[2]!, th0 = y[3]!;
    const aw0 = w0 < 0 ? -w0 : w0;
    if ((p * aw0 > this.rate ? p * aw0 : this.rate) * h > MAX_ANGLE) return this.no();
    // the rotation at the start from the plant's angle origin (as the plant's derivative does)
    const d = th0 - plant.th0;
    const rot = this.rot;
    let c: number, s: number;
    if (rot[0] === th0) {
      c = rot[1]!;
      s = rot[2]!;
    } else if (d > -0.5 && d < 0.5) {
      const sd = sinSmallL(d), cd = cosSmallL(d);
      c = plant.c0 * cd - plant.s0 * sd;
      s = plant.s0 * cd + plant.c0 * sd;
    } else {
      c = Math.cos(th0);
      s = Math.sin(th0);
    }
    const u = plant.input;
    const vd0 = u[0]! * c + u[1]! * s, vq0 = -u[0]! * s + u[1]! * c;
    if (!Number.isFinite(id0 + iq0 + w0 + th0 + vd0 + vq0)) return this.no();
    // the start node, under the load line the plant holds (Plant.setLoadSegment): g = omega', g'
    // (omega'' from the torque's derivative), the power and its derivative
    const n = this.n;
    n.LA = plant.loadA;
    n.LB = plant.loadB;
    n.xId = id0; n.xIq = iq0; n.xW = w0; n.xVd = vd0; n.xVq = vq0; n.xT = ta;
    n.evaluate();
    const g0 = n.ng, gp0 = n.ngp, P0 = n.np, Pp0 = n.npp;
    if (this.free) {
      const ag0 = g0 < 0 ? -g0 : g0;
      if (aw0 < this.width20 + 4 * ag0 * h) return this.no();
    }
    const hh = h * h;
    // the end node's speed, predicted: its friction first (a square root and a division that then
    // overlap the propagation below)
    const w1p = w0 + g0 * h + 0.5 * gp0 * hh;
    n.xW = w1p;
    n.friction();
    // DqPropagator.setStep, errorBound and propagate written out (no call, no square root): the
    // series branch |delta h| <= 0.5 (every segment of a carrier period at any sensible speed)
    const W = p * (w0 + 0.5 * g0 * h + (gp0 * hh) / 6);
    const q = this.q;
    const yy = (this.qq - W * W) * hh;
    const wt = W * h;
    if (!(yy > -0.25 && yy < 0.25 && wt > -0.5 && wt < 0.5)) return this.no();
    const mh = this.m * h;
    // e^{m h} by its series below |m h| = 0.05 (truncation below 1e-16), else the library's
    const E = mh > -0.05 && mh < 0.05 ? 1 + mh * (1 + mh * (0.5 + mh * (1 / 6 + mh * (1 / 24 + mh * (1 / 120 + mh * (1 / 720 + mh / 5040)))))) : Math.exp(mh);
    let EC: number, ES: number;
    if (yy >= 0) { EC = E * coshSL(yy); ES = E * h * sinhcSL(yy); } else { EC = E * cosSL(-yy); ES = E * h * sincSL(-yy); }
    const p11 = EC + ES * q, p12 = ES * W * this.rqd, p21 = -ES * W * this.rdq, p22 = EC - ES * q;
    const wt2 = wt * wt;
    const cw = cosSL(wt2), sw = wt * sincSL(wt2);
    const w2 = W * W, Rs2 = this.Rs2;
    const iN = 1 / (Rs2 + w2 * this.S2);
    const iRN = iN * this.iRs;
    const k1r = (Rs2 + w2 * this.LqS2) * iRN, k1i = W * this.dL * iN;
    const k2r = -k1i, k2i = -(Rs2 + w2 * this.LdS2) * iRN;
    const f = (W * this.psiM) / (Rs2 + w2 * this.LdLq);
    const xcd = W === 0 ? 0 : -W * this.Lq * f, xcq = W === 0 ? 0 : -this.Rs * f;
    // the rounding-error bound of DqPropagator.errorBound with 1-norms (at least its 2-norms)
    const bound = EPS8 * (Math.abs(id0) + Math.abs(iq0) + (Math.abs(k1r) + Math.abs(k1i) + Math.abs(k2r) + Math.abs(k2i)) * (Math.abs(vd0) + Math.abs(vq0)) + Math.abs(xcd) + Math.abs(xcq));
    if (!(bound <= this.errMax)) return this.no();
    const x1r = vd0 * k1r - vq0 * k1i, x1i = vd0 * k1i + vq0 * k1r;
    const x2r = vd0 * k2r - vq0 * k2i, x2i = vd0 * k2i + vq0 * k2r;
    const zd = id0 - x1r - xcd, zq = iq0 - x2r - xcq;
    const id1 = p11 * zd + p12 * zq + xcd + x1r * cw + x1i * sw;
    const iq1 = p21 * zd + p22 * zq + xcq + x2r * cw + x2i * sw;
    // the end node at the predicted speed (its friction taken above)
    n.xId = id1; n.xIq = iq1; n.xVd = vd0 * cw + vq0 * sw; n.xVq = -vd0 * sw + vq0 * cw; n.xT = tb;
    n.evaluateWithFriction();
    const g1 = n.ng, gp1 = n.ngp, P1 = n.np, Pp1 = n.npp;
    y[0] = id1;
    y[1] = iq1;
    const w1 = w0 + 0.5 * h * (g0 + g1) + (hh / 12) * (gp0 - gp1);
    y[2] = w1;
    y[3] = th0 + p * (w0 * h + hh * (0.35 * g0 + 0.15 * g1) + hh * h * (gp0 / 20 - gp1 / 30));
    y[4] = y[4]! + 0.5 * h * (P0 + P1) + (hh / 12) * (Pp0 - Pp1);
    // the next segment's start node is at this speed: its friction now (the node keeps it for that speed)
    n.xW = w1;
    n.friction();
    return true;
  }

  private no(): boolean {
    this.fallbacks++;
    return false;
  }
}
