/**
 * The angle estimator's loop in the tuning (control.angle, angle-spec.ts), and the speed loop seen
 * through it.
 *
 * Type II loop (resolver tracking loop, sensorless PLL; type2-pll.ts): L(s) = (kp s + ki)/s^2 with
 * kp = 2 zeta wn, ki = wn^2 (Gardner, 2005, Phaselock Techniques, 3rd ed., ch. 2). Closed forms:
 *  - crossover |L(j wc)| = 1: wc^2 = (kp^2 + sqrt(kp^4 + 4 ki^2))/2;
 *  - phase margin: arg L = -180 deg + atan(kp w / ki), so PM = atan(kp wc / ki);
 *  - the -3 dB bandwidth of thetaHat/theta: wb = wn sqrt(1 + 2 zeta^2 + sqrt((1 + 2 zeta^2)^2 + 1));
 *  - the speed estimate (the integrator) follows the true speed through ki/(s^2 + kp s + ki).
 * The resolver's loop takes the stated damping, the sensorless PLL zeta = 1 (critically damped).
 *
 * Encoder, difference of counts over a window of N control periods: the estimate is
 * (theta(t) - theta(t - N Ts))/(N Ts), whose response to the speed is
 * (1 - e^{-s N Ts})/(s N Ts) = e^{-j w N Ts/2} sin(w N Ts/2)/(w N Ts/2) (the mean over the window),
 * times the optional first-order filter 1/(1 + s/wf). An edge-timing estimate (timerFrequency_Hz)
 * is taken with the same window (its lag depends on speed; common practice, no source).
 *
 * The speed loop through the estimator: the sampled open loop of the tuning (tuning.ts,
 * sampled-loop.ts) times the estimator's speed response above, evaluated at the Bode frequencies
 * (continuous forms, accurate well below the control rate's Nyquist frequency); crossover and phase
 * margin from that product by interpolation in log frequency.
 *
 * Finding (common practice, no source): the speed loop's closed-loop bandwidth above
 * ESTIMATOR_BANDWIDTH_FACTOR (1/3) of the estimator's speed-estimate bandwidth.
 */
import type { Finding } from '../base/finding';
import type { AngleSpec } from './angle-spec';
import type { Bode, LoopReport } from './tuning';
import { type2PllGains, type2PllNaturalFrequency } from './type2-pll';

export const ESTIMATOR_BANDWIDTH_FACTOR = 1 / 3;

export interface EstimatorLoopReport {
  source: 'encoder' | 'resolver' | 'sensorless';
  /** type II loop: gains (kp 1/s, ki 1/s^2), natural frequency rad/s, damping; null for an encoder */
  kp: number | null;
  ki: number | null;
  naturalFrequency_rad_s: number | null;
  damping: number | null;
  /** type II loop: open-loop crossover, Hz, and phase margin, deg (closed forms); null for an encoder */
  crossover_Hz: number | null;
  phaseMargin_deg: number | null;
  /** -3 dB bandwidth of the angle estimate (type II loop; null for an encoder), Hz */
  angleBandwidth_Hz: number | null;
  /** -3 dB bandwidth of the speed estimate against the true speed, Hz */
  speedBandwidth_Hz: number;
  /** the speed loop's open loop through the estimator: crossover, Hz, phase margin, deg, Bode */
  speedLoop: { crossover_Hz: number | null; phaseMargin_deg: number | null; bode: Bode };
}

/** crossover (rad/s) and phase margin (deg) of L = (kp s + ki)/s^2, closed forms */
export function type2Margins(kp: number, ki: number): { crossover_rad_s: number; phaseMargin_deg: number } {
  const wc = Math.sqrt((kp * kp + Math.sqrt(kp ** 4 + 4 * ki * ki)) / 2);
  return { crossover_rad_s: wc, phaseMargin_deg: (Math.atan((kp * wc) / ki) * 180) / Math.PI };
}

/** The estimator's speed response at w (rad/s): magnitude and phase (rad). */
function speedResponse(spec: Exclude<AngleSpec, { source: 'ideal' }>, Ts: number, kp: number, ki: number, w: number): { mag: number; phase: number } {
  if (spec.source === 'encoder') {
    const h = (w * spec.speedWindowPeriods * Ts) / 2;
    let mag = h > 0 ? Math.abs(Math.sin(h) / h) : 1;
    let phase = -h;
    if (spec.speedFilter_Hz > 0) {
      const r = w / (2 * Math.PI * spec.speedFilter_Hz);
      mag /= Math.sqrt(1 + r * r);
      phase -= Math.atan(r);
    }
    return { mag, phase };
  }
  // ki / (ki - w^2 + j kp w)
  const re = ki - w * w, im = kp * w;
  return { mag: ki / Math.hypot(re, im), phase: -Math.atan2(im, re) };
}

