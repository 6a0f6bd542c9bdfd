/**
 * The digital cascade controller, as a drive's processor runs it once per control period Ts:
 *
 * 1. At the period start it samples i_d, i_q (from the phase currents and the rotor angle), the
 *    mechanical speed and the electrical angle theta_e.
 * 2. Speed mode: every `speedLoopDivider` periods the speed PI turns the (ramp-limited, optionally
 *    prefiltered) speed error into a torque reference, clamped to the drive's torque limit at that
 *    speed; torque mode takes the torque reference from its schedule. The reference table turns the
 *    torque into (i_d, i_q) references (least current, MTPA or field weakening). Current-step mode
 *    takes (i_d, i_q) references directly. The current reference is limited to Imax, d axis first.
 * 3. The dq current PIs (with optional decoupling and back-EMF feed-forward) give the voltage, which
 *    is limited to the modulation's limit with d-axis priority: a circle |v| <= Vmax (sinusoidal PWM,
 *    SVPWM) or the hexagon of the bridge (six-step / overmodulation).
 * 4. The voltage goes through the inverse Park transform at the sampled angle, advanced by
 *    (delaySamples + 0.5)·omega_e·Ts when `delayAngleCompensation` is on (the rotor turns while the
 *    command waits and while it is applied), and is applied `delaySamples` periods later, held
 *    constant in the stationary frame over one period (the PWM average).
 *
 * Anti-windup, per PI: 'clamping' = conditional integration (the integrator stops while the output
 * is limited and the error pushes further into the limit); 'back-calculation' = the integrator is
 * driven by (limited - unlimited output) with tracking time equal to the integral time Kp/Ki.
 *
 * Gain scheduling (`gainScheduling`, a model that is not linear): each period the proportional gains
 * follow the incremental inductances at the current reference, Kp = Kp0·L_inc(i_ref)/L_inc(0) per
 * axis, the integral gains kept (internal model control: Kp = L omega_c, Ki = Rs omega_c; see
 * gain-schedule.ts for the table a firmware would hold).
 *
 * All state is preallocated; `step` allocates nothing. The sampled step is straight-line code: the
 * configuration's numbers are read once, in the constructor, into one typed array of parameters
 * (P_* below), the reference table's speed row is interpolated once per period (for the torque
 * limits and the current references alike), the speed loop runs inline, and the only calls left are
 * the voltage limit when the command leaves the circle (or with the hexagon) and, for a model that
 * is not linear, its flux and incremental inductance.
 */
import type { MachineModel } from '../machine/machine-model';
import { machineModel } from '../machine/linear-dq';
import { scheduleValue, type StepSchedule } from './step-schedule';
import { limitVoltageDq, type VoltageLimitSpec } from './voltage-limit';
import { cosSmall, sinSmall } from '../mathematics/rotation';

export { stepSchedule, scheduleValue, type StepSchedule } from './step-schedule';
export { limitVoltageDq, voltageLimitAt, type VoltageLimitSpec } from './voltage-limit';
export { DEFAULT_CONTROLLER_OPTIONS, type AntiWindup, type ControlMode, type ControllerConfig, type PiGains } from './controller-config';
import type { ControllerConfig } from './controller-config';
import {
  P_COUNT, P_POLES, P_LD, P_LQ, P_PSIM, P_IMAX, P_KPD, P_KPQ, P_KITSD, P_KITSQ, P_KBD, P_KBQ, P_ADV, P_RADIUS,
  P_RAMP, P_FILT, P_KPW, P_KIW, P_KBW, P_DIVIDER, P_WMAX, P_NS, P_NU, P_KPD0, P_KPQ0, P_LDD0, P_LQQ0, controllerParameters,
} from './controller-config';

