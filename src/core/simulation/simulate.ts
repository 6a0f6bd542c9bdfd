/**
 * The cascade simulator: the dq plant (plant.ts) integrated period by period with the Cash-Karp
 * adaptive Runge-Kutta method (ode45-cash-karp), under the digital controller (controller.ts).
 *
 * Each control period [t_k, t_k + Ts]: the controller samples the state at t_k and returns the
 * alpha-beta voltage to hold over the period (its command of `delaySamples` periods before); the
 * integrator is reset in place (t, dt) and integrates to the period end with tLimit = period end
 * and dtMaxMag = Ts, splitting at load-schedule breakpoints so that no step straddles a jump.
 * The error is relative per state with an absolute floor for near-zero states (currents,
 * speed, angle), see `errorFloors`; the energy state is excluded from step control.
 *
 * The run stops with a diagnostic on divergence (a non-finite state, |i| > 20·Imax, |omega| above
 * the divergence speed, or a step-size collapse), on the step or wall-time budget, or when the
 * abort signal is raised (checked every `CHECK_EVERY` periods). A sample of every channel is
 * taken at every period start (and at the end) and fed at once to a streaming min/max decimator
 * sized from the number of periods and `maxPoints`, and to streaming trackers of the metrics that
 * need full-rate samples, so the memory of a run does not grow with its length.
 */
import ode45 from 'ode45-cash-karp';
import type { DqMachine } from '../machine/dq-machine';
import type { DriveLimits } from '../drive/inverter-spec';
import type { Finding } from '../base/finding';
import { limitField } from '../drive/current-limits';
import { InputError } from '../base/errors';
import { Plant, STATE_SIZE as STATE_SIZE_, I_D as I_D_, I_Q as I_Q_, OMEGA as OMEGA_, THETA as THETA_, ENERGY as ENERGY_, loadSchedule, loadLevel, nextLoadBreak, coulombWidth } from './plant';
import type { PlantParams } from './plant';
import { CascadeController, stepSchedule, voltageLimitAt, DEFAULT_CONTROLLER_OPTIONS } from '../control/controller';
import type { ControllerConfig, VoltageLimitSpec, AntiWindup, ControlMode } from '../control/controller';
import { buildReferenceTable, torqueLimitsAt } from '../control/reference-table';
import { safetyReport } from '../steady-state/safety';
import type { ReferenceTable } from '../control/reference-table';
import { tuneLoops, tuningInputFromProject } from '../control/tuning';
import type { TuningReport } from '../control/tuning';
import { StreamingMinMax, DEFAULT_MAX_POINTS, MAX_TRACE_POINTS } from './decimate';
import { StepResponseTracker, LoadStepTracker, SteadyStateTracker, finiteOrNull } from './metrics';
import { effectiveBus } from '../drive/inverter';
import type { ResolvedProject } from '../project/project';
import { RAD_S_TO_RPM, RPM_TO_RAD_S } from '../base/units';

const TWO_PI = 2 * Math.PI;
const SQRT3_2 = Math.sqrt(3) / 2;
const CHECK_EVERY = 256;
const OSC_WINDOW = 64;
const OSC_LIMIT = 16;
/**
 * Speed-loop watch: the torque reference clamped at the motoring limit, then at the generating
 * limit, and back, SWING_LIMIT times with each swing within SWING_GAP_S of the one before, is a
 * speed loop oscillating between the torque limits (a stable loop meets the opposite limit at most
 * once or twice after a large step).
 */
const SWING_LIMIT = 8;
const SWING_GAP_S = 1;
// local copies of the state indices: module-local constants stay plain numbers in every build
const STATE_SIZE: number = STATE_SIZE_;
const I_D: number = I_D_;
const I_Q: number = I_Q_;
const OMEGA: number = OMEGA_;
const THETA: number = THETA_;
const ENERGY: number = ENERGY_;
// the same for the unit factor read every period (a CommonJS build turns an imported binding into
// a property getter called at each use)
const W_TO_RPM: number = RAD_S_TO_RPM;

export interface SolverOptions {
  /** 'cash-karp': adaptive ode45-cash-karp; 'rk4': classical fixed-step RK4 (baseline) */
  method: 'cash-karp' | 'rk4';
  /** Cash-Karp error tolerance (relative, with the floors below) */
  tol: number;
  /** RK4 steps per control period */
  rk4Substeps: number;
  /** absolute error floor of the currents, as a fraction of Imax */
  currentFloor: number;
  /** absolute error floor of the speed, as a fraction of the divergence speed / 3 */
  speedFloor: number;
  /** absolute error floor of the electrical angle, rad */
  angleFloor: number;
}

export const DEFAULT_SOLVER_OPTIONS: Readonly<SolverOptions> = {
  method: 'cash-karp',
  tol: 1e-6,
  rk4Substeps: 1,
  currentFloor: 1e-3,
  speedFloor: 1e-3,
  angleFloor: 1,
};

/** Overcurrent trip of `simulationFromProject`, in units of Imax. */
export const DEFAULT_TRIP_FACTOR = 3;

export interface ScenarioMarks {
  /** speed reference steps, rad/s (for the step metrics) */
  speedSteps: Array<{ t: number; v: number }>;
  /** times of load events (steps and ramp starts), s */
  loadEvents: number[];
}

export interface SimulationSetup {
  plant: PlantParams;
  controller: ControllerConfig;
  duration_s: number;
  initialSpeed_rad_s: number;
  initialTheta_rad: number;
  solver: SolverOptions;
  /** peak current limit, A (divergence at 20x): the effective limit, the weaker of motor and inverter */
  Imax: number;
  /** the field of the rating that sets Imax, e.g. "inverter.Imax" or "motor.peakCurrent" (default "inverter.Imax") */
  currentLimitField?: string;
  /**
   * overcurrent trip, A: |i_dq| above it stops the run as a divergence, as a drive's hardware trip
   * would (a saturated unstable loop settles into a bounded limit cycle that 20·Imax never sees)
   */
  tripCurrent_A: number;
  /** |omega_m| above which the run is stopped as diverged, rad/s */
  divergenceSpeed_rad_s: number;
  /** |omega_m| above which an overspeed event is recorded, rad/s */
  overspeed_rad_s: number;
  marks: ScenarioMarks;
  /** the tuning the gains came from (null when a test built the setup by hand) */
  tuning: TuningReport | null;
  /** what the scenario asks that the motor or the drive cannot give, found before the run (see `scenarioFindings`) */
  findings?: Finding[];
}

export interface RunOptions {
  signal?: { readonly aborted: boolean };
  onProgress?: (fraction: number) => void;
  /** largest trace length per channel (default 5000, at most MAX_TRACE_POINTS = 200 000) */
  maxPoints?: number;
  /** wall-time budget, s (default 60) */
  wallBudget_s?: number;
  /** control-period budget (default 2 000 000) */
  maxSteps?: number;
  /** wall clock in seconds (default: globalThis.performance.now or Date.now) */
  clock?: () => number;
  /** periods between two closings of an event interval before it is split (default 20) */
  eventMergeGap?: number;
}

