/**
 * The exact solution of the constant-parameter dq current equations over a step dt at a frozen
 * electrical speed we, with the voltage held constant in the stationary (alpha, beta) frame:
 *
 *   Ld did/dt = vd - Rs id + we Lq iq
 *   Lq diq/dt = vq - Rs iq - we (Ld id + psiM)
 *   vd + j vq = (v_alpha + j v_beta) e^{-j theta(t)},  theta(t) = theta0 + we t
 *
 * i.e. x' = A x + B v(t) + c with x = (id, iq), A = [[-Rs/Ld, we Lq/Ld], [-we Ld/Lq, -Rs/Lq]],
 * B = diag(1/Ld, 1/Lq), c = (0, -we psiM/Lq). The voltage in dq rotates backwards with the rotor:
 * v(t) = Re(V e^{-j we t}) componentwise with V = (vd0 + j vq0, -j (vd0 + j vq0)) for (vd, vq).
 * The solution is the sum of
 *   - the rotating particular solution x_p(t) = Re(X e^{-j we t}), X = -(A + j we I)^-1 B V (the
 *     complex 2x2 system, solved here in closed form: the coefficients k1, k2 below),
 *   - the constant particular solution x_c = -A^-1 c (the back-EMF's short-circuit current),
 *   - the homogeneous part e^{A t} (x0 - x_p(0) - x_c).
 * e^{A t} of the 2x2 real matrix by its closed form e^{m t} (C I + S (A - m I)), m = tr A / 2,
 * delta^2 = ((a - d)/2)^2 + b c: C = cosh, S = sinh(delta t)/delta for delta^2 >= 0 (overdamped,
 * real eigenvalues), cos and sin(delta t)/delta for delta^2 < 0 (complex pair), by their series in
 * (delta t)^2 for |delta t| <= 0.5 (repeated eigenvalues included: no division by the eigenvalue gap).
 * Moler and Van Loan (2003), "Nineteen dubious ways to compute the exponential of a matrix, twenty-five
 * years later", SIAM Review 45(1) (the 2x2 closed form); the variation-of-constants solution of a
 * linear system with sinusoidal forcing is common practice (no source).
 *
 * Conditioning. The particular solution carries 1/Rs (the forcing rotates at the frequency of the
 * lightly damped eigenvalue pair: resonance as Rs -> 0); the homogeneous part cancels it, so the
 * rounding error of the end current is about eps (|x0| + |X| + |x_c|), which `errorBound` returns.
 * With Rs = 0 it is infinite (the caller must integrate otherwise, e.g. by ode45-cash-karp); with
 * Rs > 0 it grows as L / (Rs dt) times the current a volt drives in dt. The caller compares it with
 * its own tolerance. Everything else (overdamped branch, repeated eigenvalues, large we dt, we = 0)
 * is exact to rounding.
 *
 * Allocation-free: `setStep` precomputes what depends on (we, dt) in plain fields; `propagate` is
 * straight-line arithmetic. An instance belongs to one run (no shared state).
 */

export interface DqConstants {
  readonly Rs: number;
  readonly Ld: number;
  readonly Lq: number;
  readonly psiM: number;
}

/**
 * Series on |x| <= 0.5 (truncation below 1e-16 there; common practice, no source), in Horner form:
 * cos, sin(x)/x (complex branch) and cosh, sinh(x)/x (real branch) of y = x^2. Beyond 0.5 the
 * library functions.
 */