// module-local references to the imported functions called every period (a CommonJS build turns an imported binding into a getter)
const scheduleValueL = scheduleValue;
const limitVoltageDqL = limitVoltageDq;
const sinSmallL = sinSmall;
const cosSmallL = cosSmall;
const MAX_DELAY = 16;
const EMPTY = new Float64Array(0);
export class CascadeController {
  readonly cfg: ControllerConfig;
  // integrators, and the speed reference chain
  xd = 0;
  xq = 0;
  xw = 0;
  wRefRamp = 0;
  wRefFilt = 0;
  // outputs of the last step, for traces
  speedRefOut = 0;
  torqueRef = 0;
  idRef = 0;
  iqRef = 0;
  /** an imposed q-current reference, A, with id 0 (a sensorless start-up's open-loop current; NaN = none) */
  forcedIq = Number.NaN;
  /** commanded (limited) dq voltage of this period, V */
  vdCmd = 0;
  vqCmd = 0;
  currentLimited = false;
  voltageSaturated = false;
  private slot = 0; // the delay line's slot of this period (the period count modulo the delay)
  private readonly bufA = new Float64Array(MAX_DELAY);
  private readonly bufB = new Float64Array(MAX_DELAY);
  private readonly tmp = new Float64Array(2);
  /**
   * The sample of `stepSampled`: [t, i_d, i_q, omega_m, theta_e, cos theta_e, sin theta_e].
   * Passing the sample through this array instead of arguments keeps the engine from boxing
   * doubles per call; the caller that has cos and sin of the angle already (the simulator's plant)
   * passes them, so the inverse Park needs no transcendental call.
   */
  readonly sample = new Float64Array(7);
  private speedCounter = 0;
  /** the torque reference was clamped to a drive limit this period (speed and torque modes) */
  torqueClamped = false;
  /** the machine model; its closed form (the feed-forward with Ld, Lq, psiM) taken when `model.linear` is non-null */
  readonly model: MachineModel;
  /** the configuration's numbers (P_* indices, controller-config.ts) */
  private readonly prm = new Float64Array(P_COUNT);
  // the configuration's switches and arrays, read once
  /** 0 speed, 1 torque, 2 current-step */
  private readonly modeN: number = 0;
  private readonly D: number = 0;
  private readonly lin: boolean;
  private readonly sched: boolean;
  private readonly clamping: boolean;
  private readonly decoup: boolean;
  private readonly bemf: boolean;
  private readonly circle: boolean;
  private readonly voltage: VoltageLimitSpec;
  private readonly tMot: Float64Array;
  private readonly tGen: Float64Array;
  private readonly tabId: Float64Array;
  private readonly tabIq: Float64Array;
  private readonly speedRef: StepSchedule;
  private readonly torqueRefS: StepSchedule;
  private readonly idRefS: StepSchedule;
  private readonly iqRefS: StepSchedule;
  /** flux at zero current (the back-EMF feed-forward's), the flux of the sampled current, incremental inductances */
  private readonly psi0 = new Float64Array(2);
  private readonly psi = new Float64Array(2);
  private readonly Linc = new Float64Array(4);

  constructor(cfg: ControllerConfig) {
    if (!(Number.isInteger(cfg.delaySamples) && cfg.delaySamples >= 0 && cfg.delaySamples < MAX_DELAY)) {
      throw new RangeError(`delaySamples must be a whole number 0..${MAX_DELAY - 1}`);
    }
    this.cfg = cfg;
    this.modeN = cfg.mode === 'speed' ? 0 : cfg.mode === 'torque' ? 1 : 2;
    this.D = cfg.delaySamples;
    const model = machineModel(cfg.machine);
    this.model = model;
    const lin = model.linear;
    this.lin = lin !== null;
    // the flux at zero current: the magnet's (psiM, 0) for the linear model
    model.flux(0, 0, this.psi0);
    model.incrementalInductance(0, 0, this.Linc);
    controllerParameters(cfg, model, this.psi0[0]!, this.Linc[0]!, this.Linc[3]!, this.prm);
    const tab = cfg.table;
    this.tMot = tab ? tab.tMot : EMPTY;
    this.tGen = tab ? tab.tGen : EMPTY;
    this.tabId = tab ? tab.id : EMPTY;
    this.tabIq = tab ? tab.iq : EMPTY;
    if (this.modeN !== 2 && !tab) throw new RangeError(`${cfg.mode} control needs a reference table`);
    this.speedRef = cfg.speedRef;
    this.torqueRefS = cfg.torqueRef;
    this.idRefS = cfg.idRef;
    this.iqRefS = cfg.iqRef;
    this.sched = cfg.gainScheduling === true && lin === null;
    this.clamping = cfg.antiWindup === 'clamping';
    this.decoup = cfg.decoupling;
    this.bemf = cfg.backEmfFeedForward;
    this.circle = cfg.voltage.shape === 'circle';
    this.voltage = cfg.voltage;
  }