export const DEFAULT_RUN_OPTIONS = { maxPoints: DEFAULT_MAX_POINTS, wallBudget_s: 60, maxSteps: 2_000_000, eventMergeGap: 20 };

export type EventKind = 'current-limit' | 'voltage-saturation' | 'overspeed' | 'divergence' | 'aborted' | 'budget';

export interface SimulationEvent {
  kind: EventKind;
  t_s: number;
  tEnd_s?: number;
  message: string;
}

export interface SimulationMetrics {
  finalSpeed_rpm: number | null;
  speedOvershoot_pct: number | null;
  riseTime_s: number | null;
  settlingTime_s: number | null;
  loadStepDip_rpm: number | null;
  loadStepRecovery_s: number | null;
  /** largest |i_dq| = peak phase current amplitude, A */
  peakCurrent_A: number | null;
  /** rms phase current over the run, A rms */
  rmsCurrent_A: number | null;
  voltageSaturation_s: number | null;
  energyFromBus_J: number | null;
  steadyStateError_rpm: number | null;
}

export const TRACE_NAMES = [
  't_s', 'speedRef_rpm', 'speed_rpm', 'torque_Nm', 'loadTorque_Nm', 'idRef_A', 'iqRef_A', 'id_A', 'iq_A',
  'vd_V', 'vq_V', 'vNorm', 'ia_A', 'ib_A', 'ic_A', 'pDc_W',
] as const;
export type TraceName = (typeof TRACE_NAMES)[number];
export type Traces = Record<TraceName, Float64Array>;

export interface SimulationStats {
  controlSteps: number;
  rhsEvaluations: number;
  /** median derivative evaluations per control period */
  evaluationsPerPeriod: number;
  wall_s: number;
}

/** One load event's disturbance response (speed mode): dip and recovery, or null when the loop had not settled at it. */
export interface LoadStepResult {
  t_s: number;
  dip_rpm: number | null;
  recovery_s: number | null;
  /** |speed reference - speed| when the load came, rpm */
  errorAtStep_rpm: number | null;
  /** the speed was within 2 % of the reference (at least 1 rpm) when the load came */
  settled: boolean;
}

/** A load step is read only from a settled speed: within SETTLED_FRACTION of the reference, and at least this, rpm. */
const SETTLED_FLOOR_RPM = 1;

/** When the largest current came, and what the controller asked for then. */
export interface PeakCurrentDetail {
  /** time of the peak sample, s */
  t_s: number;
  /** |i_dq reference| at that sample, A peak */
  reference_A: number;
  /** time since the voltage vector was last at the modulation limit, s (Infinity: never before) */
  sinceVoltageLimit_s: number;
}

export interface SimulationResult {
  metrics: SimulationMetrics;
  /** the sample of the largest current (absent when the run recorded none) */
  peakCurrentAt?: PeakCurrentDetail;
  /** every load step and ramp start, in time order (the metrics' loadStep* keys are the first) */
  loadSteps: LoadStepResult[];
  traces: Traces;
  events: SimulationEvent[];
  stats: SimulationStats;
  diagnostic?: string;
}

function defaultClock(): () => number {
  const perf = (globalThis as unknown as { performance?: { now(): number } }).performance;
  if (perf && typeof perf.now === 'function') return () => perf.now() / 1000;
  return () => Date.now() / 1000;
}

/** Absolute error floors per state (see DEFAULT_SOLVER_OPTIONS); Infinity = excluded from step control. */
export function errorFloors(setup: SimulationSetup): Float64Array {
  const f = new Float64Array(STATE_SIZE);
  const s = setup.solver;
  f[I_D] = s.currentFloor * setup.Imax;
  f[I_Q] = s.currentFloor * setup.Imax;
  f[OMEGA] = s.speedFloor * (Number.isFinite(setup.divergenceSpeed_rad_s) ? setup.divergenceSpeed_rad_s / 3 : 100);
  f[THETA] = s.angleFloor;
  f[ENERGY] = Infinity;
  return f;
}

/** Fixed-step classical RK4 over [t0, t0 + h·n] in place, with preallocated scratch. */
class Rk4 {
  private readonly k1 = new Float64Array(STATE_SIZE);
  private readonly k2 = new Float64Array(STATE_SIZE);
  private readonly k3 = new Float64Array(STATE_SIZE);
  private readonly k4 = new Float64Array(STATE_SIZE);
  private readonly w = new Float64Array(STATE_SIZE);
  constructor(private readonly f: (d: Float64Array, y: Float64Array, t: number) => void) {}
  run(y: Float64Array, t0: number, t1: number, n: number): void {
    const h = (t1 - t0) / n;
    const { k1, k2, k3, k4, w, f } = this;
    for (let s = 0; s < n; s++) {
      const t = t0 + s * h;
      f(k1, y, t);
      for (let i = 0; i < STATE_SIZE; i++) w[i] = y[i]! + 0.5 * h * k1[i]!;
      f(k2, w, t + 0.5 * h);
      for (let i = 0; i < STATE_SIZE; i++) w[i] = y[i]! + 0.5 * h * k2[i]!;
      f(k3, w, t + 0.5 * h);
      for (let i = 0; i < STATE_SIZE; i++) w[i] = y[i]! + h * k3[i]!;
      f(k4, w, t + h);
      for (let i = 0; i < STATE_SIZE; i++) y[i] = y[i]! + (h / 6) * (k1[i]! + 2 * k2[i]! + 2 * k3[i]! + k4[i]!);
    }
  }
}

// The derivative and error-scale callbacks handed to the integrator: module-level functions that
// read the running simulation's plant and floors (runSimulation is synchronous; it saves and
// restores them, so a nested run from a progress callback is safe).
/** Thrown inside a period when the integrator needs more than 2000 steps for it. */
class StepCollapse extends Error {}

let activePlant: Plant | null = null;
let activeFloors: Float64Array = new Float64Array(STATE_SIZE_);
function plantDeriv(dydt: Float64Array, y: Float64Array, t: number): void {
  const pl = activePlant!;
  pl.time[0] = t; // through a typed array: t would be boxed as an argument of the call below
  pl.derivAt(dydt, y);
}
/** error scale |y| + |dt·dy/dt| plus an absolute floor per state (ode45-cash-karp's default has none) */
function floorErrorScale(i: number, dt: number, y: number, dydt: number): number {
  return activeFloors[i]! + Math.abs(y) + Math.abs(dt * dydt);
}
function maxReduce(_i: number, acc: number, e: number): number {
  const a = e < 0 ? -e : e;
  return a > acc ? a : acc;
}

function median(hist: Uint32Array): number {
  let total = 0;
  for (let i = 0; i < hist.length; i++) total += hist[i]!;
  if (total === 0) return 0;
  let acc = 0;
  for (let i = 0; i < hist.length; i++) {
    acc += hist[i]!;
    if (acc * 2 >= total) return i;
  }
  return hist.length - 1;
}

