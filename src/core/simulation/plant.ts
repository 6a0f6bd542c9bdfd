/**
 * The PMSM plant for the cascade simulator: the dq model of ../shared/conventions.md (motor
 * reference direction, amplitude-invariant scaling, peak values) plus the mechanical equation
 *
 *   v_d = R_s i_d + L_d di_d/dt - omega_e L_q i_q
 *   v_q = R_s i_q + L_q di_q/dt + omega_e (L_d i_d + psi_m)
 *   T_e = 1.5 p (psi_m i_q + (L_d - L_q) i_d i_q)
 *   J domega_m/dt = T_e - B omega_m - T_c sgn(omega_m) - T_load(t, omega_m)
 *
 * State vector (Float64Array, index constants below): i_d, i_q, omega_m, theta_e, and the energy
 * drawn from the DC link (the integral of p = 1.5 (v_d i_d + v_q i_q); the inverter is lossless).
 * With flux states (`states: 'flux'`, the default for a model that is not linear) the first two
 * entries hold psi_d, psi_q instead (same layout, same size):
 *
 *   d psi_dq/dt = v_dq - R_s i_dq - omega_e J psi_dq,   J psi = (-psi_q, psi_d),   i_dq = model.current(psi_dq)
 *   T_e = 1.5 p (psi_d i_q - psi_q i_d)
 *
 * so that a saturating machine is integrated in the variables its magnetic field stores (a step
 * into saturation needs no inverse of the incremental inductance, and a reciprocal model conserves
 * energy by construction). Only the plant and the stepper see these states: the simulator converts
 * the state once per control period (`currentState`) and hands the currents to the controller, the
 * recorder, the watchdogs and the log.
 *
 * The input is the inverter's average voltage over a control period. By default it is given in
 * the stationary (alpha, beta) frame, as PWM averaging holds it, and the derivative rotates it into
 * dq with the rotor angle of the state; `inputFrame: 'dq'` holds it constant in dq instead (used
 * for open-loop steady-state checks).
 *
 * The machine is a machine model (../machine/machine-model.ts): with constant Ld, Lq, psiM
 * (`model.linear`) the equations above are evaluated as written (the fast path); any other model
 * goes through its flux and incremental inductance, L_inc di/dt = v - Rs i - we J psi (see
 * `currentDerivative`), and its torque, or, with flux states, through its inverse (`fluxDerivative`).
 * All agree on the linear model (test/machine-paths.test.ts, test/plant-flux-states.test.ts).
 *
 * The sign of the Coulomb friction is smoothed as x / sqrt(1 + x²), x = omega / w, with a width w
 * chosen so that the friction term is not stiff at the control period (see `coulombWidth`).
 */
import type { MachineInput, MachineModel } from '../machine/machine-model';
import { machineModel } from '../machine/linear-dq';
import { InputError } from '../base/errors';
import { cosSmall, sinSmall } from '../mathematics/rotation';

// a module-local reference (a CommonJS build turns an imported binding into a property getter)
const sinSmallL = sinSmall;
const cosSmallL = cosSmall;

export const I_D = 0;
export const I_Q = 1;
export const OMEGA = 2;
export const THETA = 3;
export const ENERGY = 4;
export const STATE_SIZE = 5;

export { loadSchedule, loadLevel, nextLoadBreak } from './load-schedule';
export type { LoadSchedule, LoadStepSpec, LoadRampSpec } from './load-schedule';
import { loadLevel, type LoadSchedule } from './load-schedule';

export interface PlantParams<M extends MachineInput = MachineInput> {
  /** the machine model, or the constant dq terms it wraps */
  machine: M;
  /** total inertia, motor plus load, kg·m² */
  inertia: number;
  /** viscous friction B, N·m·s/rad */
  viscousFriction: number;
  /** Coulomb friction, N·m */
  coulombFriction: number;
  load: LoadSchedule;
  /** 'free': the speed follows the mechanical equation; 'locked': omega_m stays at its initial value */
  mechanics: 'free' | 'locked';
  /** frame in which the input voltage is held over a period (default 'alpha-beta') */
  inputFrame: 'alpha-beta' | 'dq';
  /** width of the smoothed Coulomb sign, rad/s (see `coulombWidth`) */
  coulombWidth_rad_s: number;
  /**
   * the plant's electrical states: 'current' (i_d, i_q) or 'flux' (psi_d, psi_q). Default: currents
   * for a linear model (its closed form, the fast path), flux linkages for any other (see `plantStates`).
   */
  states?: 'current' | 'flux';
}

