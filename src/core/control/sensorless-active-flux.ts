/**
 * The active-flux observer: the stator flux from the voltage model, corrected towards the current
 * model in the estimated rotor frame by a PI, and the active flux psi_a = psi_s - Lq i, which lies
 * on the rotor's d axis for a salient (IPM) and a non-salient (SPM) machine alike:
 *
 *   psi_a,dq = (psiM + (Ld - Lq) id, 0)
 *
 * (Boldea, Paicu and Andreescu (2008), Active flux concept for motion-sensorless unified AC drives,
 * IEEE Trans. Power Electronics 23(5), from memory; the voltage model with a PI compensation from
 * the current model as in Andreescu, Pitic, Blaabjerg and Boldea (2008), IEEE Trans. Energy
 * Conversion 23(2), from memory). Stationary frame, complex notation x = x_alpha + j x_beta:
 *
 *   d psi/dt = v - Rs i + K(s) (psi_i - psi),   K(s) = kp + ki / s,
 *   psi_i = e^{j thetaHat} (Ld id + psiM + j Lq iq),   (id, iq) = e^{-j thetaHat} i
 *
 * Above the correction's crossover the voltage model rules (no rotor parameter but Rs); below it the
 * current model (which needs the angle and the rotor parameters). With ki = kp^2 / 4 the correction
 * loop has a double pole at kp / 2 (critically damped, common practice).
 *
 * Discretisation at Ts (the delay handling): v is the voltage vector the inverter held in the
 * stationary frame over the period that ends at this sample (for a controller with a delay line, the
 * command it computed delaySamples + 1 samples ago: what it put out for this period), so its
 * integral is exactly Ts v; the resistive drop by the trapezoid of the currents at both ends. The
 * correction then uses the current model at this sample (semi-implicit). The first update after a
 * reset is taken at the reset's instant and integrates nothing.
 *
 *   psiPred = psi[k-1] + Ts (v - Rs (i[k-1] + i[k]) / 2)
 *   e = psi_i[k] - psiPred,   z += ki Ts e,   psi[k] = psiPred + Ts (kp e + z)
 *
 * With the flux error x = psi - psi_true and the current model's error d = psi_i - psi_true this is
 * X = W(z) D, W(z) = C / (1 - z^-1 + C z^-1), C = Ts (kp + ki Ts / (1 - z^-1)) (see `correctionWeight`).
 */

/** The observer's model terms (its own parameters, possibly mismatched from the plant's). */
export interface ObserverTerms {
  Rs: number;
  Ld: number;
  Lq: number;
  psiM: number;
}

/** Stator and active flux estimates in the stationary frame; no allocation per update. */
export class ActiveFluxObserver {
  /** stator flux estimate, Wb */
  psiA = 0.5;
  psiB = 0.5;
  /** active flux psi - Lq i, Wb */
  faA = 0.5;
  faB = 0.5;
  /** the correction PI's integrator, V */
  private zA = 0.5;
  private zB = 0.5;
  private iaPrev = 0.5;
  private ibPrev = 0.5;
  /** the first update after `reset` is at the reset's instant: it integrates nothing (the period before belongs to the start state) */
  private started = false;
  readonly Rs: number;
  readonly Ld: number;
  readonly Lq: number;
  readonly psiM: number;

  constructor(terms: ObserverTerms, readonly kp: number, readonly ki: number) {
    if (!(terms.Ld > 0) || !(terms.Lq > 0) || !(terms.psiM >= 0) || !(terms.Rs >= 0)) {
      throw new RangeError(`observer terms must be Ld, Lq > 0, psiM, Rs >= 0 (got ${JSON.stringify(terms)})`);
    }
    if (!(kp >= 0) || !(ki >= 0)) throw new RangeError(`correction gains must be >= 0 (kp ${kp}, ki ${ki})`);
    this.Rs = terms.Rs;
    this.Ld = terms.Ld;
    this.Lq = terms.Lq;
    this.psiM = terms.psiM;
    // the double fields are declared with a non-integer value so that the engine stores them as
    // doubles from the start (no boxed number per store in the hot path); the real start is set here
    this.psiA = this.psiB = this.faA = this.faB = this.zA = this.zB = this.iaPrev = this.ibPrev = 0;
  }

