// TEST FIXTURE (not the engine): a SwitchingResult built by a small stand-alone model, for the
// renderer's tests and screenshots while the simulator's own switching result is not wired. A
// three-phase sine-triangle bridge (symmetric carrier, min-max injection for "svpwm") on an inductive
// load with a back-EMF that carries the fundamental: each phase current is its fundamental plus the
// integral of the phase voltage's switching part over L. Sampled on a uniform grid (not at the
// switching instants), statistics over the whole window.
import type { SwitchingResult } from '../src/core/simulation/switching-result';

export interface FixtureOptions {
  Vdc?: number;
  fsw_Hz?: number;
  f1_Hz?: number;
  /** peak fundamental current, A */
  I1?: number;
  /** peak fundamental phase voltage, V */
  V1?: number;
  L_H?: number;
  deadTime_s?: number;
  modulation?: 'sinusoidal' | 'svpwm';
  /** fundamental periods in the window */
  cycles?: number;
  samplesPerCarrier?: number;
  maxHarmonic?: number;
}

export function switchingResultFixture(o: FixtureOptions = {}): SwitchingResult {
  const Vdc = o.Vdc ?? 48, fsw = o.fsw_Hz ?? 20000, f1 = o.f1_Hz ?? 250, I1 = o.I1 ?? 90, V1 = o.V1 ?? 18, L = o.L_H ?? 45e-6;
  const td = o.deadTime_s ?? 5e-7, mod = o.modulation ?? 'svpwm', cycles = o.cycles ?? 2, spc = o.samplesPerCarrier ?? 40, H = o.maxHarmonic ?? 40;
  const from = 0.3;
  const span = cycles / f1;
  const n = Math.round(span * fsw * spc) + 1;
  const dt = span / (n - 1);
  const t = new Float64Array(n), ia = new Float64Array(n), ib = new Float64Array(n), ic = new Float64Array(n), va = new Float64Array(n), idc = new Float64Array(n);
  const r = [0, 0, 0];
  // the voltage and DC-link current over the interval ending at each sample (the state set at the sample before)
  let vaPrev = 0, idcPrev = 0;
  const shift = [0, (-2 * Math.PI) / 3, (2 * Math.PI) / 3];
  for (let j = 0; j < n; j++) {
    const tj = from + j * dt;
    const th = 2 * Math.PI * f1 * (tj - from);
    const ref = shift.map((s) => V1 * Math.cos(th + s));
    const v0 = mod === 'svpwm' ? -(Math.max(...ref) + Math.min(...ref)) / 2 : 0;
    // symmetric carrier in [-Vdc/2, Vdc/2]: a leg is on the plus rail while its reference is above it
    const ph = (tj * fsw) % 1;
    const carrier = (Vdc / 2) * (ph < 0.5 ? 4 * ph - 1 : 3 - 4 * ph);
    const s = ref.map((v) => (v + v0 > carrier ? 1 : 0));
    const legMean = (s[0]! + s[1]! + s[2]!) / 3;
    const vph = s.map((x) => Vdc * (x - legMean));
    const i = [0, 1, 2].map((k) => I1 * Math.cos(th + shift[k]! - 0.3) + r[k]!);
    // the switching part of each phase voltage drives the ripple current through L
    for (let k = 0; k < 3; k++) r[k]! += ((vph[k]! - ref[k]!) / L) * dt;
    t[j] = tj;
    ia[j] = i[0]!;
    ib[j] = i[1]!;
    ic[j] = i[2]!;
    va[j] = vaPrev;
    idc[j] = idcPrev;
    vaPrev = vph[0]!;
    idcPrev = s[0]! * i[0]! + s[1]! * i[1]! + s[2]! * i[2]!;
  }
  // harmonic amplitudes of ia over the whole fundamental periods (index = order)
  const harmonics = new Float64Array(H + 1);
  for (let h = 0; h <= H; h++) {
    let a = 0, b = 0;
    for (let j = 0; j < n - 1; j++) {
      const th = 2 * Math.PI * f1 * (t[j]! - from) * h;
      a += ia[j]! * Math.cos(th);
      b += ia[j]! * Math.sin(th);
    }
    harmonics[h] = (h === 0 ? 1 : 2) * Math.hypot(a, b) / (n - 1);
  }
  let hs = 0;
  for (let h = 2; h <= H; h++) hs += harmonics[h]! ** 2;
  // ripple per carrier period: ia less its fundamental, largest less smallest
  const periods = Math.floor((n - 1) / spc);
  const pp = new Float64Array(periods);
  const bins = 36;
  const envAngle = new Float64Array(bins), envPp = new Float64Array(bins);
  for (let b = 0; b < bins; b++) envAngle[b] = ((b + 0.5) * 2 * Math.PI) / bins;
  for (let p = 0; p < periods; p++) {
    let mx = -Infinity, mn = Infinity;
    for (let j = p * spc; j <= (p + 1) * spc; j++) {
      const th = 2 * Math.PI * f1 * (t[j]! - from);
      const x = ia[j]! - I1 * Math.cos(th - 0.3);
      mx = Math.max(mx, x);
      mn = Math.min(mn, x);
    }
    pp[p] = mx - mn;
    const ang = (2 * Math.PI * f1 * (t[p * spc]! - from)) % (2 * Math.PI);
    const b = Math.min(bins - 1, Math.floor((ang / (2 * Math.PI)) * bins));
    envPp[b] = Math.max(envPp[b]!, pp[p]!);
  }
  let s1 = 0, s2 = 0;
  for (let j = 1; j < n; j++) {
    s1 += idc[j]!;
    s2 += idc[j]! ** 2;
  }
  const mean = s1 / (n - 1), rms = Math.sqrt(s2 / (n - 1));
  return {
    fsw_Hz: fsw,
    deadTime_s: td,
    modulation: mod,
    ripplePeakToPeak_A: { max: Math.max(...pp), mean: pp.reduce((a, b) => a + b, 0) / periods },
    rippleEnvelope: { angle_rad: envAngle, peakToPeak_A: envPp },
    thd: Math.sqrt(hs) / harmonics[1]!,
    thdMaxHarmonic: H,
    harmonics_A: harmonics,
    // the dead-time loss of the fundamental (Murai, Watanabe and Iwasaki 1987): (4/pi) Vdc td fsw
    deadTimeVoltageError_V: (4 / Math.PI) * Vdc * td * fsw,
    dcLink: { mean_A: mean, rms_A: rms, rippleRms_A: Math.sqrt(Math.max(0, rms * rms - mean * mean)) },
    window: { from_s: from, to_s: from + span, truncated: false, t_s: t, ia_A: ia, ib_A: ib, ic_A: ic, va_V: va, idc_A: idc },
    analysed: { from_s: from, to_s: from + span, cycles },
    fundamental_Hz: f1,
  };
}