/** The electrical states a plant integrates (see PlantParams.states). */
export function plantStates(p: PlantParams): 'current' | 'flux' {
  return p.states ?? (machineModel(p.machine).linear !== null ? 'current' : 'flux');
}

/**
 * Width w of the smoothed sign x/sqrt(1 + x²), x = omega/w, replacing sgn(omega): the larger of 1e-3 rad/s and 2·T_c·Ts/J, so that
 * the friction's slope T_c/(J w) times the period stays at or below 0.5 (not stiff for an explicit
 * Runge-Kutta step of one period).
 */
export function coulombWidth(coulombFriction: number, inertia: number, Ts: number): number {
  return Math.max(1e-3, (2 * coulombFriction * Ts) / inertia);
}

export function validatePlant(p: PlantParams): void {
  const model = machineModel(p.machine);
  if (!(Number.isInteger(model.polePairs) && model.polePairs >= 1)) throw new InputError('motor.polePairs', 'must be a whole number >= 1');
  if (!(model.Rs >= 0)) throw new InputError('motor.Rs', 'must be >= 0 ohm');
  const m = model.linear;
  if (m) {
    if (!(m.Ld > 0)) throw new InputError('motor.Ld', 'must be > 0 H');
    if (!(m.Lq > 0)) throw new InputError('motor.Lq', 'must be > 0 H');
    if (!(m.psiM >= 0)) throw new InputError('motor.psiM', 'must be >= 0 Wb');
  }
  if (!(p.inertia > 0)) throw new InputError('motor.inertia', 'must be > 0 kg·m² (motor plus scenario.loadInertia)');
  if (!(p.viscousFriction >= 0)) throw new InputError('motor.viscousFriction', 'must be >= 0 N·m·s/rad');
  if (!(p.coulombFriction >= 0)) throw new InputError('motor.coulombFriction', 'must be >= 0 N·m');
}

/**
 * The plant as an object with a derivative function created once. `input` holds the voltage
 * (v_alpha, v_beta) or (v_d, v_q); the derivative reads it, so the caller changes it in place
 * between periods. `evaluations` counts derivative calls.
 */
export class Plant {
  readonly params: PlantParams;
  /** held input voltage: [v_alpha, v_beta] (or [v_d, v_q] with inputFrame 'dq'), V */
  readonly input = new Float64Array(2);
  evaluations = 0;
  /**
   * Load level as loadA + loadB·t over the current integration segment (see `setLoadSegment`);
   * while `segmented` is false the derivative looks the schedule up at each call instead.
   */
  loadA = 0.5;
  loadB = 0.5;
  segmented = false;
  /** angle origin of the current period and its cosine and sine (see `setAngleOrigin`) */
  th0 = 0.5;
  c0 = Math.cos(0.5);
  s0 = Math.sin(0.5);
  /** the derivative as a function value (dydt, y, t), for integrators that take one */
  readonly deriv: (dydt: Float64Array, y: Float64Array, t: number) => void;
  /** the machine model the derivative asks (its closed form taken when `model.linear` is non-null) */
  readonly model: MachineModel;
  /** the states y[0], y[1] are the flux linkages (psi_d, psi_q), not the currents */
  readonly fluxStates: boolean;
  /** the model is linear and the states are currents: the constant-parameter fast path */
  private readonly lin: boolean;
  /** the currents of the flux states (the inverse's answer) */
  private readonly cur = new Float64Array(2);
  /** flux and incremental inductances of the generic path */
  private readonly psi = new Float64Array(2);
  private readonly Linc = new Float64Array(4);
  // constants of the derivative, as plain double fields
  private readonly p: number;
  private readonly Rs: number;
  private readonly Ld: number;
  private readonly Lq: number;
  private readonly psiM: number;
  private readonly invLd: number;
  private readonly invLq: number;
  private readonly invJ: number;
  private readonly B: number;
  private readonly Tc: number;
  private readonly invW: number;
  private readonly k2: number;
  private readonly free: boolean;
  private readonly ab: boolean;

