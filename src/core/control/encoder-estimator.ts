/**
 * An incremental encoder read by a quadrature decoder, as the controller sees it (an AngleEstimator).
 *
 * - Count: four edges per line, so one count is D = 2 pi / (4 N) mechanical rad (N lines per
 *   revolution). The decoder's count is the index of the interval the shaft is in,
 *   c = floor((theta_m + offset) / D), in either direction of rotation; the angle given to the
 *   controller is c D mechanical, p c D electrical (wrapped). The mounting offset is an error the
 *   controller does not know: it shifts the reported angle by +offset.
 * - Speed by the difference method: omega_m = (c[k] - c[k-W]) D / (W Ts) over a window of W control
 *   periods; its resolution is one count per window, D / (W Ts) rad/s = 60 / (4 N W Ts) rpm.
 * - Speed by edge timing (a timer of frequency fT stamps each edge, the M/T method): the counts of the
 *   window over the time between the last edge seen at its start and the last edge seen at its end,
 *   both stamped in whole timer ticks. A window without an edge gives at most one count over the time
 *   since the last edge (the speed can be no higher), with the sign of the previous estimate. The
 *   edge instants between samples are found from the true speed at the sample (constant over the
 *   last count's travel).
 * - An optional first-order filter on the speed, exact for a held input:
 *   y[k] = y[k-1] + (1 - e^{-2 pi fc Ts}) (x[k] - y[k-1]).
 *
 * The true electrical angle may arrive wrapped: it is unwrapped from one sample to the next (the
 * electrical frequency below half the control rate). No allocation per sample.
 */
import type { EncoderAngle } from './angle-spec';
import { wrapToPi, SampledAngleEstimator } from './angle-estimator';

const TWO_PI = 2 * Math.PI;

export class EncoderEstimator extends SampledAngleEstimator {
  thetaE = 0;
  omegaE = 0;
  /** the count of the decoder (the interval index), before any wrap */
  count = 0;
  /** the speed before the filter, mechanical rad/s */
  omegaRawM = 0;

  // the numbers start as numbers (a field declared without a value starts undefined, and its loads
  // then check for a boxed number)
  private readonly delta: number = NaN;
  private readonly offset: number = NaN;
  private readonly window: number = 0;
  private readonly timerHz: number = NaN;
  private readonly filterHz: number = NaN;
  private readonly polePairs: number = 0;
  private readonly counts: Float64Array;
  private readonly edgeTicks: Float64Array;
  private head = 0;
  private k = 0;
  private primed = false;
  private thetaUnwrapped = 0;
  private lastTheta = 0;
  private omegaFiltM = 0;
  private resetOmegaM = 0;
  private filterGain = 1;
  private filterTs = -1;

  constructor(spec: EncoderAngle, polePairs: number) {
    super();
    this.polePairs = polePairs;
    this.delta = TWO_PI / (4 * spec.linesPerRev);
    this.offset = (spec.offset_deg * Math.PI) / 180;
    this.window = spec.speedWindowPeriods;
    this.timerHz = spec.timerFrequency_Hz ?? 0;
    this.filterHz = spec.speedFilter_Hz;
    this.counts = new Float64Array(this.window + 1);
    this.edgeTicks = new Float64Array(this.window + 1);
  }

  reset(thetaE: number, omegaE: number): void {
    this.thetaUnwrapped = thetaE;
    this.lastTheta = thetaE;
    this.resetOmegaM = omegaE / this.polePairs;
    this.omegaFiltM = this.resetOmegaM;
    this.omegaRawM = this.resetOmegaM;
    this.k = 0;
    this.head = 0;
    this.primed = false;
    this.publish();
  }

  /** count and the timer tick of the last edge crossed, for a mechanical angle and speed at time t */
  private countAt(thetaM: number): number {
    return Math.floor((thetaM + this.offset) / this.delta);
  }

  private edgeTick(thetaM: number, c: number, omegaM: number, t: number): number {
    // time since the last edge crossed: going up it was at c D, going down at (c + 1) D
    const x = thetaM + this.offset;
    const since = omegaM > 0 ? (x - c * this.delta) / omegaM : omegaM < 0 ? ((c + 1) * this.delta - x) / -omegaM : Infinity;
    return Math.floor((t - since) * this.timerHz);
  }

  /** One period from `input` (see SampledAngleEstimator): the true angle and speed, Ts. */
  sampleFromInput(): void {
    const x = this.input;
    const trueThetaE = x[0]!, trueOmegaM = x[1]!, Ts = x[6]!;
    this.thetaUnwrapped += wrapToPi(trueThetaE - this.lastTheta);
    this.lastTheta = trueThetaE;
    const thetaM = this.thetaUnwrapped / this.polePairs;
    const W = this.window;
    const n = W + 1;
    if (!this.primed) {
      // the past window as a run at the reset speed
      const w0 = this.resetOmegaM;
      for (let j = 0; j < n; j++) {
        const back = W - j; // periods before now
        const th = thetaM - back * Ts * w0;
        const c = this.countAt(th);
        this.counts[j] = c;
        this.edgeTicks[j] = this.timerHz > 0 ? this.edgeTick(th, c, w0, -back * Ts) : 0;
      }
      this.head = W; // index of the newest entry
      this.k = 0;
      this.primed = true;
      if (this.filterTs !== Ts) {
        this.filterTs = Ts;
        this.filterGain = this.filterHz > 0 ? -Math.expm1(-TWO_PI * this.filterHz * Ts) : 1;
      }
    } else {
      this.k++;
      this.head = this.head === W ? 0 : this.head + 1;
      const c = this.countAt(thetaM);
      this.counts[this.head] = c;
      if (this.timerHz > 0) {
        const prev = this.head === 0 ? W : this.head - 1;
        // the stamp of the last edge changes only when the count does
        this.edgeTicks[this.head] = c !== this.counts[prev] ? this.edgeTick(thetaM, c, trueOmegaM, this.k * Ts) : this.edgeTicks[prev]!;
      }
    }
    const h = this.head;
    const oldest = h === W ? 0 : h + 1;
    const dc = this.counts[h]! - this.counts[oldest]!;
    if (this.timerHz <= 0) {
      this.omegaRawM = (dc * this.delta) / (W * Ts);
    } else if (dc !== 0) {
      this.omegaRawM = (dc * this.delta * this.timerHz) / Math.max(1, this.edgeTicks[h]! - this.edgeTicks[oldest]!);
    } else {
      const since = this.k * Ts - this.edgeTicks[h]! / this.timerHz;
      const bound = this.delta / Math.max(since, 1 / this.timerHz);
      const a = Math.abs(this.omegaRawM);
      this.omegaRawM = (this.omegaRawM < 0 ? -1 : 1) * (a < bound ? a : bound);
    }
    this.omegaFiltM += this.filterGain * (this.omegaRawM - this.omegaFiltM);
    this.count = this.counts[h]!;
    this.publish();
  }

  private publish(): void {
    // before the first sample: the angle it was reset to
    this.thetaE = this.primed ? wrapToPi(this.polePairs * this.count * this.delta) : wrapToPi(this.thetaUnwrapped);
    this.omegaE = this.polePairs * this.omegaFiltM;
  }
}
