/**
 * Integrating the plant over one control period, in place: a stepper takes the state at the period
 * start and leaves the state at its end. The period is split at the load schedule's breakpoints
 * (written once, in `Stepper.period`), so that no step straddles a jump, and the plant's load is
 * set once per piece (linear between two breakpoints). Two implementations:
 *
 * - `CashKarpStepper`: adaptive Cash-Karp Runge-Kutta (ode45-cash-karp), reset in place (t, dt) for
 *   each piece, tLimit = piece end, dtMaxMag = Ts; the error is relative per state with an absolute
 *   floor for near-zero states (`errorFloors`: currents or flux linkages), the energy state excluded from step control.
 *   Cash and Karp (1990), "A variable order Runge-Kutta method for initial value problems with
 *   rapidly varying right-hand sides", ACM TOMS 16(3).
 * - `Rk4Stepper`: classical fixed-step fourth-order Runge-Kutta, `rk4Substeps` steps per period
 *   (common practice, no source).
 *
 * Each stepper owns its scratch and its callbacks (no module-level state): runs may interleave.
 */
import ode45 from 'ode45-cash-karp';
import { STATE_SIZE as STATE_SIZE_, I_D, I_Q, OMEGA, THETA, ENERGY, nextLoadBreak } from './plant';
import type { MachineModel } from '../machine/machine-model';
import type { Plant } from './plant';
import type { AnySetup } from './simulation-setup';

// a module-local constant stays a plain number in every build
const STATE_SIZE: number = STATE_SIZE_;
/** Largest integration steps of one piece before the step size counts as collapsed. */
export const MAX_STEPS_PER_PIECE = 2000;

/** Thrown inside a period when the integrator needs more than MAX_STEPS_PER_PIECE steps for a piece. */
export class StepCollapse extends Error {}

/**
 * Absolute error floors per state (see DEFAULT_SOLVER_OPTIONS); Infinity = excluded from step control.
 * With flux states (see plant.ts; `fluxModel` is then the plant's model) the first two floors are
 * the current floor as a fraction of each axis's flux scale, the half swing
 * |psi(+Imax) - psi(-Imax)| / 2 along that axis (Ld·Imax and Lq·Imax for a linear model): the flux
 * the current floor amounts to through the apparent inductance.
 */
export function errorFloors(setup: AnySetup, fluxModel: MachineModel | null = null): Float64Array {
  const f = new Float64Array(STATE_SIZE);
  const s = setup.solver;
  if (fluxModel !== null) {
    const m = fluxModel;
    const a = new Float64Array(2), b = new Float64Array(2), I = setup.Imax;
    m.flux(I, 0, a);
    m.flux(-I, 0, b);
    f[I_D] = s.currentFloor * Math.abs(a[0]! - b[0]!) / 2;
    m.flux(0, I, a);
    m.flux(0, -I, b);
    f[I_Q] = s.currentFloor * Math.abs(a[1]! - b[1]!) / 2;
  } else {
    f[I_D] = s.currentFloor * setup.Imax;
    f[I_Q] = s.currentFloor * setup.Imax;
  }
  f[OMEGA] = s.speedFloor * (Number.isFinite(setup.divergenceSpeed_rad_s) ? setup.divergenceSpeed_rad_s / 3 : 100);
  f[THETA] = s.angleFloor;
  f[ENERGY] = Infinity;
  return f;
}

/** One control period of the plant, integrated in place, split at the load's breakpoints. */
export abstract class Stepper {
  /** the next load breakpoint after the current period start */
  private nextBreak = -Infinity;
  /** the breakpoint that ends the piece the plant's load segment was last set for */
  private segBreak = NaN;

  /**
   * the period [span[0], span[1]] `integrate` works on, and the piece [span[2], span[3]] `piece`
   * works on: the times cross the (virtual, not inlined) calls in an array, never boxed
   */
  protected readonly span = new Float64Array(4);

  /** the control period, s (starts as a number: a parameter property starts undefined, and its loads then check for a boxed number) */
  protected readonly Ts: number = NaN;