/** The -3 dB frequency (rad/s) of a magnitude falling from 1, by bisection on log w. */
function minus3dB(mag: (w: number) => number, wHi: number): number {
  let lo = 1e-3, hi = wHi;
  if (mag(hi) > Math.SQRT1_2) return hi;
  for (let i = 0; i < 200; i++) {
    const mid = Math.sqrt(lo * hi);
    if (mag(mid) > Math.SQRT1_2) lo = mid; else hi = mid;
  }
  return Math.sqrt(lo * hi);
}

/** First 0 dB crossing (downwards) of a Bode, interpolated in log f; its phase margin. */
export function bodeMargins(b: Bode): { crossover_Hz: number | null; phaseMargin_deg: number | null } {
  for (let i = 1; i < b.f_Hz.length; i++) {
    const m0 = b.mag_dB[i - 1]!, m1 = b.mag_dB[i]!;
    if (m0 >= 0 && m1 < 0) {
      const u = m0 / (m0 - m1);
      const f = Math.exp(Math.log(b.f_Hz[i - 1]!) + u * (Math.log(b.f_Hz[i]!) - Math.log(b.f_Hz[i - 1]!)));
      const ph = b.phase_deg[i - 1]! + u * (b.phase_deg[i]! - b.phase_deg[i - 1]!);
      return { crossover_Hz: f, phaseMargin_deg: 180 + ph };
    }
  }
  return { crossover_Hz: null, phaseMargin_deg: null };
}

/**
 * The estimator's loop for an angle source at control period Ts, and the speed loop (its sampled
 * report) through it; null for the true angle.
 */
export function estimatorLoop(spec: AngleSpec, Ts: number, speed: LoopReport): { report: EstimatorLoopReport; finding: Finding | null } | null {
  if (spec.source === 'ideal') return null;
  let kp = 0, ki = 0, wn: number | null = null, zeta: number | null = null;
  let wc: number | null = null, pm: number | null = null, angleBw: number | null = null;
  if (spec.source !== 'encoder') {
    zeta = spec.source === 'resolver' ? spec.damping : 1;
    angleBw = spec.bandwidth_Hz;
    wn = type2PllNaturalFrequency(2 * Math.PI * spec.bandwidth_Hz, zeta);
    ({ kp, ki } = type2PllGains(wn, zeta));
    const m = type2Margins(kp, ki);
    wc = m.crossover_rad_s / (2 * Math.PI);
    pm = m.phaseMargin_deg;
  }
  const wMax = Math.PI / Ts;
  const speedBw = minus3dB((w) => speedResponse(spec, Ts, kp, ki, w).mag, wMax) / (2 * Math.PI);
  const f = speed.bode.f_Hz;
  const bode: Bode = { f_Hz: [...f], mag_dB: [], phase_deg: [] };
  for (let i = 0; i < f.length; i++) {
    const r = speedResponse(spec, Ts, kp, ki, 2 * Math.PI * f[i]!);
    bode.mag_dB.push(speed.bode.mag_dB[i]! + 20 * Math.log10(r.mag));
    bode.phase_deg.push(speed.bode.phase_deg[i]! + (r.phase * 180) / Math.PI);
  }
  const report: EstimatorLoopReport = {
    source: spec.source,
    kp: wn === null ? null : kp,
    ki: wn === null ? null : ki,
    naturalFrequency_rad_s: wn,
    damping: zeta,
    crossover_Hz: wc,
    phaseMargin_deg: pm,
    angleBandwidth_Hz: angleBw,
    speedBandwidth_Hz: speedBw,
    speedLoop: { ...bodeMargins(bode), bode },
  };
  const sb = speed.bandwidth_Hz;
  const finding: Finding | null = sb !== null && sb > ESTIMATOR_BANDWIDTH_FACTOR * speedBw
    ? {
        code: 'speed-loop-near-estimator', severity: 'warning', field: 'control.angle',
        message: `the speed loop's bandwidth ${sb.toPrecision(3)} Hz is above a third of the ${spec.source} speed estimate's ${speedBw.toPrecision(3)} Hz: ` +
          `its lag costs the speed loop phase (margin ${report.speedLoop.phaseMargin_deg === null ? 'not found' : `${report.speedLoop.phaseMargin_deg.toFixed(1)} deg`} through the estimator, ${speed.phaseMargin_deg === null ? '-' : speed.phaseMargin_deg.toFixed(1)} deg without); widen the estimator or slow the speed loop`,
      }
    : null;
  return { report, finding };
}