export function runSimulation(setup: SimulationSetup, opts: RunOptions = {}): SimulationResult {
  const o = { ...DEFAULT_RUN_OPTIONS, ...opts };
  const clock = opts.clock ?? defaultClock();
  const wall0 = clock();
  const Ts = setup.controller.Ts;
  if (!(Ts > 0) || !Number.isFinite(Ts)) throw new InputError('control.fCtrl_Hz', 'must be > 0 Hz');
  if (!(setup.duration_s > 0) || !Number.isFinite(setup.duration_s)) throw new InputError('scenario.duration_s', 'must be > 0 s');
  if (!(Number.isInteger(o.maxPoints) && o.maxPoints >= 2 && o.maxPoints <= MAX_TRACE_POINTS)) throw new InputError('maxPoints', `must be a whole number in 2..${MAX_TRACE_POINTS} (got ${o.maxPoints})`);
  const events: SimulationEvent[] = [];
  let diagnostic: string | undefined;
  const Nwanted = Math.max(1, Math.round(setup.duration_s / Ts));
  let N = Nwanted;
  if (N > o.maxSteps) {
    N = Math.max(1, Math.floor(o.maxSteps));
    events.push({ kind: 'budget', t_s: N * Ts, message: `the run needs ${Nwanted} control periods; the step budget is ${N}: simulated ${(N * Ts).toPrecision(4)} s of ${setup.duration_s} s` });
    diagnostic = `stopped at the step budget (${N} control periods)`;
  }

  const plant = new Plant(setup.plant);
  const ctrl = new CascadeController(setup.controller);
  const y = new Float64Array(STATE_SIZE);
  y[OMEGA] = setup.plant.mechanics === 'locked' ? setup.initialSpeed_rad_s : setup.initialSpeed_rad_s;
  y[THETA] = setup.initialTheta_rad;
  ctrl.reset(y[OMEGA]!, y[THETA]!);
  const floors = errorFloors(setup);
  const useCk = setup.solver.method === 'cash-karp';
  // module-level call targets (the same functions for every run, so the engine can inline them)
  const prevPlant = activePlant;
  const prevFloors = activeFloors;
  activePlant = plant;
  activeFloors = floors;
  const integ = useCk
    ? ode45(y, plantDeriv as never, 0, Ts, {
        tol: setup.solver.tol,
        dtMaxMag: Ts,
        // a floor on the step: the library's rejection loop shrinks the step by at least 0.9 per try,
        // so it ends within ~260 tries even if the error never falls (then the period diverges below)
        dtMinMag: Ts * 1e-12,
        errorScaleFunction: floorErrorScale,
        errorReduceFunction: maxReduce,
        verbose: false,
      })
    : null;
  const rk4 = useCk ? null : new Rk4(plantDeriv);
  const sub = Math.max(1, Math.round(setup.solver.rk4Substeps));

  // traces: a sample at every period start plus the end, fed to a streaming min/max decimator
  // (bounded memory: one bucket of samples, and the output) and to the metrics that need the
  // full-rate samples (streaming trackers, exact)
  const cap = N + 1;
  const NCH = TRACE_NAMES.length - 1;
  const dec = new StreamingMinMax(NCH, cap, o.maxPoints);
  const row = new Float64Array(NCH);
  const mode = setup.controller.mode;
  const marks = setup.marks;
  const allEvents = [...marks.speedSteps.map((s) => s.t), ...marks.loadEvents].sort((a, b) => a - b);
  const nextAfter = (t: number): number => {
    for (const x of allEvents) if (x > t + 1e-12) return x;
    return Infinity;
  };
  const speedMode = mode === 'speed';
  const s0Mark = marks.speedSteps[0];
  const stepTrk = speedMode && s0Mark
    ? new StepResponseTracker(s0Mark.t, nextAfter(s0Mark.t), scheduleBefore(marks.speedSteps, s0Mark.t, setup.initialSpeed_rad_s) * RAD_S_TO_RPM, s0Mark.v * RAD_S_TO_RPM)
    : null;
  // one tracker per load event; their windows [t, next event) do not overlap, so only the current one is fed
  const loadTrks = speedMode ? marks.loadEvents.map((t) => new LoadStepTracker(t, nextAfter(t), undefined, 64, SETTLED_FLOOR_RPM)) : [];
  let loadAt = 0;
  // the steady-state window is 5 % of the run (or 2 periods): the ring holds a little more
  const sseTrk = speedMode ? new SteadyStateTracker(Math.ceil(0.05 * cap) + 8) : null;
  // the last recorded sample [t, speed rpm, id, iq] (a typed array: a double captured by the
  // record closure and written every period would be boxed)
  const last = new Float64Array(4);
  /** the sample handed to the metric trackers: [t, speed reference rpm, speed rpm] */
  const msmp = new Float64Array(3);
  const hist = new Uint32Array(1025);
  const vab = plant.input;
  const Imax = setup.Imax;
  const iDivA = Math.min(20 * Imax, setup.tripCurrent_A);
  const iDiv2 = iDivA * iDivA;
  const wDiv = setup.divergenceSpeed_rad_s;
  const wOver = setup.overspeed_rad_s;
  const vspec = setup.controller.voltage;
  const circle = vspec.shape === 'circle';
  const locked = setup.plant.mechanics !== 'free';
  const p = setup.plant.machine.polePairs;
  const psiM = setup.plant.machine.psiM;
  const dLdq = setup.plant.machine.Ld - setup.plant.machine.Lq;
  const load = setup.plant.load;
  const gap = Math.max(1, Math.floor(o.eventMergeGap));

  let peakI2 = 0;
  let peakT = 0, peakRef2 = 0, peakSinceSat = Infinity, lastSatT = -Infinity;
  let sumI2 = 0;
  let satPeriods = 0;
  let curStart = -1, curOff = 0, satStart = -1, satOff = 0, overStart = -1;
  let curCount = 0, satCount = 0;
  const MAX_INTERVALS = 200;
  const closeInterval = (kind: EventKind, t0: number, t1: number, count: number): void => {
    if (count < MAX_INTERVALS) {
      events.push({
        kind, t_s: t0, tEnd_s: t1,
        message: kind === 'current-limit'
          ? 'current reference at the drive limit (Imax, or the torque the voltage allows at this speed)'
          : 'voltage vector at the modulation limit (the current loop has lost authority)',
      });
    } else if (count === MAX_INTERVALS) {
      events.push({ kind, t_s: t0, message: `more than ${MAX_INTERVALS} intervals; the rest are not listed` });
    }
  };

  // oscillation watch: sign changes of a current error larger than 5 % of Imax over the last
  // OSC_WINDOW periods; OSC_LIMIT of them means an unstable (saturated, bounded) current loop
  const oscRing = new Uint8Array(OSC_WINDOW);
  let oscSum = 0;
  // speed-loop watch (see SWING_LIMIT)
  let swingSide = 0;
  let swingAt = -Infinity;
  let swings = 0;
  const watchSwings = setup.controller.mode === 'speed';
  let prevEd = 0, prevEq = 0;
  const eMin = 0.05 * Imax;

  // the next load breakpoint after the current period start, and the breakpoint that ends the
  // piece the plant's load segment was last set for
  let nextBreak = -Infinity;
  let segBreak = NaN;
  let k = 0;
  let nRec = 0;
  let stopped = false;
  const record = (idx: number): void => {
    const t = idx * Ts;
    const id = y[I_D]!, iq = y[I_Q]!, w = y[OMEGA]!, th = y[THETA]!;
    // cos/sin of the angle: set by the caller with plant.setAngleOrigin(th) (the period integrated
    // next starts there; the same cos/sin serve the controller's inverse Park and this record)
    const c = plant.c0, s = plant.s0;
    const ia = id * c - iq * s;
    const ib = id * s + iq * c;
    const wr = ctrl.speedRefOut * W_TO_RPM;
    const wRpm = w * W_TO_RPM;
    row[0] = wr;
    row[1] = wRpm;
    row[2] = 1.5 * p * (psiM * iq + dLdq * id * iq);
    row[3] = locked ? 0 : plant.loadTorque(t, w);
    row[4] = ctrl.idRef;
    row[5] = ctrl.iqRef;
    row[6] = id;
    row[7] = iq;
    // applied voltage in dq at the mid-period angle
    const dm = 0.5 * p * w * Ts;
    let cm: number, sm: number;
    if (dm > -0.5 && dm < 0.5) {
      // rotate (c, s) by dm with the plant's polynomials for sin and cos (see Plant.derivAt; truncation
      // below 2e-14), written out: no call, no boxed result
      const x = dm * dm;
      const sd = dm * (1 + x * (-1 / 6 + x * (1 / 120 + x * (-1 / 5040 + x * (1 / 362880 + x * (-1 / 39916800))))));
      const cd = 1 + x * (-1 / 2 + x * (1 / 24 + x * (-1 / 720 + x * (1 / 40320 + x * (-1 / 3628800 + x * (1 / 479001600))))));
      cm = c * cd - s * sd;
      sm = s * cd + c * sd;
    } else {
      cm = Math.cos(th + dm);
      sm = Math.sin(th + dm);
    }
    const va = vab[0]!, vb = vab[1]!;
    row[8] = va * cm + vb * sm;
    row[9] = -va * sm + vb * cm;
    const vlen = Math.sqrt(va * va + vb * vb);
    row[10] = vlen / (circle ? vspec.radius : voltageLimitAt(vspec, Math.atan2(vb, va)));
    row[11] = ia;
    row[12] = -0.5 * ia + SQRT3_2 * ib;
    row[13] = -0.5 * ia - SQRT3_2 * ib;
    row[14] = 1.5 * (va * ia + vb * ib);
    dec.push(t, row);
    msmp[0] = t; msmp[1] = wr; msmp[2] = wRpm;
    if (stepTrk) stepTrk.take(msmp);
    while (loadAt < loadTrks.length && !(t < loadTrks[loadAt]!.tEnd)) loadAt++;
    if (loadAt < loadTrks.length) loadTrks[loadAt]!.take(msmp);
    if (sseTrk) sseTrk.take(msmp);
    last[0] = t; last[1] = wRpm; last[2] = id; last[3] = iq;
  };

  for (k = 0; k < N; k++) {
    const t0 = k * Ts;
    const t1 = (k + 1) * Ts;
    const smp = ctrl.sample;
    const th0 = y[THETA]!;
    plant.setAngleOrigin(th0);
    smp[0] = t0; smp[1] = y[I_D]!; smp[2] = y[I_Q]!; smp[3] = y[OMEGA]!; smp[4] = th0; smp[5] = plant.c0; smp[6] = plant.s0;
    ctrl.stepSampled(vab);
    record(k);
    nRec = k + 1;
    const i2 = y[I_D]! * y[I_D]! + y[I_Q]! * y[I_Q]!;
    sumI2 += i2;
    // event intervals
    if (ctrl.currentLimited) { if (curStart < 0) curStart = t0; curOff = 0; }
    else if (curStart >= 0 && ++curOff >= gap) { closeInterval('current-limit', curStart, t0 - (gap - 1) * Ts, curCount++); curStart = -1; }
    if (ctrl.voltageSaturated) { satPeriods++; lastSatT = t0; if (satStart < 0) satStart = t0; satOff = 0; }
    else if (satStart >= 0 && ++satOff >= gap) { closeInterval('voltage-saturation', satStart, t0 - (gap - 1) * Ts, satCount++); satStart = -1; }
    // the peak current, when it came, the reference then and how long after the voltage limit let go
    if (i2 > peakI2) {
      peakI2 = i2;
      peakT = t0;
      peakRef2 = ctrl.idRef * ctrl.idRef + ctrl.iqRef * ctrl.iqRef;
      peakSinceSat = t0 - lastSatT;
    }
    const wabs = Math.abs(y[OMEGA]!);
    if (wabs > wOver) { if (overStart < 0) overStart = t0; }
    else if (overStart >= 0) {
      events.push({ kind: 'overspeed', t_s: overStart, tEnd_s: t0, message: `speed above ${(wOver * RAD_S_TO_RPM).toPrecision(4)} rpm` });
      overStart = -1;
    }

    const ed = ctrl.idRef - y[I_D]!, eq = ctrl.iqRef - y[I_Q]!;
    const flip = ((ed > eMin && prevEd < -eMin) || (ed < -eMin && prevEd > eMin) || (eq > eMin && prevEq < -eMin) || (eq < -eMin && prevEq > eMin)) ? 1 : 0;
    if (ed > eMin || ed < -eMin) prevEd = ed;
    if (eq > eMin || eq < -eMin) prevEq = eq;
    const slotO = k % OSC_WINDOW;
    oscSum += flip - oscRing[slotO]!;
    oscRing[slotO] = flip;
    if (oscSum >= OSC_LIMIT) {
      diagnostic = `diverged at t = ${t0.toPrecision(6)} s: the current loop oscillates (${oscSum} reversals of a current error above 5 % of Imax in ${OSC_WINDOW} periods; unstable gains held bounded by the voltage limit); state id = ${y[I_D]!.toPrecision(6)} A, iq = ${y[I_Q]!.toPrecision(6)} A, speed = ${(y[OMEGA]! * RAD_S_TO_RPM).toPrecision(6)} rpm`;
      events.push({ kind: 'divergence', t_s: t0, message: diagnostic });
      stopped = true;
      k++;
      break;
    }

    if (watchSwings && ctrl.torqueClamped) {
      const side = ctrl.torqueRef > 0 ? 1 : -1;
      if (side !== swingSide) {
        swings = swingSide !== 0 && t0 - swingAt <= SWING_GAP_S ? swings + 1 : 0;
        swingSide = side;
        swingAt = t0;
        if (swings >= SWING_LIMIT) {
          diagnostic = `diverged at t = ${t0.toPrecision(6)} s: the speed loop oscillates (the torque reference swung between the motoring and the generating limit ${swings} times, each within ${SWING_GAP_S} s of the last); state id = ${y[I_D]!.toPrecision(6)} A, iq = ${y[I_Q]!.toPrecision(6)} A, speed = ${(y[OMEGA]! * RAD_S_TO_RPM).toPrecision(6)} rpm, reference ${(ctrl.speedRefOut * RAD_S_TO_RPM).toPrecision(6)} rpm (lower the speed gains, or check the inertia)`;
          events.push({ kind: 'divergence', t_s: t0, message: diagnostic });
          stopped = true;
          k++;
          break;
        }
      }
    }

    // integrate the period
    const e0 = plant.evaluations;
    try {
      if (integ) {
        if (t0 >= nextBreak) nextBreak = nextLoadBreak(load, t0);
        let tb = nextBreak;
        let seg = 0;
        let tStart = t0;
        while (seg++ < 8) {
          const tEnd = tb < t1 - 1e-9 * Ts ? tb : t1;
          // the load is linear between two breakpoints: set it once per piece (the piece ending at tb)
          if (tb !== segBreak) { plant.setLoadSegment(tStart, tEnd); segBreak = tb; }
          integ.t = tStart;
          integ.dt = tEnd - tStart < Ts ? tEnd - tStart : Ts;
          let g = 0;
          while (g++ < 2000 && integ.step(tEnd)) { /* steps until the segment end */ }
          if (g >= 2000) throw new StepCollapse();
          integ.t = tEnd;
          if (tEnd >= t1) break;
          tStart = tEnd;
          tb = nextLoadBreak(load, tEnd);
        }
      } else {
        if (t0 >= nextBreak) nextBreak = nextLoadBreak(load, t0);
        let tb = nextBreak;
        let tStart = t0;
        for (let seg = 0; seg < 8; seg++) {
          const tEnd = tb < t1 - 1e-9 * Ts ? tb : t1;
          if (tb !== segBreak) { plant.setLoadSegment(tStart, tEnd); segBreak = tb; }
          rk4!.run(y, tStart, tEnd, Math.max(1, Math.round((sub * (tEnd - tStart)) / Ts)));
          if (tEnd >= t1) break;
          tStart = tEnd;
          tb = nextLoadBreak(load, tEnd);
        }
      }
    } catch (err) {
      // Our own words, never the integrator library's text: what stopped it, at what time and state.
      const why = err instanceof StepCollapse
        ? 'the step size collapsed (more than 2000 integration steps in one control period)'
        : 'the integrator could not take a step (its error estimate was not finite: a derivative grew without bound)';
      const st = (x: number): string => (Number.isFinite(x) ? x.toPrecision(6) : 'not finite');
      diagnostic = `diverged at t = ${t0.toPrecision(6)} s: ${why}; state id = ${st(y[I_D]!)} A, iq = ${st(y[I_Q]!)} A, speed = ${st(y[OMEGA]! * RAD_S_TO_RPM)} rpm (check the gains, the delay and the scenario)`;
      events.push({ kind: 'divergence', t_s: t0, message: diagnostic });
      stopped = true;
      k++;
      break;
    }
    const ev = plant.evaluations - e0;
    hist[ev < 1024 ? ev : 1024]!++;
    // wrap the angle (the next period restarts the integrator anyway)
    let th = y[THETA]! % TWO_PI;
    if (th < 0) th += TWO_PI;
    y[THETA] = th;

    const id = y[I_D]!, iq = y[I_Q]!, w = y[OMEGA]!;
    const bad = !(Number.isFinite(id) && Number.isFinite(iq) && Number.isFinite(w) && Number.isFinite(th));
    if (bad || id * id + iq * iq > iDiv2 || Math.abs(w) > wDiv) {
      const nonFinite = [['id', id], ['iq', iq], ['speed', w], ['angle', th]].filter(([, x]) => !Number.isFinite(x as number)).map(([n]) => n).join(', ');
      const st = (x: number): string => (Number.isFinite(x) ? x.toPrecision(6) : 'not finite');
      const what = bad
        ? `a state became non-finite (${nonFinite}); at t = ${t0.toPrecision(6)} s it was id = ${st(last[2]!)} A, iq = ${st(last[3]!)} A, speed = ${st(last[1]!)} rpm`
        : id * id + iq * iq > iDiv2 ? `|i| exceeded the overcurrent trip ${iDivA.toPrecision(4)} A (${(iDivA / Imax).toPrecision(3)}·Imax)` : `|speed| exceeded ${(wDiv * RAD_S_TO_RPM).toPrecision(4)} rpm`;
      diagnostic = `diverged at t = ${t1.toPrecision(6)} s: ${what}; state id = ${st(id)} A, iq = ${st(iq)} A, speed = ${st(w * RAD_S_TO_RPM)} rpm (check the gains, the delay and the scenario)`;
      events.push({ kind: 'divergence', t_s: t1, message: diagnostic });
      stopped = true;
      k++;
      break;
    }
    if ((k & (CHECK_EVERY - 1)) === CHECK_EVERY - 1) {
      if (opts.signal?.aborted) {
        diagnostic = `aborted at t = ${t1.toPrecision(6)} s`;
        events.push({ kind: 'aborted', t_s: t1, message: diagnostic });
        stopped = true;
        k++;
        break;
      }
      if (clock() - wall0 > o.wallBudget_s) {
        diagnostic = `stopped at t = ${t1.toPrecision(6)} s: the wall-time budget of ${o.wallBudget_s} s is used up`;
        events.push({ kind: 'budget', t_s: t1, message: diagnostic });
        stopped = true;
        k++;
        break;
      }
      opts.onProgress?.(k / N);
    }
  }
  const periods = k;
  activePlant = prevPlant;
  activeFloors = prevFloors;
  // final sample (the state at the end) unless a divergence left it non-finite
  if (!stopped || Number.isFinite(y[I_D]! + y[I_Q]! + y[OMEGA]! + y[THETA]!)) {
    if (nRec < cap) { plant.setAngleOrigin(y[THETA]!); record(nRec); nRec++; }
  }
  const tLast = nRec > 0 ? last[0]! : 0;
  if (curStart >= 0) closeInterval('current-limit', curStart, tLast, curCount++);
  if (satStart >= 0) closeInterval('voltage-saturation', satStart, tLast, satCount++);
  if (overStart >= 0) events.push({ kind: 'overspeed', t_s: overStart, tEnd_s: tLast, message: `speed above ${(wOver * RAD_S_TO_RPM).toPrecision(4)} rpm` });
  events.sort((a, b) => a.t_s - b.t_s);
  opts.onProgress?.(1);

  // the state the run ended in counts for the peak current (a trip's own current included)
  const iEnd2 = y[I_D]! * y[I_D]! + y[I_Q]! * y[I_Q]!;
  if (Number.isFinite(iEnd2) && iEnd2 > peakI2) {
    peakI2 = iEnd2;
    peakT = tLast;
    peakRef2 = ctrl.idRef * ctrl.idRef + ctrl.iqRef * ctrl.iqRef;
    peakSinceSat = tLast - lastSatT;
  }
  // ---- metrics (from the streaming trackers fed at every recorded sample)
  let rise: number | null = null, over: number | null = null, settle: number | null = null;
  let dip: number | null = null, recov: number | null = null, sse: number | null = null;
  if (mode === 'speed' && nRec > 2) {
    if (stepTrk) {
      const r = stepTrk.result();
      rise = r.riseTime_s; over = r.overshoot_pct; settle = r.settlingTime_s;
    }
    const r0 = loadTrks[0]?.result();
    if (r0) {
      dip = r0.dip; recov = r0.recovery_s;
    }
    sse = sseTrk!.result(Math.max(0.05 * tLast, 2 * Ts));
  }
  const nI = Math.max(1, Math.min(periods, nRec));
  const metrics: SimulationMetrics = {
    finalSpeed_rpm: finiteOrNull(nRec > 0 ? last[1]! : null),
    speedOvershoot_pct: finiteOrNull(over),
    riseTime_s: finiteOrNull(rise),
    settlingTime_s: finiteOrNull(settle),
    loadStepDip_rpm: finiteOrNull(dip),
    loadStepRecovery_s: finiteOrNull(recov),
    peakCurrent_A: finiteOrNull(Math.sqrt(peakI2)),
    rmsCurrent_A: finiteOrNull(Math.sqrt(sumI2 / nI / 2)),
    voltageSaturation_s: finiteOrNull(satPeriods * Ts),
    energyFromBus_J: finiteOrNull(y[ENERGY]!),
    steadyStateError_rpm: finiteOrNull(sse),
  };

  // ---- traces, decimated; non-finite samples (a divergence) become 0 so no NaN escapes
  const names = TRACE_NAMES.slice(1);
  const decd = dec.finish();
  const traces = { t_s: decd.t } as Traces;
  names.forEach((n, i) => {
    const a = decd.channels[i]!;
    for (let j = 0; j < a.length; j++) if (!Number.isFinite(a[j]!)) a[j] = 0;
    traces[n] = a;
  });
  const stats: SimulationStats = {
    controlSteps: periods,
    rhsEvaluations: plant.evaluations,
    evaluationsPerPeriod: median(hist),
    wall_s: Math.max(0, clock() - wall0),
  };
  const loadSteps: LoadStepResult[] = loadTrks.map((tr) => {
    const r = tr.result();
    return {
      t_s: tr.tStep,
      dip_rpm: finiteOrNull(r.dip),
      recovery_s: finiteOrNull(r.recovery_s),
      errorAtStep_rpm: finiteOrNull(r.errorAtStep),
      settled: r.settled,
    };
  });
  const peakCurrentAt: PeakCurrentDetail | undefined = peakI2 > 0 && Number.isFinite(peakI2)
    ? { t_s: peakT, reference_A: Math.sqrt(peakRef2), sinceVoltageLimit_s: peakSinceSat }
    : undefined;
  return { metrics, loadSteps, traces, events, stats, ...(peakCurrentAt ? { peakCurrentAt } : {}), ...(diagnostic ? { diagnostic } : {}) };
}