  constructor(params: PlantParams) {
    validatePlant(params);
    this.params = params;
    const model = machineModel(params.machine);
    this.model = model;
    const m = model.linear;
    this.fluxStates = plantStates(params) === 'flux';
    this.lin = m !== null && !this.fluxStates;
    this.p = model.polePairs;
    this.Rs = model.Rs;
    this.Ld = m ? m.Ld : NaN;
    this.Lq = m ? m.Lq : NaN;
    this.psiM = m ? m.psiM : NaN;
    this.invLd = m ? 1 / m.Ld : NaN;
    this.invLq = m ? 1 / m.Lq : NaN;
    this.invJ = 1 / params.inertia;
    this.B = params.viscousFriction;
    this.Tc = params.coulombFriction;
    this.invW = 1 / params.coulombWidth_rad_s;
    this.k2 = params.load.quadraticK;
    this.free = params.mechanics === 'free';
    this.ab = params.inputFrame === 'alpha-beta';
    this.deriv = (dydt, y, t) => this.derivInto(dydt, y, t);
  }

  /**
   * The time of `derivAt`, s. An integrator's callback writes it here and calls `derivAt`, so that
   * the time crosses the (not inlined) call as an unboxed double instead of a boxed argument.
   */
  readonly time = new Float64Array(1);

  /** dy/dt of the state y at time t into dydt (a prototype method: one call target for every plant). */
  derivInto(dydt: Float64Array, y: Float64Array, t: number): void {
    this.time[0] = t;
    this.derivAt(dydt, y);
  }

  /** dy/dt of the state y at time `this.time[0]` into dydt. */
  derivAt(dydt: Float64Array, y: Float64Array): void {
    const t = this.time[0]!;
    this.evaluations++;
    const u = this.input;
    let id = y[0]!;
    let iq = y[1]!;
    const w = y[2]!;
    let vd: number;
    let vq: number;
    if (this.ab) {
      // cos/sin of the angle from those of the angle origin (see setAngleOrigin) and a short series
      // (inlined by the engine: the values stay in registers, nothing is boxed)
      const d = y[3]! - this.th0;
      let c: number;
      let s: number;
      if (d > -0.5 && d < 0.5) {
        const sd = sinSmallL(d);
        const cd = cosSmallL(d);
        c = this.c0 * cd - this.s0 * sd;
        s = this.s0 * cd + this.c0 * sd;
      } else {
        c = Math.cos(y[3]!);
        s = Math.sin(y[3]!);
      }
      vd = u[0]! * c + u[1]! * s;
      vq = -u[0]! * s + u[1]! * c;
    } else {
      vd = u[0]!;
      vq = u[1]!;
    }
    const we = this.p * w;
    const Ld = this.Ld;
    const Lq = this.Lq;
    let Te: number;
    if (this.lin) {
      // the constant-parameter closed form (fast path)
      dydt[0] = (vd - this.Rs * id + we * Lq * iq) * this.invLd;
      dydt[1] = (vq - this.Rs * iq - we * (Ld * id + this.psiM)) * this.invLq;
      Te = 1.5 * this.p * (this.psiM * iq + (Ld - Lq) * id * iq);
    } else if (this.fluxStates) {
      // flux states: y[0], y[1] are psi_d, psi_q; the currents from the model's inverse
      const cur = this.cur;
      Te = this.fluxDerivative(dydt, id, iq, we, vd, vq);
      id = cur[0]!;
      iq = cur[1]!;
    } else {
      this.currentDerivative(dydt, id, iq, we, vd, vq);
      Te = this.model.torque(id, iq);
    }
    if (this.free) {
      const TL = (this.segmented ? this.loadA + this.loadB * t : loadLevel(this.params.load, t)) + this.k2 * w * Math.abs(w);
      const Tc = this.Tc;
      const x = w * this.invW;
      dydt[2] = (Te - this.B * w - (Tc > 0 ? (Tc * x) / Math.sqrt(1 + x * x) : 0) - TL) * this.invJ;
    } else {
      dydt[2] = 0;
    }
    dydt[3] = we;
    dydt[4] = 1.5 * (vd * id + vq * iq);
  }

  /**
   * The generic path of di/dt for any machine model: the flux linkage psi(i) and its incremental
   * inductance L_inc = d psi / d i give  L_inc di/dt = v - Rs i - we J psi,  J psi = (-psi_q, psi_d)
   * (the rotor-frame voltage equation, Krause, Wasynczuk and Sudhoff (2002), Analysis of Electric
   * Machinery and Drive Systems, ch. 5); solved here by the 2x2 inverse. Writes dydt[0], dydt[1].
   */
  currentDerivative(dydt: Float64Array, id: number, iq: number, we: number, vd: number, vq: number): void {
    const psi = this.psi;
    const L = this.Linc;
    this.model.flux(id, iq, psi);
    this.model.incrementalInductance(id, iq, L);
    const rd = vd - this.Rs * id + we * psi[1]!;
    const rq = vq - this.Rs * iq - we * psi[0]!;
    const det = L[0]! * L[3]! - L[1]! * L[2]!;
    dydt[0] = (L[3]! * rd - L[1]! * rq) / det;
    dydt[1] = (L[0]! * rq - L[2]! * rd) / det;
  }

