/**
 * Current- and speed-loop tuning rules and the loops' frequency responses.
 *
 * Current loop, per axis, by internal model control: Kp = L·omega_c, Ki = Rs·omega_c, so the PI
 * zero cancels the winding pole and the open loop is omega_c/s (Harnefors and Nee, 1998, "Model-based
 * current control of AC machines using the internal model control method").
 *
 * Speed loop, on the torque-to-speed plant 1/(J s + B) behind the closed current loop:
 * - 'symmetric-optimum' (Kessler, 1958) with spacing a: T_sigma = 1/omega_c + Ts_speed/2 (the
 *   closed current loop's equivalent lag plus the hold of the speed-loop output),
 *   Kp = J/(a·T_sigma), Ti = a²·T_sigma, Ki = Kp/Ti; crossover 1/(a·T_sigma).
 * - 'bandwidth': Kp = J·omega_s, Ki = Kp·omega_s/4 (PI zero a quarter of the crossover; common
 *   practice).
 *
 * The margins, bandwidths, closed-loop peaking and Bode data reported are those of the exact
 * sampled-data loop (sampled-loop.ts): discrete PI as the controller runs it, z^-d, zero-order hold,
 * plant discretised, evaluated on z = e^{j omega T} up to Nyquist. Beside them, `continuous` gives the
 * figures of the continuous approximation: PI continuous, delay e^{-s·Td}, Td = delaySamples·Ts + Ts/2
 * (the computation delay plus the half period of the PWM hold); its speed loop sees the closed
 * current loop L/(1+L) (q axis) and e^{-s·Ts_speed/2}. Crossover, phase margin, gain margin and the
 * closed-loop -3 dB bandwidth are found by bracketing on a logarithmic frequency grid, then bisection.
 *
 * Warnings (common practice, no source): phase margin under 45° a caution and under 30° a danger;
 * gain margin under 6 dB a caution; closed-loop peaking above 3 dB a caution.
 */
import type { MachineInput } from '../machine/machine-model';
import { currentLoopPlant } from './current-loop-plant';
import type { Finding } from '../base/finding';
import type { EstimatorLoopReport } from './estimator-loop';
import { InputError } from '../base/errors';
import { sampledBode, sampledCurrentOpenLoop, sampledMargins, sampledSpeedOpenLoop, UnwrappedResponse, type SampledResponse } from './sampled-loop';

export interface Bode {
  f_Hz: number[];
  mag_dB: number[];
  phase_deg: number[];
}

export interface LoopReport {
  Kp: number;
  Ki: number;
  /** the sampled loop's period, s (the speed loop's is divider·Ts) */
  samplePeriod_s: number;
  /** closed-loop -3 dB bandwidth of the sampled loop, Hz (null if not found up to Nyquist) */
  bandwidth_Hz: number | null;
  /** gain crossover of the open loop, Hz */
  crossover_Hz: number | null;
  phaseMargin_deg: number | null;
  gainMargin_dB: number | null;
  /** largest closed-loop gain |L/(1+L)| up to Nyquist, dB */
  peaking_dB: number | null;
  /** open-loop gain of the sampled loop at its Nyquist frequency, dB (above 0: no crossover before Nyquist) */
  gainAtNyquist_dB: number;
  /** the bandwidth the rule aimed at, Hz */
  design_Hz: number;
  /** the same loop by the continuous approximation (delay e^{-s Td}), for comparison */
  continuous: Margins;
  /** open loop of the sampled loop, up to its Nyquist frequency */
  bode: Bode;
}

export interface TuningReport {
  current: LoopReport;
  currentQ?: LoopReport;
  speed: LoopReport;
  /** T_sigma used by the speed rule, s */
  speedLagEquivalent_s: number;
  /** total delay of the current loop in the response, s */
  currentDelay_s: number;
  warnings: Finding[];
  /** the angle estimator's loop and the speed loop through it (estimator-loop.ts); absent for the true angle */
  estimator?: EstimatorLoopReport;
}

export type CurrentTuning = { bandwidth_Hz: number } | { Kp: number; Ki: number };
export type SpeedTuning =
  | { method: 'bandwidth'; bandwidth_Hz: number }
  | { method: 'symmetric-optimum'; a: number }
  | { Kp: number; Ki: number };