function scheduleBefore(steps: Array<{ t: number; v: number }>, t: number, initial: number): number {
  let v = initial;
  for (const s of steps) if (s.t < t) v = s.v;
  return v;
}

// ------------------------------------------------------------------ from a project

export interface SimulationOverrides {
  control?: Partial<NonNullable<ResolvedProject['file']['control']>>;
  scenario?: Partial<NonNullable<ResolvedProject['file']['scenario']>>;
  solver?: Partial<SolverOptions>;
  /** first-order speed-reference prefilter with the speed PI's integral time (default false) */
  speedRefPrefilter?: boolean;
  /** see ControllerConfig.delayAngleCompensation (default true) */
  delayAngleCompensation?: boolean;
  /** back-EMF feed-forward; default follows control.decoupling */
  backEmfFeedForward?: boolean;
  /** reference-table grid (default 33 x 25) */
  tableNodes?: { speed: number; torque: number };
}

/** Voltage limit of the controller: the whole modulation range of the effective bus (the utilisation headroom is the controller's). */
export function controllerVoltageLimit(inv: ResolvedProject['inverter']): VoltageLimitSpec {
  const Vdc = effectiveBus(inv);
  if (inv.modulation === 'six-step') return { shape: 'hexagon', radius: Vdc / Math.sqrt(3), Vdc };
  return { shape: 'circle', radius: inv.modulation === 'svpwm' ? Vdc / Math.sqrt(3) : Vdc / 2, Vdc };
}