export function cosS(y: number): number {
  // Estrin's scheme: the four pairs are independent (short dependency chains)
  const y2 = y * y, y4 = y2 * y2;
  return 1 - y / 2 + y2 * (1 / 24 - y / 720) + y4 * (1 / 40320 - y / 3628800 + y2 * (1 / 479001600 - y / 87178291200));
}
export function sincS(y: number): number {
  const y2 = y * y, y4 = y2 * y2;
  return 1 - y / 6 + y2 * (1 / 120 - y / 5040) + y4 * (1 / 362880 - y / 39916800 + y2 * (1 / 6227020800 - y / 1307674368000));
}
export function coshS(y: number): number {
  const y2 = y * y, y4 = y2 * y2;
  return 1 + y / 2 + y2 * (1 / 24 + y / 720) + y4 * (1 / 40320 + y / 3628800 + y2 * (1 / 479001600 + y / 87178291200));
}
export function sinhcS(y: number): number {
  const y2 = y * y, y4 = y2 * y2;
  return 1 + y / 6 + y2 * (1 / 120 + y / 5040) + y4 * (1 / 362880 + y / 39916800 + y2 * (1 / 6227020800 + y / 1307674368000));
}
// module-local references (a CommonJS build turns an imported binding into a property getter)
const cosSL = cosS, sincSL = sincS, coshSL = coshS, sinhcSL = sinhcS;

const EPS = 2.220446049250313e-16;

export class DqPropagator {
  readonly Rs: number;
  readonly Ld: number;
  readonly Lq: number;
  readonly psiM: number;
  /** the frozen electrical speed and the step of the last `setStep` */
  // (every double field starts as a non-integer, so that the engine stores it as an unboxed double)
  we = NaN;
  dt = NaN;
  /** e^{A dt} = [[p11, p12], [p21, p22]] */
  p11 = NaN; p12 = NaN; p21 = NaN; p22 = NaN;
  /** cos and sin of we dt: the dq voltage at the step end is (vd0 cw + vq0 sw, -vd0 sw + vq0 cw) */
  cw = NaN; sw = NaN;
  /** X = (V k1, V k2) for V = vd0 + j vq0 */
  k1r = NaN; k1i = NaN; k2r = NaN; k2i = NaN;
  /** the constant particular solution (short-circuit current of the back-EMF) */
  xcd = NaN; xcq = NaN;
  /** |(k1, k2)|, A/V, and |x_c|, A: the sizes the rounding error scales with */
  gain = NaN;
  xcAbs = NaN;

  /** 1/Ld, 1/Lq, Lq/Ld, Ld/Lq */
  private readonly iLd: number;
  private readonly iLq: number;
  private readonly rqd: number;
  private readonly rdq: number;

  constructor(m: DqConstants) {
    this.Rs = m.Rs;
    this.Ld = m.Ld;
    this.Lq = m.Lq;
    this.psiM = m.psiM;
    this.iLd = 1 / m.Ld;
    this.iLq = 1 / m.Lq;
    this.rqd = m.Lq / m.Ld;
    this.rdq = m.Ld / m.Lq;
  }

