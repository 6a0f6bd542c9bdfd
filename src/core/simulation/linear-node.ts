/**
 * The constant-parameter plant's derivative at one node, with the time derivatives the Hermite
 * quadratures of the switching segment (switching-segment.ts) need (the exact period,
 * exact-stepper.ts, writes the same equations out in its own period, where a call would not be inlined): di/dt, the acceleration g = d omega/dt and its derivative g' (from the torque's derivative),
 * the electrical power 1.5 (vd id + vq iq) and its derivative. Motor reference direction; the same
 * equations as plant.ts (dq currents as states, friction smoothed by x / sqrt(1 + x^2), load torque
 * the line LA + LB t over the span). Allocates nothing.
 */
import type { Plant } from './plant';

export class LinearNode {
  /** load torque over the span: LA + LB t, N·m (set by the caller) */
  LA = NaN;
  LB = NaN;
  /** results: di/dt (A/s), omega' and omega'' , power (W) and its derivative (double fields start as non-integers) */
  nd = NaN; nq = NaN; ng = NaN; ngp = NaN; np = NaN; npp = NaN;
  /** the smoothed Coulomb friction at the node's speed and its derivative by the speed (see `friction`) */
  private fr = NaN;
  private dfr = NaN;
  /** the speed fr and dfr were taken at (NaN: none) */
  private fw = NaN;
  // constants start as NaN (a double): declared without a value a field starts as undefined, and
  // the engine then keeps its doubles boxed behind a check at every read
  private readonly pp: number = NaN;
  private readonly Rs: number = NaN;
  private readonly Ld: number = NaN;
  private readonly Lq: number = NaN;
  private readonly psiM: number = NaN;
  private readonly iLd: number = NaN;
  private readonly iLq: number = NaN;
  private readonly invJ: number = NaN;
  private readonly B: number = NaN;
  private readonly Tc: number = NaN;
  private readonly iWidth: number = NaN;
  private readonly k2: number = NaN;
  private readonly free: boolean;

  /** plant: a constant-parameter plant (model.linear set) */
  constructor(private readonly plant: Plant) {
    const m = plant.model.linear!;
    const pr = plant.params;
    this.pp = plant.model.polePairs;
    this.Rs = plant.model.Rs;
    this.Ld = m.Ld;
    this.Lq = m.Lq;
    this.psiM = m.psiM;
    this.iLd = 1 / m.Ld;
    this.iLq = 1 / m.Lq;
    this.invJ = 1 / pr.inertia;
    this.B = pr.viscousFriction;
    this.Tc = pr.coulombFriction;
    this.iWidth = 1 / pr.coulombWidth_rad_s;
    this.k2 = pr.load.quadraticK;
    this.free = pr.mechanics === 'free';
  }

  /**
   * The node's inputs for `evaluate`, `friction` and `evaluateWithFriction`: current (id, iq), speed
   * omega, dq voltage (vd, vq) and time t. Fields, not arguments: a caller into which these calls are
   * inlined keeps the values in registers (no store and reload, as through a typed array), and one
   * into which they are not passes no boxed double.
   */
  xId = NaN; xIq = NaN; xW = NaN; xVd = NaN; xVq = NaN; xT = NaN;

  /** The node at the inputs a[0..5] (id, iq, omega, vd, vq, t; see the x fields). */
  at(a: Float64Array): void {
    this.xId = a[0]!; this.xIq = a[1]!; this.xW = a[2]!; this.xVd = a[3]!; this.xVq = a[4]!; this.xT = a[5]!;
    this.evaluate();
  }

  /** The node at the x fields' inputs (the friction taken unless it is at their speed already). */
  evaluate(): void {
    if (this.xW !== this.fw) this.friction();
    this.evaluateWithFriction();
  }

  /**
   * The friction at the speed xW (a square root and a division: a caller that knows a node's speed
   * early calls this first, so that their latency overlaps its other arithmetic, then
   * `evaluateWithFriction` on the node with that speed).
   */
  friction(): void {
    const w = this.xW;
    let fr = 0, dfr = 0;
    if (this.free && this.Tc > 0) {
      const x = w * this.iWidth;
      const r = 1 / Math.sqrt(1 + x * x);
      fr = this.Tc * x * r;
      dfr = this.Tc * r * r * r * this.iWidth;
    }
    this.fr = fr;
    this.dfr = dfr;
    this.fw = w;
  }

  /** `evaluate` with the friction of `friction` at the same speed xW. */
  evaluateWithFriction(): void {
    const id = this.xId, iq = this.xIq, w = this.xW, vd = this.xVd, vq = this.xVq, t = this.xT;
    this.plant.evaluations++;
    const p = this.pp, Ld = this.Ld, Lq = this.Lq, psiM = this.psiM, Rs = this.Rs;
    const we = p * w;
    const did = (vd - Rs * id + we * Lq * iq) * this.iLd;
    const diq = (vq - Rs * iq - we * (Ld * id + psiM)) * this.iLq;
    this.nd = did;
    this.nq = diq;
    this.np = 1.5 * (vd * id + vq * iq);
    this.npp = 1.5 * (we * vq * id + vd * did - we * vd * iq + vq * diq);
    if (!this.free) { this.ng = 0; this.ngp = 0; return; }
    const k = 1.5 * p;
    const Te = k * (psiM * iq + (Ld - Lq) * id * iq);
    const dTe = k * (psiM * diq + (Ld - Lq) * (did * iq + id * diq));
    const aw = w < 0 ? -w : w;
    const fr = this.fr, dfr = this.dfr;
    const g = (Te - this.B * w - fr - (this.LA + this.LB * t) - this.k2 * w * aw) * this.invJ;
    this.ng = g;
    this.ngp = (dTe - (this.B + dfr + 2 * this.k2 * aw) * g - this.LB) * this.invJ;
  }
}