/** Speed at which the open-circuit back-EMF reaches Vmax, rad/s (mechanical). */
function noLoadSpeed(m: DqMachine, lim: DriveLimits): number {
  return m.psiM > 0 ? lim.Vmax / (m.polePairs * m.psiM) : lim.Vmax / (m.polePairs * m.Ld * lim.Imax);
}

/** Largest number of control periods a project scenario may ask for (duration_s x fCtrl_Hz): the default step budget. */
export const MAX_CONTROL_PERIODS = DEFAULT_RUN_OPTIONS.maxSteps;

export function simulationFromProject(p: ResolvedProject, overrides: SimulationOverrides = {}): SimulationSetup {
  const baseScenario = p.file.scenario;
  if (!baseScenario && !overrides.scenario) throw new InputError('scenario', 'is required to simulate (duration_s, speedSteps, loadSteps, ...)');
  const control = { ...(p.file.control ?? {}), ...(overrides.control ?? {}) } as NonNullable<ResolvedProject['file']['control']>;
  const scenario = { ...(baseScenario ?? {}), ...(overrides.scenario ?? {}) } as NonNullable<ResolvedProject['file']['scenario']>;
  if (!(scenario.duration_s > 0)) throw new InputError('scenario.duration_s', 'must be > 0 s');
  const mode: ControlMode = control.mode ?? 'speed';
  const fCtrl = control.fCtrl_Hz ?? 10000;
  const wanted = scenario.duration_s * fCtrl;
  if (wanted > MAX_CONTROL_PERIODS) {
    throw new InputError('scenario.duration_s', `asks for ${Math.round(wanted)} control periods (duration_s x control.fCtrl_Hz); the limit is ${MAX_CONTROL_PERIODS} periods, at most ${MAX_CONTROL_PERIODS / fCtrl} s at ${fCtrl} Hz`);
  }
  const Ts = 1 / fCtrl;
  const delaySamples = control.delaySamples ?? 1;
  const divider = control.speedLoopDivider ?? 1;
  const machine = p.hot;
  const lim = p.peak;
  const J = p.mechanics.inertia + (scenario.loadInertia ?? 0);
  const tuning = tuneLoops(tuningInputFromProject({ ...p, file: { ...p.file, control, scenario } } as ResolvedProject));
  const cd = tuning.current;
  const cq = tuning.currentQ ?? tuning.current;
  const sp = tuning.speed;
  const speedSteps = (scenario.speedSteps ?? []).map((s) => ({ t: s.t_s, v: s.speed_rpm * RPM_TO_RAD_S }));
  const w0 = mode === 'current-step' ? 0 : (scenario.initialSpeed_rpm ?? 0) * RPM_TO_RAD_S;
  const wMaxRef = Math.max(Math.abs(w0), ...speedSteps.map((s) => Math.abs(s.v)));
  const w0NoLoad = noLoadSpeed(machine, lim);
  const speedMax = Math.max(1.5 * wMaxRef, 1.2 * w0NoLoad, 1);
  let table: ReferenceTable | null = null;
  if (mode !== 'current-step') {
    table = buildReferenceTable(machine, lim, {
      speedMax_rad_s: speedMax,
      ...(overrides.tableNodes ? { speedNodes: overrides.tableNodes.speed, torqueNodes: overrides.tableNodes.torque } : {}),
    });
  }
  const loadSteps = mode === 'current-step' ? [] : scenario.loadSteps ?? [];
  const loadRamps = mode === 'current-step' ? [] : scenario.loadRamps ?? [];
  const k2 = mode === 'current-step' ? 0 : scenario.loadModel?.k ?? 0;
  const load = loadSchedule(loadSteps, loadRamps, k2);
  const TL0 = loadLevel(load, 0);
  const plant: PlantParams = {
    machine,
    inertia: J,
    viscousFriction: p.mechanics.viscousFriction,
    coulombFriction: p.mechanics.coulombFriction,
    load,
    mechanics: mode === 'current-step' ? 'locked' : 'free',
    inputFrame: 'alpha-beta',
    coulombWidth_rad_s: coulombWidth(p.mechanics.coulombFriction, J, Ts),
  };
  const decoupling = control.decoupling ?? true;
  const antiWindup: AntiWindup = control.antiWindup ?? DEFAULT_CONTROLLER_OPTIONS.antiWindup;
  const cs = scenario.currentStep;
  const Ti = sp.Ki > 0 ? sp.Kp / sp.Ki : 0;
  const cfg: ControllerConfig = {
    ...DEFAULT_CONTROLLER_OPTIONS,
    mode,
    Ts,
    delaySamples,
    machine,
    currentD: { Kp: cd.Kp, Ki: cd.Ki },
    currentQ: { Kp: cq.Kp, Ki: cq.Ki },
    speed: { Kp: sp.Kp, Ki: sp.Ki },
    speedLoopDivider: divider,
    antiWindup,
    decoupling,
    backEmfFeedForward: overrides.backEmfFeedForward ?? decoupling,
    delayAngleCompensation: overrides.delayAngleCompensation ?? true,
    speedRamp_rad_s2: control.speedRamp_rpm_per_s !== undefined ? control.speedRamp_rpm_per_s * RPM_TO_RAD_S : Infinity,
    speedRefPrefilter_s: (overrides.speedRefPrefilter ?? control.speedPrefilter ?? false) ? Ti : 0,
    Imax: lim.Imax,
    voltage: controllerVoltageLimit(p.inverter),
    table,
    speedRef: stepSchedule(w0, speedSteps),
    torqueRef: stepSchedule(0, (scenario.torqueSteps ?? []).map((s) => ({ t: s.t_s, v: s.torque_Nm }))),
    idRef: stepSchedule(0, cs ? [{ t: cs.t_s, v: cs.id_A }] : []),
    iqRef: stepSchedule(0, cs ? [{ t: cs.t_s, v: cs.iq_A }] : []),
    initialTorque: mode === 'speed' ? TL0 + p.mechanics.viscousFriction * w0 + k2 * w0 * Math.abs(w0) + (w0 !== 0 ? Math.sign(w0) * p.mechanics.coulombFriction : 0) : 0,
  };
  if (mode === 'current-step' && !cs) throw new InputError('scenario.currentStep', 'is required in current-step mode ({id_A, iq_A, t_s})');
  if (mode === 'torque' && (scenario.torqueSteps ?? []).length === 0) throw new InputError('scenario.torqueSteps', 'needs at least one step in torque mode');
  // overspeed: above the motor's maximum speed when the datasheet gives one, else well above what the run asks
  const wRatedMax = p.rated.maxSpeed_rad_s;
  const overspeed = wRatedMax !== undefined && wRatedMax > 0 ? wRatedMax : mode === 'speed' ? Math.max(1.2 * wMaxRef, 0.1 * speedMax) : speedMax;
  const findings = scenarioFindings(p, {
    ramp: cfg.speedRamp_rad_s2, mode, w0, speedSteps, loadSteps, load, table, wRatedMax, wMaxRef,
    B: p.mechanics.viscousFriction, Tc: p.mechanics.coulombFriction, k2,
  });
  return {
    plant,
    controller: cfg,
    duration_s: scenario.duration_s,
    initialSpeed_rad_s: w0,
    initialTheta_rad: 0,
    solver: { ...DEFAULT_SOLVER_OPTIONS, ...(overrides.solver ?? {}) },
    Imax: lim.Imax,
    currentLimitField: limitField('peak', p.currentLimits.peak, p.file.motor ? 'motor' : 'nameplate'),
    tripCurrent_A: DEFAULT_TRIP_FACTOR * lim.Imax,
    divergenceSpeed_rad_s: mode === 'current-step' ? Infinity : 3 * speedMax,
    overspeed_rad_s: mode === 'current-step' ? Infinity : overspeed,
    marks: {
      speedSteps: mode === 'speed' ? speedSteps : [],
      loadEvents: [...loadSteps.map((s) => s.t_s), ...loadRamps.map((r) => r.t_s)].sort((a, b) => a - b),
    },
    tuning,
    findings,
  };
}