  /**
   * Start from rest currents at speed w0 and angle theta0: the voltages already in the delay line
   * are the back-EMF (so the first periods do not short the motor), the integrators start where the
   * steady state needs them.
   */
  reset(w0: number, theta0: number): void {
    const c = this.cfg;
    const P = this.prm;
    const we = P[P_POLES]! * w0;
    const psiM = P[P_PSIM]!;
    this.slot = 0;
    this.speedCounter = 0;
    this.wRefRamp = w0;
    this.wRefFilt = w0;
    this.xd = 0;
    this.xq = c.backEmfFeedForward ? 0 : we * psiM;
    this.xw = c.initialTorque;
    this.torqueRef = c.mode === 'speed' ? c.initialTorque : 0;
    this.bufA.fill(0);
    this.bufB.fill(0);
    for (let j = 0; j < c.delaySamples; j++) {
      const th = theta0 + (j + 0.5) * we * c.Ts;
      const vq = we * psiM;
      if (this.lin) {
        this.bufA[j] = -vq * Math.sin(th);
        this.bufB[j] = vq * Math.cos(th);
      } else {
        // the back-EMF of the flux at zero current, (vd, vq) = we (-psi0_q, psi0_d), rotated to alpha-beta
        const vd = -we * this.psi0[1]!;
        this.bufA[j] = vd * Math.cos(th) - vq * Math.sin(th);
        this.bufB[j] = vd * Math.sin(th) + vq * Math.cos(th);
      }
    }
  }

  /**
   * One control period starting at time t with the sampled state. Writes the alpha-beta voltage to
   * apply over this period into out[0..1].
   */
  step(t: number, id: number, iq: number, w: number, theta: number, out: Float64Array): void {
    const x = this.sample;
    x[0] = t; x[1] = id; x[2] = iq; x[3] = w; x[4] = theta; x[5] = Math.cos(theta); x[6] = Math.sin(theta);
    this.stepSampled(out);
  }

