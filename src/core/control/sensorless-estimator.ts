/**
 * The sensorless angle and speed estimator (control.angle = sensorless), sampled once per control
 * period: the active-flux observer (sensorless-active-flux.ts) on the measured currents and the
 * voltage held over the period that ends (the delay handling is stated there), with the model's
 * parameters scaled by the specification's errors, read by a critically damped type II PLL of the
 * stated bandwidth (type2-pll.ts) whose phase detector is the normalised cross product
 *
 *   e = (fa_beta cos thetaHat - fa_alpha sin thetaHat) / |fa| = sin(theta_fa - thetaHat);
 *
 * below the hand-over speed an open-loop start-up (sensorless-startup.ts) and a loss-of-lock monitor
 * (sensorless-lock.ts) once the observer is in charge. Output at a sample: the angle at that sample
 * thetaHat + Ts kp e (the PLL's prediction corrected by this sample's detector) and the PLL's speed.
 *
 * An AngleEstimator (angle-estimator.ts), plus what the simulator's
 * wiring needs: `openLoop` and `startupCurrent_A` (while open loop the controller asks that current
 * on the q axis of thetaE instead of the speed loop's), `startup.handoverIq_A` (the q current at
 * hand-over, to start the speed PI's integrator from), `lossOfLock()` for the watchdog, and
 * `sampleFromInput()` (inputs through `input`, no boxed argument). Allocation-free per sample.
 */
import { InputError } from '../base/errors';
import { RPM_TO_RAD_S } from '../base/units';
import type { MachineInput } from '../machine/machine-model';
import { isMachineModel } from '../machine/machine-model';
import type { SensorlessAngle } from './angle-spec';
import { ActiveFluxObserver, correctionGains, defaultCorrection_Hz } from './sensorless-active-flux';
import { SampledAngleEstimator } from './angle-estimator';
import { wrapToPi as wrapAngle } from './angle-estimator';
import { Type2Pll } from './type2-pll';
import { OpenLoopStartup, STARTUP_DONE, STARTUP_OPEN_LOOP } from './sensorless-startup';
import { DEFAULT_LOCK_BOUND_RAD, DEFAULT_LOCK_TIME_S, LockMonitor } from './sensorless-lock';

export interface SensorlessOptions {
  /** open-loop start-up current amplitude, A peak */
  startupCurrent_A: number;
  /** open-loop speed ramp, rpm/s (default: the hand-over speed in 0.2 s) */
  startupRamp_rpm_per_s?: number;
  /** time of the angle blend after hand-over, s (default 0.02) */
  blend_s?: number;
  /** the observer's correction crossover, Hz (default: a tenth of the PLL bandwidth) */
  correction_Hz?: number;
  /** start-up direction (default +1) */
  direction?: 1 | -1;
  /** loss of lock: |angle error| above this, rad, for lockTime_s (defaults pi/4, 10 ms) */
  lockBound_rad?: number;
  lockTime_s?: number;
}

const F = 'control.angle';
// module-local references (a CommonJS build turns an imported binding into a property getter)
const wrapAngleL = wrapAngle;
const DONE: number = STARTUP_DONE;

/** The observer's terms: the plant model's (its constant terms, or those at zero current) scaled by the errors. */
function observerTerms(spec: SensorlessAngle, machine: MachineInput): { Rs: number; Ld: number; Lq: number; psiM: number } {
  let Ld: number, Lq: number, psiM: number;
  if (isMachineModel(machine) && machine.linear === null) {
    const f = new Float64Array(2), L = new Float64Array(4);
    machine.flux(0, 0, f);
    machine.incrementalInductance(0, 0, L);
    psiM = f[0]!; Ld = L[0]!; Lq = L[3]!;
  } else {
    const t = isMachineModel(machine) ? machine.linear! : machine;
    Ld = t.Ld; Lq = t.Lq; psiM = t.psiM;
  }
  const k = (pct: number): number => 1 + pct / 100;
  return { Rs: machine.Rs * k(spec.resistanceError_pct), Ld: Ld * k(spec.inductanceError_pct), Lq: Lq * k(spec.inductanceError_pct), psiM: psiM * k(spec.fluxError_pct) };
}

function checkSpec(spec: SensorlessAngle, opts: SensorlessOptions): void {
  if (!(spec.bandwidth_Hz > 0)) throw new InputError(`${F}.bandwidth_Hz`, 'must be > 0 Hz');
  if (!(spec.handoverSpeed_rpm > 0)) throw new InputError(`${F}.handoverSpeed_rpm`, 'must be > 0 rpm');
  for (const k of ['fluxError_pct', 'resistanceError_pct', 'inductanceError_pct'] as const) {
    if (!(spec[k] > -100 && spec[k] < 1000)) throw new InputError(`${F}.${k}`, 'must be between -100 and 1000 % (exclusive)');
  }
  if (!(opts.startupCurrent_A >= 0)) throw new InputError(`${F}.startupCurrent_A`, 'must be >= 0 A');
}

