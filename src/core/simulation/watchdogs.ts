/**
 * The watches that stop a run, each fed once per control period and answering with a diagnostic
 * (the reason the run stops, in words) or null:
 *
 * - `CurrentOscillationWatch`: sign changes of a current error larger than 5 % of Imax over the
 *   last OSC_WINDOW periods; OSC_LIMIT of them is an unstable current loop held bounded by the
 *   voltage limit (a limit cycle that the divergence bounds never see).
 * - `SpeedSwingWatch`: the torque reference clamped at the motoring limit, then at the generating
 *   limit, and back, SWING_LIMIT times with each swing within SWING_GAP_S of the one before, is a
 *   speed loop oscillating between the torque limits (a stable loop meets the opposite limit at
 *   most once or twice after a large step).
 * - `divergence`: a non-finite state, |i| above the overcurrent trip, |speed| above the divergence speed.
 * - `AngleLockWatch`: a sensorless estimator's loss of lock (its angle error above a bound for a
 *   time, sensorless-lock.ts), named with the run's time.
 * - `BudgetWatch`: the abort signal and the wall-time budget, read every CHECK_EVERY periods.
 * - `integratorFailure`: the words for an integrator that could not finish a period.
 *
 * Common practice (no source) for the thresholds.
 */
import { RAD_S_TO_RPM } from '../base/units';
import { StepCollapse } from './stepper';
import { S_T, S_ID, S_IQ, S_W, S_ID_REF, S_IQ_REF, S_TORQUE_REF, S_SPEED_REF } from './period-sample';

export const OSC_WINDOW = 64;
export const OSC_LIMIT = 16;
export const SWING_LIMIT = 8;
export const SWING_GAP_S = 1;
/** Periods between two readings of the abort signal and the wall clock (a power of two). */
export const CHECK_EVERY = 256;

const st = (x: number): string => (Number.isFinite(x) ? x.toPrecision(6) : 'not finite');

export class CurrentOscillationWatch {
  private readonly ring = new Uint8Array(OSC_WINDOW);
  private sum = 0;
  private prevEd = 0;
  private prevEq = 0;
  private readonly eMin: number;
  constructor(Imax: number) {
    this.eMin = 0.05 * Imax;
  }

  /** Period k with its sample (see period-sample.ts): the current errors are reference - state. */
  check(k: number, x: Float64Array): string | null {
    const ed = x[S_ID_REF]! - x[S_ID]!, eq = x[S_IQ_REF]! - x[S_IQ]!;
    const eMin = this.eMin;
    let flip = 0;
    if (!(ed <= eMin && ed >= -eMin && eq <= eMin && eq >= -eMin)) {
      const prevEd = this.prevEd;
      const prevEq = this.prevEq;
      flip = ((ed > eMin && prevEd < -eMin) || (ed < -eMin && prevEd > eMin) || (eq > eMin && prevEq < -eMin) || (eq < -eMin && prevEq > eMin)) ? 1 : 0;
      if (ed > eMin || ed < -eMin) this.prevEd = ed;
      if (eq > eMin || eq < -eMin) this.prevEq = eq;
    } else if (this.sum === 0) {
      // both errors small and no reversal in the window: the ring holds only zeros
      return null;
    }
    const slot = k % OSC_WINDOW;
    this.sum += flip - this.ring[slot]!;
    this.ring[slot] = flip;
    if (this.sum < OSC_LIMIT) return null;
    const t0 = x[S_T]!, id = x[S_ID]!, iq = x[S_IQ]!, w = x[S_W]!;
    return `diverged at t = ${t0.toPrecision(6)} s: the current loop oscillates (${this.sum} reversals of a current error above 5 % of Imax in ${OSC_WINDOW} periods; unstable gains held bounded by the voltage limit); state id = ${id.toPrecision(6)} A, iq = ${iq.toPrecision(6)} A, speed = ${(w * RAD_S_TO_RPM).toPrecision(6)} rpm`;
  }
}

export class SpeedSwingWatch {
  private side = 0;
  private at = -Infinity;
  private swings = 0;

  /** The period's sample (see period-sample.ts) and whether the torque reference was clamped at a limit. */
  check(x: Float64Array, clamped: boolean): string | null {
    if (!clamped) return null;
    const t0 = x[S_T]!, torqueRef = x[S_TORQUE_REF]!;
    const side = torqueRef > 0 ? 1 : -1;
    if (side === this.side) return null;
    this.swings = this.side !== 0 && t0 - this.at <= SWING_GAP_S ? this.swings + 1 : 0;
    this.side = side;
    this.at = t0;
    if (this.swings < SWING_LIMIT) return null;
    const id = x[S_ID]!, iq = x[S_IQ]!, w = x[S_W]!, wRef = x[S_SPEED_REF]!;
    return `diverged at t = ${t0.toPrecision(6)} s: the speed loop oscillates (the torque reference swung between the motoring and the generating limit ${this.swings} times, each within ${SWING_GAP_S} s of the last); state id = ${id.toPrecision(6)} A, iq = ${iq.toPrecision(6)} A, speed = ${(w * RAD_S_TO_RPM).toPrecision(6)} rpm, reference ${(wRef * RAD_S_TO_RPM).toPrecision(6)} rpm (lower the speed gains, or check the inertia)`;
  }
}