export interface TuningInput {
  /** the machine model (or the constant dq terms it wraps); the current loops' R and L come from it at zero current */
  machine: MachineInput;
  /** total inertia, kg·m² */
  inertia: number;
  viscousFriction: number;
  fCtrl_Hz: number;
  delaySamples: number;
  speedLoopDivider: number;
  current: CurrentTuning;
  speed: SpeedTuning;
}

/** Phase margin under this is a caution, deg (common practice, no source). */
export const PHASE_MARGIN_CAUTION_DEG = 45;
/** Phase margin under this is a danger, deg (common practice, no source). */
export const PHASE_MARGIN_DANGER_DEG = 30;
/** Gain margin under this is a caution, dB (common practice, no source). */
export const GAIN_MARGIN_CAUTION_DB = 6;
/** Closed-loop peaking above this is a caution, dB (common practice, no source). */
export const PEAKING_CAUTION_DB = 3;

/** Default current bandwidth when the file gives none: fCtrl/20 (common practice). */
export const DEFAULT_CURRENT_BANDWIDTH_FRACTION = 1 / 20;
/** Default speed tuning when the file gives none: bandwidth rule at 1/10 of the current bandwidth. */
export const DEFAULT_SPEED_BANDWIDTH_FRACTION = 1 / 10;
export const BODE_POINTS = 300;

// ------------------------------------------------------------------ frequency responses

/** magnitude (linear) and unwrapped phase (rad) of a loop at angular frequency w */
type Response = (w: number, out: Float64Array) => void;

function piResponse(Kp: number, Ki: number, w: number): [number, number] {
  const im = -Ki / w;
  return [Math.hypot(Kp, im), Math.atan2(im, Kp)];
}

export function currentOpenLoop(Kp: number, Ki: number, R: number, L: number, Td: number): Response {
  return (w, out) => {
    const [mc, pc] = piResponse(Kp, Ki, w);
    out[0] = mc / Math.hypot(R, w * L);
    out[1] = pc - Math.atan2(w * L, R) - w * Td;
  };
}

/** closed loop L/(1+L) of a response, as magnitude and phase */
function closedLoop(open: Response): Response {
  const s = new Float64Array(2);
  return (w, out) => {
    open(w, s);
    const re = s[0]! * Math.cos(s[1]!);
    const im = s[0]! * Math.sin(s[1]!);
    out[0] = s[0]! / Math.hypot(1 + re, im);
    out[1] = s[1]! - Math.atan2(im, 1 + re);
  };
}

export function speedOpenLoop(Kp: number, Ki: number, J: number, B: number, currentClosed: Response, Thold: number): Response {
  const s = new Float64Array(2);
  return (w, out) => {
    const [mc, pc] = piResponse(Kp, Ki, w);
    currentClosed(w, s);
    out[0] = (mc * s[0]!) / Math.hypot(B, w * J);
    out[1] = pc + s[1]! - Math.atan2(w * J, B) - w * Thold;
  };
}

/** First w in [wLo, wHi] (log scan of n points, then bisection) where g(w) changes sign from >= 0 to < 0. */
function firstDownCrossing(g: (w: number) => number, wLo: number, wHi: number, n = 600): number | null {
  const r = Math.log(wHi / wLo);
  let a = wLo;
  let ga = g(a);
  for (let k = 1; k <= n; k++) {
    const b = wLo * Math.exp((r * k) / n);
    const gb = g(b);
    if (ga >= 0 && gb < 0) {
      let lo = a;
      let hi = b;
      for (let i = 0; i < 80; i++) {
        const mid = Math.sqrt(lo * hi);
        if (g(mid) >= 0) lo = mid; else hi = mid;
      }
      return Math.sqrt(lo * hi);
    }
    a = b;
    ga = gb;
  }
  return null;
}

function foldDeg(x: number): number {
  let y = x % 360;
  if (y <= -180) y += 360;
  if (y > 180) y -= 360;
  return y;
}

export interface Margins {
  crossover_Hz: number | null;
  phaseMargin_deg: number | null;
  gainMargin_dB: number | null;
  bandwidth_Hz: number | null;
}