  /** Start from the current model at angle theta with currents (ia, ib) (a locked start). */
  reset(theta: number, ia: number, ib: number): void {
    const c = Math.cos(theta), s = Math.sin(theta);
    const id = c * ia + s * ib, iq = -s * ia + c * ib;
    const pd = this.Ld * id + this.psiM, pq = this.Lq * iq;
    this.psiA = c * pd - s * pq;
    this.psiB = s * pd + c * pq;
    this.zA = 0;
    this.zB = 0;
    this.iaPrev = ia;
    this.ibPrev = ib;
    this.faA = this.psiA - this.Lq * ia;
    this.faB = this.psiB - this.Lq * ib;
    this.started = false;
  }

  /**
   * One period: currents (ia, ib) at this sample, voltage (va, vb) held over the period that ends
   * here, period Ts; (c, s) = (cos, sin) of the angle estimate at this sample (the current model's frame).
   */
  update(ia: number, ib: number, va: number, vb: number, Ts: number, c: number, s: number): void {
    if (!this.started) {
      // the sample at the start's instant: the state is the start state
      this.started = true;
      this.iaPrev = ia;
      this.ibPrev = ib;
      this.faA = this.psiA - this.Lq * ia;
      this.faB = this.psiB - this.Lq * ib;
      return;
    }
    const R = this.Rs;
    const pA = this.psiA + Ts * (va - 0.5 * R * (this.iaPrev + ia));
    const pB = this.psiB + Ts * (vb - 0.5 * R * (this.ibPrev + ib));
    // the current model in the estimated rotor frame
    const id = c * ia + s * ib;
    const iq = -s * ia + c * ib;
    const pd = this.Ld * id + this.psiM;
    const pq = this.Lq * iq;
    const eA = c * pd - s * pq - pA;
    const eB = s * pd + c * pq - pB;
    const kiTs = this.ki * Ts;
    this.zA += kiTs * eA;
    this.zB += kiTs * eB;
    const kp = this.kp;
    this.psiA = pA + Ts * (kp * eA + this.zA);
    this.psiB = pB + Ts * (kp * eB + this.zB);
    this.iaPrev = ia;
    this.ibPrev = ib;
    this.faA = this.psiA - this.Lq * ia;
    this.faB = this.psiB - this.Lq * ib;
  }
}

/**
 * The weight W of the current model in the steady flux estimate at electrical speed we (rad/s):
 * psi - psi_true = W (psi_i - psi_true) for signals rotating at we, from the discrete loop above,
 * W = C / (1 - z^-1 + C z^-1), z = e^{j we Ts}; into out[0] (real), out[1] (imaginary). As Ts -> 0
 * it tends to K(j we) / (j we + K(j we)), K = kp + ki / s. Not for hot loops (a few complex divisions).
 */
export function correctionWeight(kp: number, ki: number, we: number, Ts: number, out: Float64Array): void {
  // u = z^-1 = e^{-j we Ts}
  const ur = Math.cos(we * Ts), ui = -Math.sin(we * Ts);
  // 1 - u
  const ar = 1 - ur, ai = -ui;
  // ki Ts / (1 - u)   (1 - u = 0 only at we Ts = 0 mod 2 pi: the weight is then 1, the DC of the PI)
  const den = ar * ar + ai * ai;
  if (den === 0) { out[0] = 1; out[1] = 0; return; }
  const gr = (ki * Ts * ar) / den, gi = (-ki * Ts * ai) / den;
  const Cr = Ts * (kp + gr), Ci = Ts * gi;
  // denominator 1 - u + C u
  const dr = ar + (Cr * ur - Ci * ui), di = ai + (Cr * ui + Ci * ur);
  const dd = dr * dr + di * di;
  out[0] = (Cr * dr + Ci * di) / dd;
  out[1] = (Ci * dr - Cr * di) / dd;
}

/** The correction PI of crossover f Hz: kp = 2 pi f, ki = kp^2 / 4 (a double pole at kp / 2). */
export function correctionGains(correction_Hz: number): { kp: number; ki: number } {
  const kp = 2 * Math.PI * correction_Hz;
  return { kp, ki: (kp * kp) / 4 };
}

/** The default correction crossover: a tenth of the PLL's bandwidth (slower than the loop that reads it). */
export const defaultCorrection_Hz = (pllBandwidth_Hz: number): number => pllBandwidth_Hz / 10;