export class AngleLockWatch {
  constructor(private readonly source: { lossOfLock(): string | null }) {}

  /** At period start t0: the diagnostic once the lock is lost, else null. */
  check(t0: number): string | null {
    const m = this.source.lossOfLock();
    return m === null ? null : `stopped at t = ${t0.toPrecision(6)} s: ${m} (raise the observer's bandwidth, correct its parameters, or hand over at a higher speed)`;
  }
}

/** The bounds of `divergence`: overcurrent trip (A) and divergence speed (rad/s). */
export interface DivergenceBounds {
  /** the overcurrent trip, A: the smaller of 20·Imax and the setup's trip current */
  trip_A: number;
  Imax: number;
  speed_rad_s: number;
  /** control period, s */
  Ts: number;
}

/**
 * The state y at the end of period k, [t0, t1] = [k, k + 1]·Ts, or null when it is finite and within
 * the bounds. `last` is the last recorded sample [t, speed rpm, id, iq] (what it was before).
 */
export function divergence(b: DivergenceBounds, k: number, y: Float64Array, last: Float64Array): string | null {
  const id = y[0]!, iq = y[1]!, w = y[2]!, th = y[3]!;
  // a finite sum has finite terms (a non-finite term makes it infinite or NaN; an overflow only
  // sends a finite state on to the full test)
  if (Number.isFinite(id + iq + w + th) && id * id + iq * iq <= b.trip_A * b.trip_A && Math.abs(w) <= b.speed_rad_s) return null;
  const bad = !(Number.isFinite(id) && Number.isFinite(iq) && Number.isFinite(w) && Number.isFinite(th));
  if (!(bad || id * id + iq * iq > b.trip_A * b.trip_A || Math.abs(w) > b.speed_rad_s)) return null;
  return divergenceMessage(b, k, y, last);
}

/** The words of `divergence` (apart, so that the check itself stays small enough to inline). */
function divergenceMessage(b: DivergenceBounds, k: number, y: Float64Array, last: Float64Array): string {
  const id = y[0]!, iq = y[1]!, w = y[2]!, th = y[3]!;
  const t0 = k * b.Ts;
  const t1 = (k + 1) * b.Ts;
  const bad = !(Number.isFinite(id) && Number.isFinite(iq) && Number.isFinite(w) && Number.isFinite(th));
  const trip2 = b.trip_A * b.trip_A;
  const nonFinite = [['id', id], ['iq', iq], ['speed', w], ['angle', th]].filter(([, x]) => !Number.isFinite(x as number)).map(([n]) => n).join(', ');
  const what = bad
    ? `a state became non-finite (${nonFinite}); at t = ${t0.toPrecision(6)} s it was id = ${st(last[2]!)} A, iq = ${st(last[3]!)} A, speed = ${st(last[1]!)} rpm`
    : id * id + iq * iq > trip2 ? `|i| exceeded the overcurrent trip ${b.trip_A.toPrecision(4)} A (${(b.trip_A / b.Imax).toPrecision(3)}·Imax)` : `|speed| exceeded ${(b.speed_rad_s * RAD_S_TO_RPM).toPrecision(4)} rpm`;
  return `diverged at t = ${t1.toPrecision(6)} s: ${what}; state id = ${st(id)} A, iq = ${st(iq)} A, speed = ${st(w * RAD_S_TO_RPM)} rpm (check the gains, the delay and the scenario)`;
}

/** Why the integrator stopped in the period starting at t0 (our own words, never the library's text). */
export function integratorFailure(err: unknown, t0: number, id: number, iq: number, w: number): string {
  const why = err instanceof StepCollapse
    ? 'the step size collapsed (more than 2000 integration steps in one control period)'
    : 'the integrator could not take a step (its error estimate was not finite: a derivative grew without bound)';
  return `diverged at t = ${t0.toPrecision(6)} s: ${why}; state id = ${st(id)} A, iq = ${st(iq)} A, speed = ${st(w * RAD_S_TO_RPM)} rpm (check the gains, the delay and the scenario)`;
}

/** The abort signal and the wall-time budget. */
export class BudgetWatch {
  private readonly wall0: number;
  constructor(private readonly clock: () => number, private readonly wallBudget_s: number, private readonly signal?: { readonly aborted: boolean }) {
    this.wall0 = clock();
  }

  /** wall time since the watch was made, s */
  elapsed(): number {
    return this.clock() - this.wall0;
  }

  /** At the end t1 of a checked period: 'aborted' or 'budget' with the diagnostic, else null. */
  check(t1: number): { kind: 'aborted' | 'budget'; message: string } | null {
    if (this.signal?.aborted) return { kind: 'aborted', message: `aborted at t = ${t1.toPrecision(6)} s` };
    if (this.elapsed() > this.wallBudget_s) return { kind: 'budget', message: `stopped at t = ${t1.toPrecision(6)} s: the wall-time budget of ${this.wallBudget_s} s is used up` };
    return null;
  }
}