  /** Precompute the step's matrices for electrical speed we (rad/s) and step dt (s). */
  setStep(we: number, dt: number): void {
    const Rs = this.Rs, Ld = this.Ld, Lq = this.Lq;
    this.we = we;
    this.dt = dt;
    const a = -Rs * this.iLd, d = -Rs * this.iLq, b = we * this.rqd, c = -we * this.rdq;
    const m = 0.5 * (a + d), q = 0.5 * (a - d);
    const disc = q * q - we * we; // ((a - d)/2)^2 + b c, with b c = -we^2 exactly
    const y = disc * dt * dt; // (delta dt)^2, signed
    let EC: number, ES: number;
    if (y > 0.25) {
      // overdamped with a wide gap: the two real exponentials (no overflow of cosh times a small e^{m dt})
      const del = Math.sqrt(disc);
      const e1 = Math.exp((m + del) * dt), e2 = Math.exp((m - del) * dt);
      EC = 0.5 * (e1 + e2);
      ES = (0.5 * (e1 - e2)) / del;
    } else if (y < -0.25) {
      const del = Math.sqrt(-disc);
      const x = del * dt;
      const E = Math.exp(m * dt);
      EC = E * Math.cos(x);
      ES = (E * Math.sin(x)) / del;
    } else {
      // |delta dt| <= 0.5, either branch (and the repeated eigenvalue between them) by the series
      const E = Math.exp(m * dt);
      if (y >= 0) {
        EC = E * coshSL(y);
        ES = E * dt * sinhcSL(y);
      } else {
        EC = E * cosSL(-y);
        ES = E * dt * sincSL(-y);
      }
    }
    this.p11 = EC + ES * q;
    this.p12 = ES * b;
    this.p21 = ES * c;
    this.p22 = EC - ES * q;
    const wt = we * dt;
    if (wt > -0.5 && wt < 0.5) {
      const y2 = wt * wt;
      this.cw = cosSL(y2);
      this.sw = wt * sincSL(y2);
    } else {
      this.cw = Math.cos(wt);
      this.sw = Math.sin(wt);
    }
    // X = -(A + j we I)^-1 B V in closed form: with S = Ld + Lq, N = Rs^2 + we^2 S^2,
    // k1 = (Rs^2 + 2 we^2 Lq S)/(Rs N) + j we (Ld - Lq)/N,  k2 = we (Lq - Ld)/N - j (Rs^2 + 2 we^2 Ld S)/(Rs N)
    const S = Ld + Lq;
    const w2 = we * we;
    const iN = 1 / (Rs * Rs + w2 * S * S);
    const iRN = iN / Rs;
    this.k1r = (Rs * Rs + 2 * w2 * Lq * S) * iRN;
    this.k1i = we * (Ld - Lq) * iN;
    this.k2r = we * (Lq - Ld) * iN;
    this.k2i = -(Rs * Rs + 2 * w2 * Ld * S) * iRN;
    this.gain = Math.sqrt(this.k1r * this.k1r + this.k1i * this.k1i + this.k2r * this.k2r + this.k2i * this.k2i);
    // x_c = -A^-1 c = (-we^2 psiM Lq, -Rs we psiM) / (Rs^2 + we^2 Ld Lq); zero at we = 0 (no back-EMF)
    const den = Rs * Rs + w2 * Ld * Lq;
    if (we === 0 || !(den > 0)) {
      this.xcd = 0;
      this.xcq = 0;
    } else {
      const f = (we * this.psiM) / den;
      this.xcd = -we * Lq * f;
      this.xcq = -Rs * f;
    }
    this.xcAbs = Math.sqrt(this.xcd * this.xcd + this.xcq * this.xcq);
  }

  /**
   * The current at the end of the step from (id0, iq0) under the dq voltage (vd0, vq0) at the step's
   * start (held in the stationary frame, so rotating by -we t in dq) into out[o], out[o + 1].
   */
  propagate(id0: number, iq0: number, vd0: number, vq0: number, out: Float64Array, o: number): void {
    const x1r = vd0 * this.k1r - vq0 * this.k1i, x1i = vd0 * this.k1i + vq0 * this.k1r;
    const x2r = vd0 * this.k2r - vq0 * this.k2i, x2i = vd0 * this.k2i + vq0 * this.k2r;
    const zd = id0 - x1r - this.xcd, zq = iq0 - x2r - this.xcq;
    const cw = this.cw, sw = this.sw;
    out[o] = this.p11 * zd + this.p12 * zq + this.xcd + x1r * cw + x1i * sw;
    out[o + 1] = this.p21 * zd + this.p22 * zq + this.xcq + x2r * cw + x2i * sw;
  }

  /**
   * Bound on the rounding error of `propagate`'s end current, A: 8 eps (|x0| + |X| + |x_c|), where
   * |X| = gain |V| is the rotating particular solution the homogeneous part cancels. Infinite (or
   * NaN) when Rs = 0: the closed form does not apply and the caller integrates otherwise.
   */
  errorBound(id0: number, iq0: number, vd0: number, vq0: number): number {
    const e = 8 * EPS * (Math.sqrt(id0 * id0 + iq0 * iq0) + this.gain * Math.sqrt(vd0 * vd0 + vq0 * vq0) + this.xcAbs);
    return e === e ? e : Infinity;
  }
}
