/**
 * The cascade simulator: the dq plant (plant.ts) integrated period by period (stepper.ts: Cash-Karp
 * adaptive Runge-Kutta, or RK4; with `solver.exactPeriods` (the default) the constant-parameter
 * plant's exact periods, exact-stepper.ts) under the digital controller (controller.ts).
 *
 * The stepper integrates the plant's states `y` (currents, or flux linkages for a model that is not
 * linear: see plant.ts); once per period the plant converts them to `yi`, the state in currents
 * (the same array as `y` when the states are currents), which the controller, the recorder, the
 * watchdogs and the log read.
 *
 * Each control period [t_k, t_k + Ts]: the controller samples the state at t_k and returns the
 * alpha-beta voltage to hold over the period (its command of `delaySamples` periods before); the
 * stepper integrates to the period end, split at the load schedule's breakpoints.
 *
 * The run stops with a diagnostic (watchdogs.ts) on divergence (a non-finite state, |i| above the
 * trip, |omega| above the divergence speed, a step-size collapse, an oscillating current loop, a
 * speed loop swinging between the torque limits), on the step or wall-time budget, or when the abort
 * signal is raised (checked every CHECK_EVERY periods). A sample of every channel is taken at every
 * period start and at the end (recorder.ts); events and the current's peak and rms go to the run's
 * log (run-log.ts). A run owns all its state: runs may interleave (one started from another's
 * progress callback).
 */
import { InputError } from '../base/errors';
import { RAD_S_TO_RPM } from '../base/units';
import { Plant, STATE_SIZE, I_D, I_Q, OMEGA, THETA, ENERGY } from './plant';
import { CascadeController } from '../control/controller';
import { MAX_TRACE_POINTS } from './decimate';
import { finiteOrNull } from './metrics';
import { makePeriodStepper } from './exact-stepper';
import { makeSwitchingStepper } from './switching-stepper';
import { TraceRecorder } from './recorder';
import { AngleSensing } from './angle-sensing';
import { angleEstimatorFor } from '../control/angle-estimator-for';
import { RunLog } from './run-log';
import { PERIOD_SAMPLE_SIZE, S_T, S_ID, S_IQ, S_W, S_ID_REF, S_IQ_REF, S_TORQUE_REF, S_SPEED_REF } from './period-sample';
import { AngleLockWatch, BudgetWatch, CHECK_EVERY, CurrentOscillationWatch, SpeedSwingWatch, divergence, integratorFailure } from './watchdogs';
import { DEFAULT_RUN_OPTIONS, type EventKind, type RunOptions, type AnySetup } from './simulation-setup';
import type { SimulationMetrics, SimulationResult, SimulationStats } from './simulation-result';

export * from './simulation-setup';
export * from './simulation-result';
export { errorFloors } from './stepper';
export { rampedReference } from './ramped-reference';
export { currentAboveLimit, simulationFindings, CURRENT_OVER_LIMIT_TOLERANCE } from './simulation-findings';

const TWO_PI = 2 * Math.PI;

