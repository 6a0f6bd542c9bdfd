/**
 * The switching model's result (switching-result.ts) from a run's capture (switching-capture.ts),
 * by the output functions of the ripple (current-ripple.ts), the harmonics (../mathematics/
 * harmonics.ts), the voltage error (dead-time-error.ts) and the DC-link current (dc-link-current.ts).
 *
 * The analysed span: the last whole fundamental periods (at most ANALYSIS_CYCLES) the ring holds
 * with the rotor turning one way, counted in electrical angle back from the run's end. The ripple's
 * statistics and envelope and the DC-link current take the carrier periods starting in it. The
 * harmonics take phase a's current at the carrier's valleys and the legs' per-period voltage
 * errors resampled, by linear interpolation, on SAMPLES_PER_CYCLE equal steps of the electrical
 * angle per fundamental period (so that the span holds whole periods exactly even while the speed
 * drifts; order analysis, common practice, no source); the harmonics up to
 * min(MAX_HARMONIC, the valley sampling's Nyquist order less one). Without a whole fundamental
 * period (standstill, a short run) the ripple and the DC-link current take every recorded period and
 * the harmonic figures are NaN.
 *
 * The window: the project's, as captured; by default the last two fundamental periods at the final
 * speed the default ring holds (fewer when it holds less).
 */
import type { PwmSpec } from '../drive/pwm-spec';
import type { SwitchingCapture } from './switching-capture';
import type { SwitchingResult } from './switching-result';
import { rippleEnvelope } from './current-ripple';
import { harmonicAmplitude } from '../mathematics/harmonics';
import { deadTimeVoltageError } from './dead-time-error';
import { dcLinkCurrent } from './dc-link-current';

const TWO_PI = 2 * Math.PI;
/** largest number of whole fundamental periods analysed */
export const ANALYSIS_CYCLES = 4;
/** resampled points per fundamental period */
export const SAMPLES_PER_CYCLE = 128;
/** highest harmonic of the THD (IEC 61000-3-12 counts to the 40th) */
export const MAX_HARMONIC = 40;
/** bins of the ripple's envelope over the fundamental (5° each) */
export const ENVELOPE_BINS = 72;

/** Linear interpolation of (x[k], v[k]) at X, x monotone in the direction `dir`, from the hint index; the index reached. */
function interp(x: Float64Array, v: Float64Array, n: number, X: number, dir: number, k: number, out: Float64Array): number {
  while (k < n - 2 && dir * (x[k + 1]! - X) < 0) k++;
  const x0 = x[k]!, x1 = x[k + 1]!;
  const f = x1 !== x0 ? (X - x0) / (x1 - x0) : 0;
  const fc = f < 0 ? 0 : f > 1 ? 1 : f;
  out[0] = v[k]! + fc * (v[k + 1]! - v[k]!);
  return k;
}