/** The speed reference at time t after the ramp limit (rate in rad/s², Infinity for none), as the speed loop sees it. */
export function rampedReference(w0: number, steps: ReadonlyArray<{ t: number; v: number }>, rate: number, t: number): number {
  const sorted = [...steps].sort((a, b) => a.t - b.t);
  let w = w0;
  let target = w0;
  let tc = 0;
  const advance = (to: number): void => {
    const d = target - w;
    const most = rate * Math.max(0, to - tc);
    w += Math.abs(d) <= most ? d : Math.sign(d) * most;
    tc = to;
  };
  for (const st of sorted) {
    if (st.t > t) break;
    advance(st.t);
    target = st.v;
  }
  advance(t);
  return w;
}

interface ScenarioFacts {
  ramp: number;
  mode: ControlMode;
  w0: number;
  speedSteps: ReadonlyArray<{ t: number; v: number }>;
  loadSteps: ReadonlyArray<{ t_s: number; torque_Nm: number }>;
  load: ReturnType<typeof loadSchedule>;
  table: ReferenceTable | null;
  wRatedMax: number | undefined;
  wMaxRef: number;
  B: number;
  Tc: number;
  k2: number;
}

const rpmText = (w: number): string => `${(w * RAD_S_TO_RPM).toFixed(0)} rpm`;

