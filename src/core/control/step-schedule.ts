/** Piecewise-constant reference schedules (speed, torque and current steps) as the controller reads them. */

/** A piecewise-constant schedule: value `initial` before times[0], values[k] from times[k] on. */
export interface StepSchedule {
  initial: number;
  times: Float64Array;
  values: Float64Array;
}

export function stepSchedule(initial: number, steps: ReadonlyArray<{ t: number; v: number }>): StepSchedule {
  const s = [...steps].sort((a, b) => a.t - b.t);
  return { initial, times: Float64Array.from(s.map((x) => x.t)), values: Float64Array.from(s.map((x) => x.v)) };
}

export function scheduleValue(s: StepSchedule, t: number): number {
  let v = s.initial;
  const n = s.times.length;
  for (let k = 0; k < n; k++) {
    if (s.times[k]! <= t) v = s.values[k]!; else break;
  }
  return v;
}