export function switchingSummary(cap: SwitchingCapture, spec: PwmSpec): SwitchingResult {
  const idx = cap.order();
  const n = idx.length;
  // the records oldest first, with the end point appended to the start samples
  const t = new Float64Array(n + 1), th = new Float64Array(n + 1), ia = new Float64Array(n + 1);
  for (let i = 0; i < n; i++) { const j = idx[i]!; t[i] = cap.t[j]!; th[i] = cap.theta[j]!; ia[i] = cap.ia[j]!; }
  t[n] = cap.tEnd; th[n] = cap.thetaEnd; ia[n] = cap.iaEnd;
  const dir = n > 0 && cap.thetaEnd > th[n - 1]! ? 1 : n > 0 && cap.thetaEnd < th[n - 1]! ? -1 : 0;
  // the longest stretch back from the end with the rotor turning one way
  let j0 = n;
  if (dir !== 0) while (j0 > 0 && dir * (th[j0]! - th[j0 - 1]!) > 0 && dir * (th[n]! - th[j0 - 1]!) <= ANALYSIS_CYCLES * TWO_PI + 1e-9) j0--;
  const total = dir * (th[n]! - th[j0]!);
  const cycles = dir === 0 || n === 0 ? 0 : Math.min(ANALYSIS_CYCLES, Math.floor(total / TWO_PI + 1e-9));
  const thStart = th[n]! - dir * cycles * TWO_PI;
  // the periods analysed: those starting in the span (every recorded period without a whole one)
  let ja = 0;
  if (cycles > 0) { ja = j0; while (ja < n && dir * (th[ja]! - thStart) < -1e-12) ja++; }
  const m = n - ja;
  let pMax = 0, pSum = 0, iSum = 0, i2Sum = 0, sSum = 0;
  const angle = new Float64Array(m), p2p = new Float64Array(m);
  for (let i = ja; i < n; i++) {
    const j = idx[i]!;
    const r = cap.p2p[j]!;
    if (r > pMax) pMax = r;
    pSum += r;
    iSum += cap.idc[j]!; i2Sum += cap.idc2[j]!; sSum += cap.span[j]!;
    angle[i - ja] = th[i]!;
    p2p[i - ja] = r;
  }
  const env = rippleEnvelope(angle, p2p, m, ENVELOPE_BINS);
  const envAngle = new Float64Array(ENVELOPE_BINS);
  for (let b = 0; b < ENVELOPE_BINS; b++) envAngle[b] = ((b + 0.5) * TWO_PI) / ENVELOPE_BINS;
  const dc = sSum > 0 ? dcLinkCurrent(iSum, i2Sum, sSum) : { mean_A: NaN, rms_A: NaN, rippleRms_A: NaN };

  // the harmonic figures on the resampled angle grid
  let thdV = NaN, dtErr = NaN, H = 0;
  let harmonics = new Float64Array(0);
  let from = n > 0 ? t[ja]! : NaN;
  const one = new Float64Array(1);
  if (cycles > 0) {
    const valleysPerCycle = (n - j0) / (total / TWO_PI);
    H = Math.min(MAX_HARMONIC, Math.floor(valleysPerCycle / 2) - 1, SAMPLES_PER_CYCLE / 2 - 1);
    const N = cycles * SAMPLES_PER_CYCLE;
    const x = new Float64Array(N), ea = new Float64Array(N), eb = new Float64Array(N), ec = new Float64Array(N);
    // the per-period voltage errors at their periods' middle angles
    const mid = new Float64Array(n - j0), va = new Float64Array(n - j0), vb = new Float64Array(n - j0), vc = new Float64Array(n - j0);
    for (let i = j0; i < n; i++) { const j = idx[i]!; mid[i - j0] = 0.5 * (th[i]! + th[i + 1]!); va[i - j0] = cap.ea[j]!; vb[i - j0] = cap.eb[j]!; vc[i - j0] = cap.ec[j]!; }
    const thS = th.subarray(j0), iaS = ia.subarray(j0), tS = t.subarray(j0);
    let k1 = 0, k2 = 0, k3 = 0, k4 = 0;
    for (let k = 0; k < N; k++) {
      const X = thStart + (dir * k * TWO_PI) / SAMPLES_PER_CYCLE;
      k1 = interp(thS, iaS, n + 1 - j0, X, dir, k1, one); x[k] = one[0]!;
      k2 = interp(mid, va, n - j0, X, dir, k2, one); ea[k] = one[0]!;
      k3 = interp(mid, vb, n - j0, X, dir, k3, one); eb[k] = one[0]!;
      k4 = interp(mid, vc, n - j0, X, dir, k4, one); ec[k] = one[0]!;
    }
    interp(thS, tS, n + 1 - j0, thStart, dir, 0, one);
    from = one[0]!;
    harmonics = new Float64Array(Math.max(0, H) + 1);
    let mean = 0;
    for (let k = 0; k < N; k++) mean += x[k]!;
    harmonics[0] = Math.abs(mean / N);
    for (let h = 1; h <= H; h++) harmonics[h] = harmonicAmplitude(x, N, cycles, h);
    // thd(x, N, cycles, H) of ../mathematics/harmonics.ts on the amplitudes just computed (the same
    // values summed in the same order; H * cycles < N / 2 by the choice of H): each DFT once, not twice
    if (H >= 2) {
      let s = 0;
      for (let h = 2; h <= H; h++) s += harmonics[h]! * harmonics[h]!;
      thdV = Math.sqrt(s) / harmonics[1]!;
    }
    if (n - j0 >= 2) dtErr = deadTimeVoltageError(ea, eb, ec, N, cycles).fundamental_V;
  }

  // the fundamental frequency at the end (over the last recorded periods, at most ANALYSIS_CYCLES fundamental periods)
  const fe = n > 0 && t[n]! > t[j0]! ? Math.abs(th[n]! - th[j0]!) / (TWO_PI * (t[n]! - t[j0]!)) : 0;
  return {
    fsw_Hz: spec.fsw_Hz,
    deadTime_s: spec.deadTime_s,
    modulation: spec.modulation,
    ripplePeakToPeak_A: { max: pMax, mean: m > 0 ? pSum / m : NaN },
    rippleEnvelope: { angle_rad: envAngle, peakToPeak_A: env },
    thd: thdV,
    thdMaxHarmonic: H,
    harmonics_A: harmonics,
    deadTimeVoltageError_V: dtErr,
    dcLink: dc,
    window: windowOf(cap, fe),
    analysed: { from_s: from, to_s: n > 0 ? t[n]! : NaN, cycles },
    fundamental_Hz: fe,
  };
}

function windowOf(cap: SwitchingCapture, fe: number): SwitchingResult['window'] {
  const w = cap.window;
  if (!w.ring) {
    const k = Math.min(w.n, w.cap);
    return {
      from_s: w.from, to_s: w.to, truncated: w.n >= w.cap && k > 0 && w.t[k - 1]! < Math.min(w.to, cap.tEnd),
      t_s: w.t.slice(0, k), ia_A: w.ia.slice(0, k), ib_A: w.ib.slice(0, k), ic_A: w.ic.slice(0, k), va_V: w.va.slice(0, k), idc_A: w.idc.slice(0, k),
    };
  }
  const held = Math.min(w.n, w.cap);
  const first = w.n - held;
  const tEnd = held > 0 ? w.t[(w.n - 1) % w.cap]! : NaN;
  const want = fe > 0 ? tEnd - 2 / fe : -Infinity;
  let s = first;
  while (s < w.n && w.t[s % w.cap]! < want) s++;
  const k = w.n - s;
  const pick = (a: Float64Array): Float64Array => { const o = new Float64Array(k); for (let i = 0; i < k; i++) o[i] = a[(s + i) % w.cap]!; return o; };
  const ts = pick(w.t);
  return {
    from_s: k > 0 ? ts[0]! : NaN, to_s: tEnd, truncated: fe > 0 && first > 0 && s === first,
    t_s: ts, ia_A: pick(w.ia), ib_A: pick(w.ib), ic_A: pick(w.ic), va_V: pick(w.va), idc_A: pick(w.idc),
  };
}