/**
 * What the scenario asks that the motor or the drive cannot give, before the run: speed steps above
 * the motor's maximum speed; load steps (plus friction and the fan load) above the largest torque
 * the drive makes at the speed reference in force then (hot magnet, peak current); back-EMF above
 * the bus at the highest speed asked. Each finding names the field.
 */
function scenarioFindings(p: ResolvedProject, f: ScenarioFacts): Finding[] {
  const out: Finding[] = [];
  if (f.mode === 'current-step') return out;
  const wr = f.wRatedMax;
  if (f.mode === 'speed' && wr !== undefined && wr > 0) {
    if (Math.abs(f.w0) > wr) out.push({ code: 'speed-above-motor-max', severity: 'warning', field: 'scenario.initialSpeed_rpm', message: `starts at ${rpmText(Math.abs(f.w0))}, above the motor's maximum speed ${rpmText(wr)}` });
    f.speedSteps.forEach((st, i) => {
      if (Math.abs(st.v) > wr) out.push({ code: 'speed-above-motor-max', severity: 'warning', field: `scenario.speedSteps[${i}].speed_rpm`, message: `asks for ${rpmText(Math.abs(st.v))}, above the motor's maximum speed ${rpmText(wr)}` });
    });
  }
  if (f.mode === 'speed' && f.table) {
    const lim = new Float64Array(2);
    f.loadSteps.forEach((ls, i) => {
      const w = rampedReference(f.w0, f.speedSteps, f.ramp, ls.t_s);
      const need = loadLevel(f.load, ls.t_s) + f.B * w + (w !== 0 ? Math.sign(w) * f.Tc : 0) + f.k2 * w * Math.abs(w);
      torqueLimitsAt(f.table!, w, lim);
      const tooMuch = need > lim[0]! * (1 + 1e-9) || need < lim[1]! * (1 + 1e-9);
      if (tooMuch) {
        const most = need > 0 ? lim[0]! : lim[1]!;
        out.push({
          code: 'load-above-drive', severity: 'warning', field: `scenario.loadSteps[${i}].torque_Nm`,
          message: `at ${rpmText(w)} the load and friction need ${need.toPrecision(4)} N·m; the drive makes at most ${most.toPrecision(4)} N·m there (hot magnet, peak current): the speed will not hold`,
        });
      }
    });
  }
  if (f.wMaxRef > 0) {
    const s = safetyReport(p.cold, p.inverter, f.wMaxRef);
    for (const x of s.findings) if (x.code === 'back-emf-above-bus') out.push({ ...x, field: f.mode === 'speed' ? 'scenario.speedSteps' : 'scenario.initialSpeed_rpm', message: `${x.message} Follow local codes, licensed practice and IEC 61800-5-1.` });
  }
  return out;
}

