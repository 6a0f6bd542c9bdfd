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
 * All state is preallocated; `step` allocates nothing.
 */
import type { MachineModel } from '../machine/machine-model';
import { machineModel } from '../machine/linear-dq';
import { lookupCurrents, torqueLimitsAt } from './reference-table';
import { scheduleValue } from './step-schedule';
import { limitVoltageDq } from './voltage-limit';
import { cosSmall, sinSmall } from '../mathematics/rotation';

export { stepSchedule, scheduleValue, type StepSchedule } from './step-schedule';
export { limitVoltageDq, voltageLimitAt, type VoltageLimitSpec } from './voltage-limit';
export { DEFAULT_CONTROLLER_OPTIONS, type AntiWindup, type ControlMode, type ControllerConfig, type PiGains } from './controller-config';
import type { ControllerConfig } from './controller-config';

// module-local references to the imported functions called every period (a CommonJS build turns
// an imported binding into a property getter called at each use)
const lookupCurrentsL = lookupCurrents;
const torqueLimitsAtL = torqueLimitsAt;
const scheduleValueL = scheduleValue;
const limitVoltageDqL = limitVoltageDq;
const sinSmallL = sinSmall;
const cosSmallL = cosSmall;

const MAX_DELAY = 16;

export class CascadeController {
  readonly cfg: ControllerConfig;
  // integrators
  xd = 0;
  xq = 0;
  xw = 0;
  // speed reference chain
  wRefRamp = 0;
  wRefFilt = 0;
  // outputs of the last step, for traces
  speedRefOut = 0;
  torqueRef = 0;
  idRef = 0;
  iqRef = 0;
  /** commanded (limited) dq voltage of this period, V */
  vdCmd = 0;
  vqCmd = 0;
  currentLimited = false;
  voltageSaturated = false;
  private k = 0;
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
  private readonly lin: boolean;
  /** flux at zero current (the back-EMF feed-forward's), and the flux of the sampled current */
  private readonly psi0 = new Float64Array(2);
  private readonly psi = new Float64Array(2);
  // the configuration's hot numbers as plain fields (read once per period)
  private readonly modeN: number;
  private readonly Ts: number;
  private readonly D: number;
  private readonly p: number;
  private readonly Ld: number;
  private readonly Lq: number;
  private readonly psiM: number;
  private readonly Imax: number;
  // proportional and back-calculation gains: constant, or set each period by `scheduleGains`
  private kpD: number;
  private kpQ: number;
  private readonly kiTsD: number;
  private readonly kiTsQ: number;
  private kbD: number;
  private kbQ: number;
  /** gain scheduling on (a model that is not linear): the gains and incremental inductances at zero current */
  private readonly sched: boolean;
  private readonly kpD0: number;
  private readonly kpQ0: number;
  private readonly Ldd0: number;
  private readonly Lqq0: number;
  private readonly Linc = new Float64Array(4);
  private readonly clamping: boolean;
  private readonly decoup: boolean;
  private readonly bemf: boolean;
  /** inverse-Park advance per rad/s of electrical speed, s */
  private readonly advance: number;
  private readonly circle: boolean;
  private readonly radius: number;