  /**
   * The flux-state path: d psi/dt = v - Rs i - we J psi with i = model.current(psi) (into this.cur;
   * a model with an iterative inverse starts from its last answer), Krause, Wasynczuk and Sudhoff
   * (2002), ch. 5. Writes dydt[0], dydt[1]; returns the torque 1.5 p (psi_d iq - psi_q id).
   */
  fluxDerivative(dydt: Float64Array, psid: number, psiq: number, we: number, vd: number, vq: number): number {
    const cur = this.cur;
    this.model.current(psid, psiq, cur);
    const id = cur[0]!, iq = cur[1]!;
    dydt[0] = vd - this.Rs * id + we * psiq;
    dydt[1] = vq - this.Rs * iq - we * psid;
    return 1.5 * this.p * (psid * iq - psiq * id);
  }

  /** Write the electrical states of the currents (id, iq) into y[0], y[1] (the flux linkages with flux states). */
  setCurrents(y: Float64Array, id: number, iq: number): void {
    if (!this.fluxStates) { y[0] = id; y[1] = iq; return; }
    const psi = this.psi;
    this.model.flux(id, iq, psi);
    y[0] = psi[0]!;
    y[1] = psi[1]!;
  }

  /**
   * The state y as the rest of the simulator reads it, into out: the currents in out[0], out[1]
   * (from the inverse with flux states), the other entries copied. Allocates nothing.
   */
  currentState(y: Float64Array, out: Float64Array): void {
    if (this.fluxStates) {
      const cur = this.cur;
      this.model.current(y[0]!, y[1]!, cur);
      out[0] = cur[0]!;
      out[1] = cur[1]!;
    } else {
      out[0] = y[0]!;
      out[1] = y[1]!;
    }
    for (let i = 2; i < STATE_SIZE; i++) out[i] = y[i]!;
  }

  /**
   * Set the angle near which the next derivative calls evaluate the rotation: within ±0.5 rad of it
   * cos and sin come from (cos, sin)(th0) and a series in the difference (truncation below 2e-14),
   * farther away from Math.cos / Math.sin. Saves two transcendental calls per evaluation.
   */
  setAngleOrigin(theta: number): void {
    this.th0 = theta;
    this.c0 = Math.cos(theta);
    this.s0 = Math.sin(theta);
  }

  /**
   * Fix the load level for an integration segment [t0, t1] that contains no breakpoint of the
   * schedule inside it: the level is linear there, taken from the segment's middle, so a step at
   * t1 does not leak into the last stage of the step that ends on it.
   */
  setLoadSegment(t0: number, t1: number): void {
    const s = this.params.load;
    const tm = 0.5 * (t0 + t1);
    const n = s.times.length;
    let slope = 0;
    if (tm < s.times[n - 1]!) {
      let i = 0;
      while (i < n - 2 && s.times[i + 1]! <= tm) i++;
      const dt = s.times[i + 1]! - s.times[i]!;
      slope = dt > 0 ? (s.levels[i + 1]! - s.levels[i]!) / dt : 0;
    }
    this.loadB = slope;
    this.loadA = loadLevel(s, tm) - slope * tm;
    this.segmented = true;
  }

  /** Electromagnetic torque of a state (flux linkages with flux states), N·m. */
  torque(y: Float64Array): number {
    if (this.fluxStates) {
      const cur = this.cur;
      this.model.current(y[0]!, y[1]!, cur);
      return 1.5 * this.p * (y[0]! * cur[1]! - y[1]! * cur[0]!);
    }
    const m = this.model.linear;
    if (!m) return this.model.torque(y[0]!, y[1]!);
    return 1.5 * this.p * (m.psiM * y[1]! + (m.Ld - m.Lq) * y[0]! * y[1]!);
  }

  /** Load torque at time t and speed omega_m, N·m. */
  loadTorque(t: number, w: number): number {
    return loadLevel(this.params.load, t) + this.params.load.quadraticK * w * Math.abs(w);
  }
}

export const DEFAULT_PLANT_OPTIONS = { mechanics: 'free', inputFrame: 'alpha-beta' } as const;