  constructor(protected readonly plant: Plant, Ts: number) {
    this.Ts = Ts;
  }

  /** Integrate y from t0 to t1 in place (throws StepCollapse, or the library's error on a non-finite error estimate). */
  period(y: Float64Array, t0: number, t1: number): void {
    const span = this.span;
    span[0] = t0;
    span[1] = t1;
    this.integrate(y);
  }

  /** `period` over [span[0], span[1]]: split at the load's breakpoints, each piece to `piece`. */
  protected integrate(y: Float64Array): void {
    const span = this.span;
    const t0 = span[0]!, t1 = span[1]!;
    const plant = this.plant;
    const load = plant.params.load;
    const Ts = this.Ts;
    const nb = this.nextBreak;
    if (t0 < nb && !(nb < t1 - 1e-9 * Ts) && nb === this.segBreak) {
      // the common case, one piece with the plant's load already set (what the loop below does
      // then; its times carried round the loop across the call were boxed)
      span[2] = t0;
      span[3] = t1;
      this.piece(y);
      return;
    }
    if (t0 >= this.nextBreak) this.nextBreak = nextLoadBreak(load, t0);
    let tb = this.nextBreak;
    let tStart = t0;
    for (let seg = 0; seg < 8; seg++) {
      const tEnd = tb < t1 - 1e-9 * Ts ? tb : t1;
      // the load is linear between two breakpoints: set it once per piece (the piece ending at tb)
      if (tb !== this.segBreak) { plant.setLoadSegment(tStart, tEnd); this.segBreak = tb; }
      span[2] = tStart;
      span[3] = tEnd;
      this.piece(y);
      if (tEnd >= t1) break;
      tStart = tEnd;
      tb = nextLoadBreak(load, tEnd);
    }
  }

  /** Integrate y over [span[2], span[3]], a piece with no load breakpoint inside. */
  protected abstract piece(y: Float64Array): void;
}

/**
 * The integrator with the run's plant and error floors attached: the library calls the derivative
 * and the error scale as its own methods, so the functions below (one for every run, so the engine
 * can inline them) read the run's state through `this`, and nothing is shared between runs.
 */
type Integrator = ReturnType<typeof ode45> & { plant: Plant; floors: Float64Array };

function plantDeriv(this: Integrator, dydt: Float64Array, y: Float64Array, t: number): void {
  const pl = this.plant;
  pl.time[0] = t; // through a typed array: t would be boxed as an argument of the call below
  pl.derivAt(dydt, y);
}

/** error scale |y| + |dt·dy/dt| plus an absolute floor per state (ode45-cash-karp's default has none) */
function floorErrorScale(this: Integrator, i: number, dt: number, y: number, dydt: number): number {
  return this.floors[i]! + Math.abs(y) + Math.abs(dt * dydt);
}

export class CashKarpStepper extends Stepper {
  private readonly integ: Integrator;
  constructor(plant: Plant, Ts: number, y: Float64Array, tol: number, floors: Float64Array) {
    super(plant, Ts);
    const integ = ode45(y, plantDeriv as never, 0, Ts, {
      tol,
      dtMaxMag: Ts,
      // a floor on the step: the library's rejection loop shrinks the step by at least 0.9 per try,
      // so it ends within ~260 tries even if the error never falls (then the period diverges)
      dtMinMag: Ts * 1e-12,
      errorScaleFunction: floorErrorScale as never,
      errorReduceFunction: maxReduce,
      verbose: false,
    }) as Integrator;
    integ.plant = plant;
    integ.floors = floors;
    this.integ = integ;
  }

  /** The integrator works on the array it was created with: `y` must be that array. */
  protected piece(): void {
    const tStart = this.span[2]!, tEnd = this.span[3]!;
    const integ = this.integ;
    const Ts = this.Ts;
    integ.t = tStart;
    integ.dt = tEnd - tStart < Ts ? tEnd - tStart : Ts;
    let g = 0;
    while (g++ < MAX_STEPS_PER_PIECE && integ.step(tEnd)) { /* steps until the piece end */ }
    if (g >= MAX_STEPS_PER_PIECE) throw new StepCollapse();
    integ.t = tEnd;
  }
}