function defaultClock(): () => number {
  const perf = (globalThis as unknown as { performance?: { now(): number } }).performance;
  if (perf && typeof perf.now === 'function') return () => perf.now() / 1000;
  return () => Date.now() / 1000;
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

/** Why a run stopped early: the event kind, its time and the diagnostic. */
interface Stop {
  kind: EventKind;
  t: number;
  message: string;
}

export function runSimulation(setup: AnySetup, opts: RunOptions = {}): SimulationResult {
  const o = { ...DEFAULT_RUN_OPTIONS, ...opts };
  const budget = new BudgetWatch(opts.clock ?? defaultClock(), o.wallBudget_s, opts.signal);
  const Ts = setup.controller.Ts;
  if (!(Ts > 0) || !Number.isFinite(Ts)) throw new InputError('control.fCtrl_Hz', 'must be > 0 Hz');
  if (!(setup.duration_s > 0) || !Number.isFinite(setup.duration_s)) throw new InputError('scenario.duration_s', 'must be > 0 s');
  if (!(Number.isInteger(o.maxPoints) && o.maxPoints >= 2 && o.maxPoints <= MAX_TRACE_POINTS)) throw new InputError('maxPoints', `must be a whole number in 2..${MAX_TRACE_POINTS} (got ${o.maxPoints})`);
  const log = new RunLog(Ts, Math.max(1, Math.floor(o.eventMergeGap)), setup.overspeed_rad_s);
  const events = log.events;
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
  plant.setCurrents(y, 0, 0);
  y[OMEGA] = setup.initialSpeed_rad_s;
  y[THETA] = setup.initialTheta_rad;
  // the state in currents: y itself with current states, else converted once per period
  const yi = plant.fluxStates ? new Float64Array(STATE_SIZE) : y;
  if (yi !== y) plant.currentState(y, yi);
  ctrl.reset(y[OMEGA]!, y[THETA]!);
  const sw = makeSwitchingStepper(setup, plant, y);
  const stepper = sw ?? makePeriodStepper(setup, plant, y);
  // the angle and speed the controller sees: the true ones (ideal), else an estimator's
  const est = angleEstimatorFor(setup.angle, plant.model.polePairs, { machine: plant.model, Imax: setup.Imax, startupRamp_rpm_per_s: setup.controller.speedRamp_rad_s2 * RAD_S_TO_RPM });
  const sensing = est ? new AngleSensing(est, plant.model.polePairs, Ts, N + 1, plant.model) : null;
  const rec = new TraceRecorder(setup, plant.model, plant, ctrl, N, o.maxPoints, sensing);
  if (sensing) sensing.reset(y[THETA]!, y[OMEGA]!);
  const lock = sensing?.sensorless ? new AngleLockWatch(sensing) : null;
  const hist = new Uint32Array(1025);
  const vab = plant.input;
  const bounds = { trip_A: Math.min(20 * setup.Imax, setup.tripCurrent_A), Imax: setup.Imax, speed_rad_s: setup.divergenceSpeed_rad_s, Ts };
  const osc = new CurrentOscillationWatch(setup.Imax);
  const swing = setup.controller.mode === 'speed' ? new SpeedSwingWatch() : null;
  const smp = ctrl.sample;
  const x = new Float64Array(PERIOD_SAMPLE_SIZE);
  const setup_s = Math.max(0, budget.elapsed());

  let stop: Stop | null = null;
  let k = 0;
  for (k = 0; k < N; k++) {
    const t0 = k * Ts;
    const t1 = (k + 1) * Ts;
    const th0 = y[THETA]!;
    // the same cos/sin of the period's start angle serve the plant's rotation, the controller's
    // inverse Park and the record
    plant.setAngleOrigin(th0);
    smp[0] = t0; smp[1] = yi[I_D]!; smp[2] = yi[I_Q]!; smp[3] = yi[OMEGA]!; smp[4] = th0; smp[5] = plant.c0; smp[6] = plant.s0;
    if (sensing) { sensing.sampleFrom(yi, vab, smp); sensing.steer(ctrl); }
    ctrl.stepSampled(vab);
    rec.record(k, yi);
    x[S_T] = t0; x[S_ID] = yi[I_D]!; x[S_IQ] = yi[I_Q]!; x[S_W] = yi[OMEGA]!;
    x[S_ID_REF] = ctrl.idRef; x[S_IQ_REF] = ctrl.iqRef; x[S_TORQUE_REF] = ctrl.torqueRef; x[S_SPEED_REF] = ctrl.speedRefOut;
    log.observe(x, ctrl.currentLimited, ctrl.voltageSaturated);
    const why = osc.check(k, x) ?? (swing ? swing.check(x, ctrl.torqueClamped) : null) ?? (lock ? lock.check(t0) : null);
    if (why !== null) { stop = { kind: 'divergence', t: t0, message: why }; break; }

    const e0 = plant.evaluations;
    try {
      stepper.period(y, t0, t1);
    } catch (err) {
      if (yi !== y) plant.currentState(y, yi);
      stop = { kind: 'divergence', t: t0, message: integratorFailure(err, t0, yi[I_D]!, yi[I_Q]!, yi[OMEGA]!) };
      break;
    }
    const ev = plant.evaluations - e0;
    hist[ev < 1024 ? ev : 1024]!++;
    // wrap the angle (the next period restarts the integrator anyway); within one turn of the
    // range, th - 2 pi is exact (Sterbenz) and equals th % 2 pi: no floating-point remainder call
    let th = y[THETA]!;
    if (!(th >= 0 && th < TWO_PI)) {
      th = th >= TWO_PI && th < 2 * TWO_PI ? th - TWO_PI : th % TWO_PI;
      if (th < 0) th += TWO_PI;
      y[THETA] = th;
    }
    if (yi !== y) plant.currentState(y, yi);
    const gone = divergence(bounds, k, yi, rec.last);
    if (gone !== null) { stop = { kind: 'divergence', t: t1, message: gone }; break; }
    if ((k & (CHECK_EVERY - 1)) === CHECK_EVERY - 1) {
      const b = budget.check(t1);
      if (b !== null) { stop = { kind: b.kind, t: t1, message: b.message }; break; }
      opts.onProgress?.(k / N);
    }
  }
  // the one stop path: the diagnostic, its event, and the period it stopped in counted
  if (stop !== null) {
    diagnostic = stop.message;
    events.push({ kind: stop.kind, t_s: stop.t, message: stop.message });
    k++;
  }
  const periods = k;
  // final sample (the state at the end) unless a divergence left it non-finite
  if (stop === null || Number.isFinite(yi[I_D]! + yi[I_Q]! + yi[OMEGA]! + yi[THETA]!)) {
    if (rec.count < rec.cap) {
      plant.setAngleOrigin(yi[THETA]!);
      // the estimator samples the end state when the plant moved on since its last sample
      if (sensing && stop === null) sensing.sample(rec.count * Ts, yi, plant.c0, plant.s0, vab, smp);
      rec.record(rec.count, yi);
    }
  }
  const nRec = rec.count;
  const tLast = nRec > 0 ? rec.last[0]! : 0;
  log.finish(tLast);
  opts.onProgress?.(1);

  // the state the run ended in counts for the peak current (a trip's own current included)
  const iEnd2 = yi[I_D]! * yi[I_D]! + yi[I_Q]! * yi[I_Q]!;
  if (Number.isFinite(iEnd2)) log.peak(iEnd2, tLast, ctrl.idRef * ctrl.idRef + ctrl.iqRef * ctrl.iqRef);
  const m = rec.speedMetrics(tLast);
  const nI = Math.max(1, Math.min(periods, nRec));
  const metrics: SimulationMetrics = {
    finalSpeed_rpm: finiteOrNull(nRec > 0 ? rec.last[1]! : null),
    speedOvershoot_pct: finiteOrNull(m.over),
    riseTime_s: finiteOrNull(m.rise),
    settlingTime_s: finiteOrNull(m.settle),
    loadStepDip_rpm: finiteOrNull(m.dip),
    loadStepRecovery_s: finiteOrNull(m.recov),
    peakCurrent_A: finiteOrNull(Math.sqrt(log.peakI2)),
    rmsCurrent_A: finiteOrNull(Math.sqrt(log.sumI2 / nI / 2)),
    voltageSaturation_s: finiteOrNull(log.satPeriods * Ts),
    energyFromBus_J: finiteOrNull(y[ENERGY]!),
    steadyStateError_rpm: finiteOrNull(m.sse),
    ...(sensing ? sensing.metrics(tLast) : {}),
  };
  const traces = rec.traces();
  const stats: SimulationStats = {
    controlSteps: periods,
    rhsEvaluations: plant.evaluations,
    evaluationsPerPeriod: median(hist),
    wall_s: 0,
    setup_s,
    run_s: 0,
  };
  stats.wall_s = Math.max(setup_s, budget.elapsed());
  stats.run_s = stats.wall_s - setup_s;
  const peakCurrentAt = log.peakDetail();
  const switching = sw?.result() ?? null;
  return { metrics, loadSteps: rec.loadSteps(), traces, events, stats, ...(peakCurrentAt ? { peakCurrentAt } : {}), ...(diagnostic ? { diagnostic } : {}), ...(switching ? { switching } : {}) };
}