  constructor(cfg: ControllerConfig) {
    if (!(Number.isInteger(cfg.delaySamples) && cfg.delaySamples >= 0 && cfg.delaySamples < MAX_DELAY)) {
      throw new RangeError(`delaySamples must be a whole number 0..${MAX_DELAY - 1}`);
    }
    this.cfg = cfg;
    this.modeN = cfg.mode === 'speed' ? 0 : cfg.mode === 'torque' ? 1 : 2;
    this.Ts = cfg.Ts;
    this.D = cfg.delaySamples;
    const model = machineModel(cfg.machine);
    this.model = model;
    const lin = model.linear;
    this.lin = lin !== null;
    this.p = model.polePairs;
    this.Ld = lin ? lin.Ld : NaN;
    this.Lq = lin ? lin.Lq : NaN;
    // the flux at zero current: the magnet's (psiM, 0) for the linear model
    model.flux(0, 0, this.psi0);
    this.psiM = lin ? lin.psiM : this.psi0[0]!;
    this.Imax = cfg.Imax;
    this.kpD = cfg.currentD.Kp;
    this.kpQ = cfg.currentQ.Kp;
    this.kiTsD = cfg.Ts * cfg.currentD.Ki;
    this.kiTsQ = cfg.Ts * cfg.currentQ.Ki;
    this.kbD = cfg.currentD.Kp > 0 ? Math.min(1, (cfg.Ts * cfg.currentD.Ki) / cfg.currentD.Kp) : 0;
    this.kbQ = cfg.currentQ.Kp > 0 ? Math.min(1, (cfg.Ts * cfg.currentQ.Ki) / cfg.currentQ.Kp) : 0;
    this.sched = cfg.gainScheduling === true && lin === null;
    this.kpD0 = this.kpD;
    this.kpQ0 = this.kpQ;
    model.incrementalInductance(0, 0, this.Linc);
    this.Ldd0 = this.Linc[0]!;
    this.Lqq0 = this.Linc[3]!;
    this.clamping = cfg.antiWindup === 'clamping';
    this.decoup = cfg.decoupling;
    this.bemf = cfg.backEmfFeedForward;
    this.advance = cfg.delayAngleCompensation ? (cfg.delaySamples + 0.5) * cfg.Ts : 0;
    this.circle = cfg.voltage.shape === 'circle';
    this.radius = cfg.voltage.radius;
  }