export function loopMargins(open: Response, wLo: number, wHi: number): Margins {
  const o = new Float64Array(2);
  const mag = (w: number): number => { open(w, o); return o[0]!; };
  const ph = (w: number): number => { open(w, o); return o[1]!; };
  const wc = firstDownCrossing((w) => Math.log(mag(w)), wLo, wHi);
  const w180 = firstDownCrossing((w) => ph(w) + Math.PI, wLo, wHi);
  const cl = closedLoop(open);
  const wb = firstDownCrossing((w) => { cl(w, o); return o[0]! - Math.SQRT1_2; }, wLo, wHi);
  const fin = (x: number): number | null => (Number.isFinite(x) ? x : null);
  // Phase margin folded into (-180, 180] (the summed phase may carry a 2 pi jump from an atan2). When
  // the phase reaches -180 deg below the gain crossover the loop is unstable and the margin is
  // negative: then it is taken in (-360, 0] (an unstable loop never shows a positive margin).
  let pm = wc === null ? NaN : foldDeg(180 + (ph(wc) * 180) / Math.PI);
  if (wc !== null && w180 !== null && w180 < wc && pm > 0) pm -= 360;
  return {
    crossover_Hz: wc === null ? null : wc / (2 * Math.PI),
    phaseMargin_deg: wc === null ? null : fin(pm),
    gainMargin_dB: w180 === null ? null : fin(-20 * Math.log10(mag(w180))),
    bandwidth_Hz: wb === null ? null : wb / (2 * Math.PI),
  };
}

export function bodeData(open: Response, fLo: number, fHi: number, n = BODE_POINTS): Bode {
  const o = new Float64Array(2);
  const f_Hz: number[] = [];
  const mag_dB: number[] = [];
  const phase_deg: number[] = [];
  for (let k = 0; k < n; k++) {
    const f = fLo * Math.pow(fHi / fLo, k / (n - 1));
    open(2 * Math.PI * f, o);
    f_Hz.push(f);
    mag_dB.push(20 * Math.log10(o[0]!));
    phase_deg.push((o[1]! * 180) / Math.PI);
  }
  return { f_Hz, mag_dB, phase_deg };
}

// ------------------------------------------------------------------ rules

export const imcCurrentGains = (L: number, Rs: number, omega_c: number): { Kp: number; Ki: number } => ({ Kp: L * omega_c, Ki: Rs * omega_c });

export function symmetricOptimumGains(J: number, Tsigma: number, a: number): { Kp: number; Ki: number } {
  const Kp = J / (a * Tsigma);
  return { Kp, Ki: Kp / (a * a * Tsigma) };
}

export function bandwidthSpeedGains(J: number, omega_s: number): { Kp: number; Ki: number } {
  const Kp = J * omega_s;
  return { Kp, Ki: (Kp * omega_s) / 4 };
}

/**
 * Makes o[key] a value computed by `compute` when first read (then kept as a plain value; its place
 * among the keys unchanged): the same number whenever it is read, the work only if it is.
 */
function onFirstRead<T extends object, K extends keyof T>(o: T, key: K, compute: () => T[K]): void {
  const keep = (value: T[K]): T[K] => (Object.defineProperty(o, key, { value, enumerable: true, writable: true, configurable: true }), value);
  Object.defineProperty(o, key, { enumerable: true, configurable: true, get: () => keep(compute()), set: keep });
}

/** A frequency for a message: whole hertz from 100 Hz up, else 3 significant digits (never 1.06e+4). */
const hz = (f: number): string => (Math.abs(f) >= 100 ? f.toFixed(0) : f.toPrecision(3));