  /** `step` with the sample (cos and sin of the angle included) already written into `this.sample`. */
  stepSampled(out: Float64Array): void {
    const x = this.sample;
    const P = this.prm;
    const t = x[0]!;
    const id = x[1]!;
    const iq = x[2]!;
    const w = x[3]!;
    const theta = x[4]!;
    const mode = this.modeN;
    const we = P[P_POLES]! * w;

    // ---- the reference table's speed row at |w| (speed and torque modes): the torque limits
    // (motoring, generating magnitudes) and the row and fraction the current lookup uses
    let neg = false;
    let r = 0;
    let f = 0;
    let mot = 0;
    let gen = 0;
    if (mode !== 2) {
      neg = w < 0;
      const xMax = P[P_WMAX]!;
      const nS = P[P_NS]!;
      // grid position and cell as interpolation.ts computes them (Math.min keeps a NaN a NaN)
      const xs = (Math.min(Math.abs(w), xMax) / xMax) * (nS - 1);
      r = Math.min(Math.floor(xs), nS - 2);
      f = xs - r;
      const tm0 = this.tMot[r]!, tg0 = this.tGen[r]!;
      mot = tm0 + f * (this.tMot[r + 1]! - tm0);
      gen = tg0 + f * (this.tGen[r + 1]! - tg0);
    }
    // torque limits at w: motoring (>= 0) and generating (<= 0); at negative speed the roles swap
    const tHi = neg ? gen : mot;
    const tLo = neg ? -mot : -gen;

    // ---- references
    if (mode === 0) {
      if (this.speedCounter === 0) {
        // the speed loop: ramp-limited, prefiltered reference, PI with the torque limits
        const target = scheduleValueL(this.speedRef, t);
        const dmax = P[P_RAMP]!;
        const dr = target - this.wRefRamp;
        this.wRefRamp += dr > dmax ? dmax : dr < -dmax ? -dmax : dr;
        const filt = P[P_FILT]!;
        if (filt >= 0) this.wRefFilt += filt * (this.wRefRamp - this.wRefFilt);
        else this.wRefFilt = this.wRefRamp;
        this.speedRefOut = this.wRefRamp;
        const e = this.wRefFilt - w;
        const Tu = P[P_KPW]! * e + this.xw;
        const T = Tu > tHi ? tHi : Tu < tLo ? tLo : Tu;
        this.torqueClamped = T !== Tu;
        if (this.clamping) {
          if (!(T !== Tu && e * (Tu - T) > 0)) this.xw += P[P_KIW]! * e;
        } else {
          this.xw += P[P_KIW]! * e + P[P_KBW]! * (T - Tu);
        }
        this.torqueRef = T;
      }
      if (++this.speedCounter >= P[P_DIVIDER]!) this.speedCounter = 0;
    } else if (mode === 1) {
      this.speedRefOut = w;
      const T = scheduleValueL(this.torqueRefS, t);
      const Tc = T > tHi ? tHi : T < tLo ? tLo : T;
      this.torqueClamped = Tc !== T;
      this.torqueRef = Tc;
    } else {
      this.speedRefOut = w;
      this.torqueClamped = false;
    }
    let idr: number, iqr: number;
    if (mode === 2) {
      idr = scheduleValueL(this.idRefS, t);
      iqr = scheduleValueL(this.iqRefS, t);
    } else {
      // torque -> currents: bilinear in (speed, normalised torque u)
      const T = this.torqueRef;
      const Tp = neg ? -T : T;
      let u: number;
      if (Tp >= 0) u = mot > 0 ? Math.min(Tp / mot, 1) : 0;
      else u = gen > 0 ? Math.max(Tp / gen, -1) : 0;
      const nU = P[P_NU]!;
      const y = ((u + 1) / 2) * (nU - 1);
      const c = Math.min(Math.floor(y), nU - 2);
      const g = y - c;
      const i00 = r * nU + c;
      const i10 = i00 + nU;
      const A = this.tabId;
      const B = this.tabIq;
      idr = (1 - f) * (1 - g) * A[i00]! + f * (1 - g) * A[i10]! + (1 - f) * g * A[i00 + 1]! + f * g * A[i10 + 1]!;
      const iqv = (1 - f) * (1 - g) * B[i00]! + f * (1 - g) * B[i10]! + (1 - f) * g * B[i00 + 1]! + f * g * B[i10 + 1]!;
      iqr = neg ? -iqv : iqv;
    }
    if (this.forcedIq === this.forcedIq) { idr = 0; iqr = this.forcedIq; }
    // current reference limit, d axis first
    const I = P[P_IMAX]!;
    let limited = this.torqueClamped;
    if (idr > I) { idr = I; limited = true; } else if (idr < -I) { idr = -I; limited = true; }
    const qm = Math.sqrt(Math.max(0, I * I - idr * idr));
    if (iqr > qm) { iqr = qm; limited = true; } else if (iqr < -qm) { iqr = -qm; limited = true; }
    this.idRef = idr;
    this.iqRef = iqr;
    this.currentLimited = limited;
    if (this.sched) this.scheduleGains(idr, iqr);

    // ---- current PIs
    const ed = idr - id;
    const eq = iqr - iq;
    const decoup = this.decoup;
    let ffd: number;
    let ffq: number;
    if (this.lin) {
      ffd = decoup ? -we * P[P_LQ]! * iq : 0;
      ffq = (decoup ? we * P[P_LD]! * id : 0) + (this.bemf ? we * P[P_PSIM]! : 0);
    } else {
      const ff = this.feedForwardFromFlux(id, iq, we);
      ffd = ff[0]!;
      ffq = ff[1]!;
    }
    const ud = P[P_KPD]! * ed + this.xd + ffd;
    const uq = P[P_KPQ]! * eq + this.xq + ffq;
    const dth = P[P_ADV]! * we;
    const thApply = theta + dth;
    let vd: number, vq: number, sat: boolean;
    const R = P[P_RADIUS]!;
    if (this.circle && ud * ud + uq * uq <= R * R) {
      vd = ud; vq = uq; sat = false;
    } else {
      const tmp = this.tmp;
      sat = limitVoltageDqL(this.voltage, ud, uq, thApply, tmp);
      vd = tmp[0]!;
      vq = tmp[1]!;
    }
    this.voltageSaturated = sat;
    this.vdCmd = vd;
    this.vqCmd = vq;
    if (this.clamping) {
      if (!(sat && (vd !== ud) && ed * (ud - vd) > 0)) this.xd += P[P_KITSD]! * ed;
      if (!(sat && (vq !== uq) && eq * (uq - vq) > 0)) this.xq += P[P_KITSQ]! * eq;
    } else {
      this.xd += P[P_KITSD]! * ed + P[P_KBD]! * (vd - ud);
      this.xq += P[P_KITSQ]! * eq + P[P_KBQ]! * (vq - uq);
    }

    // ---- inverse Park at theta + dth: cos and sin from those of the sampled angle, rotated by dth
    // with a short series (truncation below 2e-14 for |dth| < 0.5), else computed directly
    let cs: number, sn: number;
    if (dth > -0.5 && dth < 0.5) {
      const sd = sinSmallL(dth);
      const cd = cosSmallL(dth);
      const c0 = x[5]!;
      const s0 = x[6]!;
      cs = c0 * cd - s0 * sd;
      sn = s0 * cd + c0 * sd;
    } else {
      cs = Math.cos(thApply);
      sn = Math.sin(thApply);
    }
    const va = vd * cs - vq * sn;
    const vb = vd * sn + vq * cs;
    const D = this.D;
    if (D === 0) {
      out[0] = va;
      out[1] = vb;
    } else {
      const slot = this.slot;
      out[0] = this.bufA[slot]!;
      out[1] = this.bufB[slot]!;
      this.bufA[slot] = va;
      this.bufB[slot] = vb;
      this.slot = slot + 1 === D ? 0 : slot + 1;
    }
  }

