/**
 * The load torque schedule of a run: levels (steps and ramps) linear between breakpoints, plus a
 * speed-dependent term k·omega·|omega|. The plant reads it; the stepper splits its integration at
 * the breakpoints. Common practice (no source).
 */
import { InputError } from '../base/errors';

/** Load torque: a level schedule (steps and ramps) plus a speed-dependent term k·omega·|omega|. */
export interface LoadSchedule {
  /** breakpoint times, s, ascending */
  times: Float64Array;
  /** load level at each breakpoint, N·m; linear in between, held after the last */
  levels: Float64Array;
  /** coefficient of the fan/pump load k·omega_m·|omega_m|, N·m·s²/rad² (0 = none) */
  quadraticK: number;
}

export interface LoadStepSpec { t_s: number; torque_Nm: number }
export interface LoadRampSpec { t_s: number; duration_s: number; torque_Nm: number }

/** Build a level schedule: a step jumps to `torque_Nm` at `t_s`; a ramp goes linearly from the level then in force to `torque_Nm` over `duration_s`. */
export function loadSchedule(steps: readonly LoadStepSpec[] = [], ramps: readonly LoadRampSpec[] = [], quadraticK = 0): LoadSchedule {
  type Ev = { t: number; kind: 'step' | 'ramp'; T: number; d: number };
  const evs: Ev[] = [];
  steps.forEach((s, i) => {
    if (!(s.t_s >= 0) || !Number.isFinite(s.torque_Nm)) throw new InputError(`scenario.loadSteps[${i}]`, 'needs t_s >= 0 s and a finite torque_Nm');
    evs.push({ t: s.t_s, kind: 'step', T: s.torque_Nm, d: 0 });
  });
  ramps.forEach((r, i) => {
    if (!(r.t_s >= 0) || !(r.duration_s > 0) || !Number.isFinite(r.torque_Nm)) {
      throw new InputError(`scenario.loadRamps[${i}]`, 'needs t_s >= 0 s, duration_s > 0 s and a finite torque_Nm');
    }
    evs.push({ t: r.t_s, kind: 'ramp', T: r.torque_Nm, d: r.duration_s });
  });
  if (!(quadraticK >= 0)) throw new InputError('scenario.loadModel.k', 'must be >= 0 N·m·s²/rad²');
  evs.sort((a, b) => a.t - b.t);
  const t: number[] = [0];
  const v: number[] = [0];
  const levelAt = (x: number): number => {
    // level of the piecewise-linear schedule built so far
    let i = t.length - 1;
    while (i > 0 && t[i]! > x) i--;
    if (i === t.length - 1 || t[i + 1]! === t[i]!) return v[i]!;
    const f = (x - t[i]!) / (t[i + 1]! - t[i]!);
    return v[i]! + f * (v[i + 1]! - v[i]!);
  };
  for (const e of evs) {
    // drop breakpoints after e.t (a later event overrides a ramp still running)
    const now = levelAt(e.t);
    while (t.length > 1 && t[t.length - 1]! > e.t) { t.pop(); v.pop(); }
    if (e.kind === 'step') {
      t.push(e.t, e.t); v.push(now, e.T);
    } else {
      t.push(e.t, e.t + e.d); v.push(now, e.T);
    }
  }
  return { times: Float64Array.from(t), levels: Float64Array.from(v), quadraticK };
}

/** Load level of the schedule at time t (without the speed-dependent term). */
export function loadLevel(s: LoadSchedule, t: number): number {
  const n = s.times.length;
  if (t >= s.times[n - 1]!) return s.levels[n - 1]!;
  let lo = 0;
  let hi = n - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (s.times[mid]! <= t) lo = mid; else hi = mid;
  }
  const t0 = s.times[lo]!;
  const t1 = s.times[hi]!;
  if (t1 <= t0) return s.levels[hi]!;
  return s.levels[lo]! + ((t - t0) / (t1 - t0)) * (s.levels[hi]! - s.levels[lo]!);
}

/** The first breakpoint strictly after t (Infinity when none): the simulator splits its integration there. */
export function nextLoadBreak(s: LoadSchedule, t: number): number {
  const n = s.times.length;
  for (let i = 0; i < n; i++) if (s.times[i]! > t) return s.times[i]!;
  return Infinity;
}
