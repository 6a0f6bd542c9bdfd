/**
 * A resolver read through a type II tracking loop (an AngleEstimator), on the demodulated envelopes
 * of its two channels (the excitation carrier is taken as removed by synchronous demodulation):
 *
 *   cosine channel  c = cos theta_r,   sine channel  s = (1 + eps) sin(theta_r + phi)
 *
 * theta_r = pr theta_m the resolver's electrical angle (pr its pole pairs), eps the amplitude
 * imbalance, phi the quadrature error. The loop's detector e = s cos thetaHat - c sin thetaHat is
 * sin(theta_r - thetaHat) for ideal channels; it drives the shared type II PLL (type2-pll.ts), with
 * kp = 2 zeta wn, ki = wn^2 and wn from the closed-loop -3 dB bandwidth and the damping. The detector
 * nulls at tan thetaHat = s / c: for small eps and phi the error thetaHat - theta_r is
 * phi/2 + (eps/2) sin 2 theta_r + (phi/2) cos 2 theta_r (a steady phi/2 and a second harmonic of
 * amplitude sqrt(eps^2 + phi^2)/2), passed by the loop as by its closed-loop response at 2 omega_r.
 *
 * The motor's electrical angle is (p / pr) thetaHat (p the motor's pole pairs, a multiple of pr),
 * its speed (p / pr) omegaHat. The loop's angle after the update of sample k is its prediction for
 * sample k + 1; the angle given for sample k takes one period's travel back, thetaHat - Ts omegaHat
 * (exact at constant speed once locked). The true electrical angle may arrive wrapped: it is unwrapped from one
 * sample to the next. No allocation per sample.
 */
import type { ResolverAngle } from './angle-spec';
import { wrapToPi, SampledAngleEstimator } from './angle-estimator';
import { Type2Pll, type2PllGains, type2PllNaturalFrequency } from './type2-pll';

export class ResolverEstimator extends SampledAngleEstimator {
  thetaE = 0;
  omegaE = 0;
  /** the tracking loop (resolver electrical angle and speed) */
  readonly pll: Type2Pll;
  /** the resolver's electrical angle, unwrapped, rad */
  thetaR = 0;
  /** the loop's estimate of the resolver's electrical angle at the sample's instant, rad in [-pi, pi] */
  thetaRHat = 0;

  // the numbers start as doubles (a field declared without a value starts undefined, and its loads
  // then check for a boxed number)
  private readonly ratio: number = NaN;
  private readonly gain: number = NaN;
  private readonly phi: number = NaN;
  private lastTheta = 0;
  /** no imbalance and no quadrature error: the detector is sin(theta_r - thetaHat) itself */
  private readonly ideal: boolean = false;
  /** the ratio is a power of two (1, 2, 4, ...), and its reciprocal */
  private readonly pow2: boolean = false;
  private readonly invRatio: number = NaN;

  constructor(spec: ResolverAngle, polePairs: number) {
    super();
    const pr = spec.polePairs ?? 1;
    this.ratio = polePairs / pr;
    const wn = type2PllNaturalFrequency(2 * Math.PI * spec.bandwidth_Hz, spec.damping);
    const { kp, ki } = type2PllGains(wn, spec.damping);
    this.pll = new Type2Pll(kp, ki);
    this.gain = 1 + (spec.amplitudeImbalance ?? 0);
    this.phi = ((spec.quadratureError_deg ?? 0) * Math.PI) / 180;
    this.ideal = this.gain === 1 && this.phi === 0;
    this.invRatio = 1 / this.ratio;
    this.pow2 = Number.isInteger(Math.log2(this.ratio));
  }

  reset(thetaE: number, omegaE: number): void {
    this.lastTheta = thetaE;
    this.thetaR = thetaE / this.ratio;
    this.pll.reset(this.thetaR, omegaE / this.ratio);
    this.publish();
  }

  /** One period from `input` (see SampledAngleEstimator): the true angle, Ts. */
  sampleFromInput(): void {
    const x = this.input;
    const trueThetaE = x[0]!, Ts = x[6]!;
    const d = wrapToPi(trueThetaE - this.lastTheta);
    // a ratio that is a power of two divides exactly as a product by its reciprocal (the same value)
    this.thetaR += this.pow2 ? d * this.invRatio : d / this.ratio;
    this.lastTheta = trueThetaE;
    const th = this.thetaR;
    const h = this.pll.theta;
    if (this.ideal) this.pll.update(Math.sin(th - h), Ts);
    else {
      const s = this.gain * Math.sin(th + this.phi);
      const c = Math.cos(th);
      this.pll.update(s * Math.cos(h) - c * Math.sin(h), Ts);
    }
    this.publish(Ts);
  }

  /** the loop's angle after an update is its prediction for the next sample: one period's travel taken back */
  private publish(Ts = 0): void {
    this.thetaRHat = wrapToPi(this.pll.theta - Ts * this.pll.omega);
    this.thetaE = wrapToPi(this.ratio * this.thetaRHat);
    this.omegaE = this.ratio * this.pll.omega;
  }
}