  /**
   * The generic feed-forward (dq voltages, into the returned scratch): cross-coupling
   * we·J·(psi(i) - psi(0)) and back-EMF we·J·psi(0), J·psi = (-psi_q, psi_d). Apart from
   * `stepSampled` so that the linear model's step stays straight-line code.
   */
  private feedForwardFromFlux(id: number, iq: number, we: number): Float64Array {
    const psi = this.psi;
    const psi0 = this.psi0;
    const decoup = this.decoup;
    this.model.flux(id, iq, psi);
    const d = (decoup ? -we * (psi[1]! - psi0[1]!) : 0) + (this.bemf ? -we * psi0[1]! : 0);
    const q = (decoup ? we * (psi[0]! - psi0[0]!) : 0) + (this.bemf ? we * psi0[0]! : 0);
    psi[0] = d;
    psi[1] = q;
    return psi;
  }

  /** The proportional (and back-calculation) gains at the current reference (idr, iqr): see the header. */
  private scheduleGains(idr: number, iqr: number): void {
    const L = this.Linc;
    const P = this.prm;
    this.model.incrementalInductance(idr, iqr, L);
    const kpD = (P[P_KPD0]! * L[0]!) / P[P_LDD0]!;
    const kpQ = (P[P_KPQ0]! * L[3]!) / P[P_LQQ0]!;
    P[P_KPD] = kpD;
    P[P_KPQ] = kpQ;
    P[P_KBD] = kpD > 0 ? Math.min(1, P[P_KITSD]! / kpD) : 0;
    P[P_KBQ] = kpQ > 0 ? Math.min(1, P[P_KITSQ]! / kpQ) : 0;
  }
}
