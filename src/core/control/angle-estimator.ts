/**
 * The common shape of everything that tells the controller the rotor's electrical angle and speed
 * (encoder, resolver, sensorless observer; see angle-spec.ts). An estimator is sampled once per
 * control period, between the plant's state and the controller's sample, with the true values (a
 * sensor reads them through its imperfections; an observer ignores them) and the measured currents
 * and the voltages commanded for the period that ends (alpha-beta, stator frame). It writes its
 * outputs into its own fields: no allocation per sample.
 *
 * Units: angles in electrical radians, wrapped to [-pi, pi]; speeds in electrical rad/s.
 */
export interface AngleEstimator {
  /** start locked onto a known state (a run that starts at speed starts locked) */
  reset(thetaE: number, omegaE: number): void;
  /**
   * One control period. trueThetaE: the plant's electrical angle (rad); trueOmegaM: its mechanical
   * speed (rad/s); i_alpha, i_beta: measured currents (A); v_alpha, v_beta: the voltages commanded
   * over the period (V); Ts: the control period (s).
   */
  sample(trueThetaE: number, trueOmegaM: number, i_alpha: number, i_beta: number, v_alpha: number, v_beta: number, Ts: number): void;
  /** the estimated electrical angle, rad, in [-pi, pi] */
  readonly thetaE: number;
  /** the estimated electrical speed, rad/s */
  readonly omegaE: number;
}

/**
 * The estimators' common entry: `sample(...)` writes its arguments into `input` and runs
 * `sampleFromInput()`, which a hot loop calls directly after writing `input` itself, so that no
 * double crosses a call that the engine may not inline (such a double is boxed on the heap).
 */
export abstract class SampledAngleEstimator implements AngleEstimator {
  abstract readonly thetaE: number;
  abstract readonly omegaE: number;
  /** the inputs of one period: [trueThetaE, trueOmegaM, i_alpha, i_beta, v_alpha, v_beta, Ts] */
  readonly input = new Float64Array(7);
  abstract reset(thetaE: number, omegaE: number): void;
  /** `sample` with its inputs already written into `input` */
  abstract sampleFromInput(): void;
  sample(trueThetaE: number, trueOmegaM: number, i_alpha: number, i_beta: number, v_alpha: number, v_beta: number, Ts: number): void {
    const x = this.input;
    x[0] = trueThetaE; x[1] = trueOmegaM; x[2] = i_alpha; x[3] = i_beta; x[4] = v_alpha; x[5] = v_beta; x[6] = Ts;
    this.sampleFromInput();
  }
}

const TWO_PI = 2 * Math.PI;

/**
 * An angle wrapped to [-pi, pi] (x - 2 pi round(x / 2 pi)). Where the rounding's result is plain
 * without the division (|x| < 3.14: 0; 3.15 < |x| < 9.42: +-1; 9.43 < |x| < 15.70: +-2) the same
 * value is computed without it (2 pi times 2 is exact).
 */
export function wrapToPi(x: number): number {
  if (x > -3.14 && x < 3.14) return x;
  if (x > 3.15 && x < 9.42) return x - TWO_PI;
  if (x < -3.15 && x > -9.42) return x + TWO_PI;
  if (x > 9.43 && x < 15.7) return x - 2 * TWO_PI;
  if (x < -9.43 && x > -15.7) return x + 2 * TWO_PI;
  return x - TWO_PI * Math.round(x / TWO_PI);
}