function maxReduce(_i: number, acc: number, e: number): number {
  const a = e < 0 ? -e : e;
  return a > acc ? a : acc;
}

/** Fixed-step classical RK4, `substeps` steps per control period, in place with preallocated scratch. */
export class Rk4Stepper extends Stepper {
  private readonly k1 = new Float64Array(STATE_SIZE);
  private readonly k2 = new Float64Array(STATE_SIZE);
  private readonly k3 = new Float64Array(STATE_SIZE);
  private readonly k4 = new Float64Array(STATE_SIZE);
  private readonly w = new Float64Array(STATE_SIZE);
  constructor(plant: Plant, Ts: number, private readonly substeps: number) {
    super(plant, Ts);
  }

  protected piece(y: Float64Array): void {
    const tStart = this.span[2]!, tEnd = this.span[3]!;
    this.run(y, tStart, tEnd, Math.max(1, Math.round((this.substeps * (tEnd - tStart)) / this.Ts)));
  }

  /**
   * One classical RK4 step over [a, b] in place (the plant's load set for it), its last stage at b
   * itself: the switching model's piece where its closed form declines (switching-period.ts).
   */
  single(y: Float64Array, a: number, b: number): void {
    const plant = this.plant;
    const time = plant.time;
    const { k1, k2, k3, k4, w } = this;
    const h = b - a;
    time[0] = a;
    plant.derivAt(k1, y);
    for (let i = 0; i < STATE_SIZE; i++) w[i] = y[i]! + 0.5 * h * k1[i]!;
    time[0] = a + 0.5 * h;
    plant.derivAt(k2, w);
    for (let i = 0; i < STATE_SIZE; i++) w[i] = y[i]! + 0.5 * h * k2[i]!;
    plant.derivAt(k3, w);
    for (let i = 0; i < STATE_SIZE; i++) w[i] = y[i]! + h * k3[i]!;
    time[0] = b;
    plant.derivAt(k4, w);
    for (let i = 0; i < STATE_SIZE; i++) y[i] = y[i]! + (h / 6) * (k1[i]! + 2 * k2[i]! + 2 * k3[i]! + k4[i]!);
  }

  /** n classical RK4 steps over [t0, t1] in place. */
  run(y: Float64Array, t0: number, t1: number, n: number): void {
    const h = (t1 - t0) / n;
    const { k1, k2, k3, k4, w, plant } = this;
    // the time goes through the plant's typed array (see Plant.time): no boxed argument
    const time = plant.time;
    for (let s = 0; s < n; s++) {
      const t = t0 + s * h;
      time[0] = t;
      plant.derivAt(k1, y);
      for (let i = 0; i < STATE_SIZE; i++) w[i] = y[i]! + 0.5 * h * k1[i]!;
      time[0] = t + 0.5 * h;
      plant.derivAt(k2, w);
      for (let i = 0; i < STATE_SIZE; i++) w[i] = y[i]! + 0.5 * h * k2[i]!;
      time[0] = t + 0.5 * h;
      plant.derivAt(k3, w);
      for (let i = 0; i < STATE_SIZE; i++) w[i] = y[i]! + h * k3[i]!;
      time[0] = t + h;
      plant.derivAt(k4, w);
      for (let i = 0; i < STATE_SIZE; i++) y[i] = y[i]! + (h / 6) * (k1[i]! + 2 * k2[i]! + 2 * k3[i]! + k4[i]!);
    }
  }
}

/** The stepper of a setup's solver options, integrating `y` (the run's state array). */
export function makeStepper(setup: AnySetup, plant: Plant, y: Float64Array): Stepper {
  const Ts = setup.controller.Ts;
  return setup.solver.method === 'cash-karp'
    ? new CashKarpStepper(plant, Ts, y, setup.solver.tol, errorFloors(setup, plant.fluxStates ? plant.model : null))
    : new Rk4Stepper(plant, Ts, Math.max(1, Math.round(setup.solver.rk4Substeps)));
}