export function tuneLoops(inp: TuningInput): TuningReport {
  const m = currentLoopPlant(inp.machine);
  if (!(inp.fCtrl_Hz > 0)) throw new InputError('control.fCtrl_Hz', 'must be > 0 Hz');
  if (!(inp.inertia > 0)) throw new InputError('motor.inertia', 'must be > 0 kg·m²');
  if (!(m.Ld > 0 && m.Lq > 0)) throw new InputError('motor.Ld', 'must be > 0 H');
  const Ts = 1 / inp.fCtrl_Hz;
  const Td = inp.delaySamples * Ts + Ts / 2;
  const Tsw = Ts * inp.speedLoopDivider;
  const warnings: Finding[] = [];
  const wLo = 2 * Math.PI * 1e-3;
  const wHi = 2 * Math.PI * inp.fCtrl_Hz * 20;

  // current loops
  let gd: { Kp: number; Ki: number };
  let gq: { Kp: number; Ki: number };
  let designD: number;
  let designQ: number;
  if ('bandwidth_Hz' in inp.current) {
    const wc = 2 * Math.PI * inp.current.bandwidth_Hz;
    if (!(wc > 0)) throw new InputError('control.currentBandwidth_Hz', 'must be > 0 Hz');
    gd = imcCurrentGains(m.Ld, m.Rs, wc);
    gq = imcCurrentGains(m.Lq, m.Rs, wc);
    designD = designQ = inp.current.bandwidth_Hz;
  } else {
    gd = gq = { Kp: inp.current.Kp, Ki: inp.current.Ki };
    designD = inp.current.Kp / m.Ld / (2 * Math.PI);
    designQ = inp.current.Kp / m.Lq / (2 * Math.PI);
  }
  const loop = (g: { Kp: number; Ki: number }, open: Response, sampled: SampledResponse, T: number, design: number, fLo: number): LoopReport => {
    const anchor = new Float64Array(2);
    open(wLo, anchor);
    const u = new UnwrappedResponse(sampled, wLo * T, anchor[1]!);
    const { peaking_dB, ...margins } = sampledMargins(u, T);
    const r: LoopReport = {
      Kp: g.Kp,
      Ki: g.Ki,
      samplePeriod_s: T,
      ...margins,
      peaking_dB,
      gainAtNyquist_dB: 20 * Math.log10(u.mag[u.mag.length - 1]!),
      design_Hz: design,
      continuous: null!,
      bode: null!,
    };
    // read only by the tuning view and command, not by a simulation's set-up: computed when first read
    onFirstRead(r, 'continuous', () => loopMargins(open, wLo, wHi));
    onFirstRead(r, 'bode', () => sampledBode(u, T, fLo, BODE_POINTS));
    return r;
  };
  const olD = currentOpenLoop(gd.Kp, gd.Ki, m.Rs, m.Ld, Td);
  const olQ = currentOpenLoop(gq.Kp, gq.Ki, m.Rs, m.Lq, Td);
  const sD = sampledCurrentOpenLoop(gd.Kp, gd.Ki, m.Rs, m.Ld, Ts, inp.delaySamples);
  const sQ = sampledCurrentOpenLoop(gq.Kp, gq.Ki, m.Rs, m.Lq, Ts, inp.delaySamples);
  const current = loop(gd, olD, sD, Ts, designD, Math.max(designD / 1000, 0.1));
  const currentQ = m.Ld !== m.Lq ? loop(gq, olQ, sQ, Ts, designQ, Math.max(designQ / 1000, 0.1)) : undefined;

  // speed loop
  const wcq = 2 * Math.PI * designQ;
  const Tsigma = 1 / wcq + Tsw / 2;
  let gs: { Kp: number; Ki: number };
  let designS: number;
  const sp = inp.speed;
  if ('method' in sp && sp.method === 'symmetric-optimum') {
    if (!(sp.a > 1)) throw new InputError('control.speedTuning.a', 'must be > 1');
    gs = symmetricOptimumGains(inp.inertia, Tsigma, sp.a);
    designS = 1 / (sp.a * Tsigma) / (2 * Math.PI);
  } else if ('method' in sp) {
    if (!(sp.bandwidth_Hz > 0)) throw new InputError('control.speedBandwidth_Hz', 'must be > 0 Hz');
    gs = bandwidthSpeedGains(inp.inertia, 2 * Math.PI * sp.bandwidth_Hz);
    designS = sp.bandwidth_Hz;
  } else {
    gs = { Kp: sp.Kp, Ki: sp.Ki };
    designS = sp.Kp / inp.inertia / (2 * Math.PI);
  }
  const olS = speedOpenLoop(gs.Kp, gs.Ki, inp.inertia, inp.viscousFriction, closedLoop(olQ), Tsw / 2);
  const sS = sampledSpeedOpenLoop({
    currentKp: gq.Kp,
    currentKi: gq.Ki,
    R: m.Rs,
    L: m.Lq,
    J: inp.inertia,
    B: inp.viscousFriction,
    T: Ts,
    delaySamples: inp.delaySamples,
    divider: inp.speedLoopDivider,
    speedKp: gs.Kp,
    speedKi: gs.Ki,
  });
  const speed = loop(gs, olS, sS, Tsw, designS, Math.max(designS / 1000, 1e-3));

  // warnings
  const fcMax = Math.max(designD, designQ);
  if (fcMax > inp.fCtrl_Hz / 10) {
    warnings.push({
      code: 'current-bandwidth-high',
      severity: 'warning',
      field: 'control.currentBandwidth_Hz',
      message: `current bandwidth ${hz(fcMax)} Hz exceeds fCtrl/10 = ${hz(inp.fCtrl_Hz / 10)} Hz (common practice): the sample delay erodes the phase margin`,
    });
  }
  if ('bandwidth_Hz' in inp.current && m.Rs === 0) {
    warnings.push({
      code: 'current-integral-zero',
      severity: 'info',
      field: 'motor.Rs',
      message: 'Rs = 0 (lossless winding): the internal-model gains give Ki = Rs·bandwidth = 0, a proportional-only current loop; a real winding has resistance, so give Rs or currentKp/currentKi',
    });
  }
  const checkMargin = (name: string, field: string, r: LoopReport): void => {
    if (r.phaseMargin_deg === null) return;
    const pm = r.phaseMargin_deg.toFixed(1);
    if (r.phaseMargin_deg <= 0 || (r.gainMargin_dB !== null && r.gainMargin_dB <= 0)) {
      warnings.push({ code: 'loop-unstable', severity: 'danger', field, message: `${name} loop is unstable (phase margin ${pm} deg${r.gainMargin_dB !== null ? `, gain margin ${r.gainMargin_dB.toFixed(1)} dB` : ''})` });
      return;
    }
    if (r.phaseMargin_deg < PHASE_MARGIN_DANGER_DEG) {
      warnings.push({ code: 'phase-margin-low', severity: 'danger', field, message: `${name} loop phase margin ${pm} deg is under ${PHASE_MARGIN_DANGER_DEG} deg: expect strong overshoot and ringing (common practice)` });
    } else if (r.phaseMargin_deg < PHASE_MARGIN_CAUTION_DEG) {
      warnings.push({ code: 'phase-margin-caution', severity: 'warning', field, message: `${name} loop phase margin ${pm} deg is under ${PHASE_MARGIN_CAUTION_DEG} deg: expect overshoot (common practice)` });
    }
    if (r.gainMargin_dB !== null && r.gainMargin_dB < GAIN_MARGIN_CAUTION_DB) {
      warnings.push({ code: 'gain-margin-low', severity: 'warning', field, message: `${name} loop gain margin ${r.gainMargin_dB.toFixed(1)} dB is under ${GAIN_MARGIN_CAUTION_DB} dB: a gain error of that size makes it unstable (common practice)` });
    }
    if (r.peaking_dB !== null && r.peaking_dB > PEAKING_CAUTION_DB) {
      warnings.push({ code: 'closed-loop-peaking', severity: 'warning', field, message: `${name} loop closed-loop peaking ${r.peaking_dB.toFixed(1)} dB is above ${PEAKING_CAUTION_DB} dB: disturbances near the crossover are amplified (common practice)` });
    }
  };
  checkMargin('d-axis current', 'control.currentBandwidth_Hz', current);
  if (currentQ) checkMargin('q-axis current', 'control.currentBandwidth_Hz', currentQ);
  checkMargin('speed', 'control.speedTuning', speed);
  // open-loop gain still above one at half the loop's sample rate: the sampled loop cannot act there
  for (const [name, field, r] of [
    ['d-axis current', 'control.currentBandwidth_Hz', current],
    ['q-axis current', 'control.currentBandwidth_Hz', currentQ],
    ['speed', 'control.speedTuning', speed],
  ] as const) {
    if (r && r.crossover_Hz === null && r.gainAtNyquist_dB > 0) {
      const fN = 1 / (2 * r.samplePeriod_s);
      warnings.push({ code: 'crossover-above-nyquist', severity: 'danger', field, message: `${name} loop gain is still above one at half its sample rate (${hz(fN)} Hz): the sampled loop cannot be designed there; lower the gains or raise control.fCtrl_Hz` });
    }
  }
  if (speed.crossover_Hz !== null && speed.crossover_Hz > designQ / 2) {
    warnings.push({
      code: 'speed-bandwidth-high',
      severity: 'warning',
      field: 'control.speedBandwidth_Hz',
      message: `speed crossover ${hz(speed.crossover_Hz)} Hz is above half the current bandwidth (${hz(designQ)} Hz): the loops interact (common practice)`,
    });
  }
  return { current, ...(currentQ ? { currentQ } : {}), speed, speedLagEquivalent_s: Tsigma, currentDelay_s: Td, warnings };
}