export class SensorlessEstimator extends SampledAngleEstimator {
  /** the angle and electrical speed the controller gets, rad (in [-pi, pi]) and rad/s */
  thetaE = 0.5;
  omegaE = 0.5;
  /** the observer's own angle and speed (the PLL's), whatever the start-up phase */
  observerThetaE = 0.5;
  observerOmegaE = 0.5;
  readonly observer: ActiveFluxObserver;
  readonly pll: Type2Pll;
  readonly startup: OpenLoopStartup;
  readonly lock: LockMonitor;
  /** the observer's model terms (after the stated errors) */
  readonly terms: { Rs: number; Ld: number; Lq: number; psiM: number };
  private readonly handoverE: number;

  constructor(readonly spec: SensorlessAngle, machine: MachineInput, opts: SensorlessOptions) {
    super();
    checkSpec(spec, opts);
    this.terms = observerTerms(spec, machine);
    const g = correctionGains(opts.correction_Hz ?? defaultCorrection_Hz(spec.bandwidth_Hz));
    this.observer = new ActiveFluxObserver(this.terms, g.kp, g.ki);
    this.pll = Type2Pll.ofBandwidth(spec.bandwidth_Hz);
    const p = machine.polePairs;
    this.handoverE = spec.handoverSpeed_rpm * RPM_TO_RAD_S * p;
    const ramp = opts.startupRamp_rpm_per_s ?? spec.handoverSpeed_rpm / 0.2;
    if (!(ramp > 0)) throw new InputError(`${F}.startupRamp_rpm_per_s`, 'must be > 0 rpm/s');
    this.startup = new OpenLoopStartup({
      handoverOmegaE: this.handoverE,
      rampE_rad_s2: ramp * RPM_TO_RAD_S * p,
      current_A: opts.startupCurrent_A,
      blend_s: opts.blend_s ?? 0.02,
      direction: opts.direction ?? 1,
    });
    this.lock = new LockMonitor(opts.lockBound_rad ?? DEFAULT_LOCK_BOUND_RAD, opts.lockTime_s ?? DEFAULT_LOCK_TIME_S);
    // the double fields are declared with a non-integer value so that the engine stores them as
    // doubles from the start (no boxed number per store in the hot path); the real start is set here
    this.thetaE = this.omegaE = this.observerThetaE = this.observerOmegaE = 0;
  }

  /**
   * Start at electrical angle thetaE and speed omegaE with the currents at rest: at or above the
   * hand-over speed locked (observer flux from the current model, PLL at the state), below it
   * open loop from that angle and speed.
   */
  reset(thetaE: number, omegaE: number): void {
    this.observer.reset(thetaE, 0, 0);
    this.pll.reset(thetaE, omegaE);
    this.lock.reset();
    if (Math.abs(omegaE) >= this.handoverE) this.startup.finish();
    else this.startup.start(thetaE, omegaE);
    this.thetaE = wrapAngle(thetaE);
    this.omegaE = omegaE;
    this.observerThetaE = this.thetaE;
    this.observerOmegaE = omegaE;
  }

  /** true while the start-up imposes the current vector (the controller then asks `startupCurrent_A` on the q axis of thetaE) */
  get openLoop(): boolean {
    return this.startup.phase === STARTUP_OPEN_LOOP;
  }

  /** the open-loop current amplitude while open loop, else 0 */
  get startupCurrent_A(): number {
    return this.startup.current_A;
  }

  /** `sample` with its inputs already written into `this.input`. */
  sampleFromInput(): void {
    const x = this.input;
    const Ts = x[6]!;
    const pll = this.pll;
    const obs = this.observer;
    const th = pll.theta;
    const c = Math.cos(th), s = Math.sin(th);
    obs.update(x[2]!, x[3]!, x[4]!, x[5]!, Ts, c, s);
    const fa = obs.faA, fb = obs.faB;
    const mag = Math.sqrt(fa * fa + fb * fb);
    const e = mag > 1e-12 ? (fb * c - fa * s) / mag : 0;
    pll.update(e, Ts);
    const tObs = wrapAngleL(th + Ts * pll.kp * e);
    this.observerThetaE = tObs;
    this.observerOmegaE = pll.omega;
    const st = this.startup;
    if (st.phase === DONE) {
      this.thetaE = tObs;
      this.omegaE = pll.omega;
      this.lock.update(tObs, x[0]!, Ts);
    } else {
      st.step(tObs, pll.omega, Ts);
      this.thetaE = st.thetaOut;
      this.omegaE = st.omegaOut;
    }
  }

  /** The watchdog's call: the loss-of-lock text once the lock is lost, else null. */
  lossOfLock(): string | null {
    return this.lock.message();
  }
}