/** A peak current above the limit by more than this fraction is a finding (below it: round-off of the loop). */
export const CURRENT_OVER_LIMIT_TOLERANCE = 1e-3;

/**
 * The phase current above the peak limit. The controller never asks for more than the limit (its
 * current reference is clamped there), but the current loop's transient can overshoot the
 * reference: a reference step to the limit, a rise held back by the voltage limit, the computation
 * delay (the loop corrects one or more periods late). The finding says so, with when and how much.
 */
export function currentAboveLimit(r: SimulationResult, setup?: SimulationSetup): Finding | null {
  const peak = r.metrics.peakCurrent_A;
  if (!setup || peak === null || r.diagnostic) return null;
  const lim = setup.Imax;
  if (!(peak > lim * (1 + CURRENT_OVER_LIMIT_TOLERANCE))) return null;
  const field = setup.currentLimitField ?? 'inverter.Imax';
  const at = r.peakCurrentAt;
  const a = (x: number): string => `${x.toPrecision(4)} A peak (${(x / Math.SQRT2).toPrecision(4)} A rms)`;
  const pct = ((peak / lim - 1) * 100).toPrecision(2);
  const Ts = setup.controller.Ts;
  const d = setup.controller.delaySamples;
  const asked = at ? ` (it asked for ${a(at.reference_A)} then)` : '';
  let why = `The controller clamps its current reference at the limit${asked}; the current overshot that reference in the current loop's step response`;
  why += d > 0
    ? `: the loop acts ${d} period${d > 1 ? 's' : ''} late (computation delay), which costs it phase margin at its bandwidth`
    : ', an overshoot of the loop itself (its gains or the sampled-data loop)';
  if (at && Number.isFinite(at.sinceVoltageLimit_s) && at.sinceVoltageLimit_s <= 10 * Ts) why += ` (the voltage limit had held the current's rise until ${(at.sinceVoltageLimit_s * 1e3).toPrecision(2)} ms before)`;
  why += '.';
  return {
    code: 'current-above-limit',
    severity: 'warning',
    field,
    message: `the phase current reached ${a(peak)}${at ? ` at ${(at.t_s * 1e3).toPrecision(4)} ms` : ''}, ${pct} % above the peak limit ${a(lim)} (${field}). ${why} ` +
      'A drive whose overcurrent trip sits at this limit would trip here: leave margin to the trip level, or lower the current-loop bandwidth or the torque step.',
  };
}

/** Findings of a run worth showing beside the metrics. */
export function simulationFindings(r: SimulationResult, setup?: SimulationSetup): Finding[] {
  const out: Finding[] = [...(setup?.findings ?? []), ...(setup?.tuning?.warnings ?? [])];
  if (r.diagnostic) out.push({ code: 'simulation-stopped', severity: 'danger', message: r.diagnostic });
  // load steps the loop met before it had settled: not measured, said why
  for (const ls of r.loadSteps ?? []) {
    if (!ls.settled && ls.errorAtStep_rpm !== null) {
      out.push({ code: 'load-step-unsettled', severity: 'info', field: 'scenario.loadSteps', message: `the load at ${ls.t_s.toPrecision(4)} s came while the speed was still ${ls.errorAtStep_rpm >= 100 ? ls.errorAtStep_rpm.toFixed(0) : ls.errorAtStep_rpm.toPrecision(3)} rpm from its reference: its dip and recovery are not measured (start the load step after the speed has settled)` });
    }
  }
  // the speed reference not reached at the end of a speed-mode run
  const n = r.traces.t_s.length;
  if (!r.diagnostic && setup?.controller.mode === 'speed' && n > 0) {
    const ref = r.traces.speedRef_rpm[n - 1]!;
    const got = r.traces.speed_rpm[n - 1]!;
    if (Math.abs(ref - got) > Math.max(0.02 * Math.abs(ref), 1)) {
      out.push({ code: 'speed-not-reached', severity: 'warning', field: 'scenario.speedSteps', message: `at the end of the run the speed is ${got.toFixed(0)} rpm against a reference of ${ref.toFixed(0)} rpm: the drive could not reach it within the run (a current or voltage limit, the load, or too short a run)` });
    }
  }
  const over = currentAboveLimit(r, setup);
  if (over) out.push(over);
  if ((r.metrics.voltageSaturation_s ?? 0) > 0) out.push({ code: 'voltage-saturation', severity: 'warning', message: `the voltage limit was active for ${r.metrics.voltageSaturation_s!.toPrecision(3)} s` });
  return out;
}