  /**
   * Start from rest currents at speed w0 and angle theta0: the voltages already in the delay line
   * are the back-EMF (so the first periods do not short the motor), the integrators start where the
   * steady state needs them.
   */
  reset(w0: number, theta0: number): void {
    const c = this.cfg;
    const we = this.p * w0;
    this.k = 0;
    this.speedCounter = 0;
    this.wRefRamp = w0;
    this.wRefFilt = w0;
    this.xd = 0;
    this.xq = c.backEmfFeedForward ? 0 : we * this.psiM;
    this.xw = c.initialTorque;
    this.torqueRef = c.mode === 'speed' ? c.initialTorque : 0;
    this.bufA.fill(0);
    this.bufB.fill(0);
    for (let j = 0; j < c.delaySamples; j++) {
      const th = theta0 + (j + 0.5) * we * c.Ts;
      const vq = we * this.psiM;
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
    const t = x[0]!;
    const id = x[1]!;
    const iq = x[2]!;
    const w = x[3]!;
    const theta = x[4]!;
    const c = this.cfg;
    const mode = this.modeN;
    const we = this.p * w;
    const tmp = this.tmp;

    // ---- references
    if (mode === 0) {
      if (this.speedCounter === 0) this.speedLoop();
      if (++this.speedCounter >= c.speedLoopDivider) this.speedCounter = 0;
    } else if (mode === 1) {
      this.speedRefOut = w;
      const T = scheduleValueL(c.torqueRef, t);
      torqueLimitsAtL(c.table!, w, tmp);
      const Tc = T > tmp[0]! ? tmp[0]! : T < tmp[1]! ? tmp[1]! : T;
      this.torqueClamped = Tc !== T;
      this.torqueRef = Tc;
    } else {
      this.speedRefOut = w;
      this.torqueClamped = false;
    }
    let idr: number;
    let iqr: number;
    if (mode === 2) {
      idr = scheduleValueL(c.idRef, t);
      iqr = scheduleValueL(c.iqRef, t);
    } else {
      lookupCurrentsL(c.table!, w, this.torqueRef, tmp);
      idr = tmp[0]!;
      iqr = tmp[1]!;
    }
    // current reference limit, d axis first
    const I = this.Imax;
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
      ffd = decoup ? -we * this.Lq * iq : 0;
      ffq = (decoup ? we * this.Ld * id : 0) + (this.bemf ? we * this.psiM : 0);
    } else {
      const ff = this.feedForwardFromFlux(id, iq, we);
      ffd = ff[0]!;
      ffq = ff[1]!;
    }
    const ud = this.kpD * ed + this.xd + ffd;
    const uq = this.kpQ * eq + this.xq + ffq;
    const dth = this.advance * we;
    const thApply = theta + dth;
    let vd: number;
    let vq: number;
    let sat: boolean;
    const R = this.radius;
    if (this.circle && ud * ud + uq * uq <= R * R) {
      vd = ud; vq = uq; sat = false;
    } else {
      sat = limitVoltageDqL(c.voltage, ud, uq, thApply, tmp);
      vd = tmp[0]!;
      vq = tmp[1]!;
    }
    this.voltageSaturated = sat;
    this.vdCmd = vd;
    this.vqCmd = vq;
    if (this.clamping) {
      if (!(sat && (vd !== ud) && ed * (ud - vd) > 0)) this.xd += this.kiTsD * ed;
      if (!(sat && (vq !== uq) && eq * (uq - vq) > 0)) this.xq += this.kiTsQ * eq;
    } else {
      this.xd += this.kiTsD * ed + this.kbD * (vd - ud);
      this.xq += this.kiTsQ * eq + this.kbQ * (vq - uq);
    }

    // ---- inverse Park at theta + dth: cos and sin from those of the sampled angle, rotated by dth
    // with a short series (truncation below 2e-14 for |dth| < 0.5), else computed directly
    let cs: number;
    let sn: number;
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
      const slot = this.k % D;
      out[0] = this.bufA[slot]!;
      out[1] = this.bufB[slot]!;
      this.bufA[slot] = va;
      this.bufB[slot] = vb;
    }
    this.k++;
  }

  /**
   * The generic feed-forward (dq voltages, into the returned scratch): cross-coupling
   * we·J·(psi(i) - psi(0)) and back-EMF we·J·psi(0), J·psi = (-psi_q, psi_d). Apart from
   * `stepSampled` so that the period step stays small enough for the engine to inline.
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
    this.model.incrementalInductance(idr, iqr, L);
    const kpD = (this.kpD0 * L[0]!) / this.Ldd0;
    const kpQ = (this.kpQ0 * L[3]!) / this.Lqq0;
    this.kpD = kpD;
    this.kpQ = kpQ;
    this.kbD = kpD > 0 ? Math.min(1, this.kiTsD / kpD) : 0;
    this.kbQ = kpQ > 0 ? Math.min(1, this.kiTsQ / kpQ) : 0;
  }

  private speedLoop(): void {
    const t = this.sample[0]!;
    const w = this.sample[3]!;
    const c = this.cfg;
    const Tsw = c.Ts * c.speedLoopDivider;
    const target = scheduleValueL(c.speedRef, t);
    // ramp limit
    const dmax = c.speedRamp_rad_s2 * Tsw;
    const dr = target - this.wRefRamp;
    this.wRefRamp += dr > dmax ? dmax : dr < -dmax ? -dmax : dr;
    // first-order prefilter, exact discretisation
    if (c.speedRefPrefilter_s > 0) this.wRefFilt += (1 - Math.exp(-Tsw / c.speedRefPrefilter_s)) * (this.wRefRamp - this.wRefFilt);
    else this.wRefFilt = this.wRefRamp;
    this.speedRefOut = this.wRefRamp;
    const e = this.wRefFilt - w;
    const Tu = c.speed.Kp * e + this.xw;
    const lim = this.tmp;
    torqueLimitsAtL(c.table!, w, lim);
    const Tmax = lim[0]!;
    const Tmin = lim[1]!;
    const T = Tu > Tmax ? Tmax : Tu < Tmin ? Tmin : Tu;
    this.torqueClamped = T !== Tu;
    if (c.antiWindup === 'clamping') {
      if (!(T !== Tu && e * (Tu - T) > 0)) this.xw += Tsw * c.speed.Ki * e;
    } else {
      const kw = c.speed.Kp > 0 ? Math.min(1, (Tsw * c.speed.Ki) / c.speed.Kp) : 0;
      this.xw += Tsw * c.speed.Ki * e + kw * (T - Tu);
    }
    this.torqueRef = T;
  }
}
