/**
 * Where the switching model's zoom window (full-resolution traces) sits in a run, from the project:
 *   - `control.pwm.window_s` {from, to}: those times, s;
 *   - `control.pwm.windowAt` "load-step": around the scenario's first load event (a load step or the
 *     start of a load ramp), two fundamental periods at the speed the scenario asks there (the last
 *     speed step at or before it, else the initial speed), a quarter of it before the event; at
 *     least MIN_WINDOW_PERIODS and at most MAX_WINDOW_PERIODS carrier periods (standstill: the
 *     least); cut at the run's end;
 *   - `control.pwm.windowAt` "end" or neither key: none here (the engine keeps the last two
 *     fundamental periods of the run, as without the key).
 * The problems across sections (the window's start within the run, windowAt "load-step" with a load
 * event, not both keys), each with its path. Common practice (no source) for the quarter before.
 */
import type { ControlSection, ScenarioSection } from './schema';

/** fewest and most carrier periods of a window at the load step */
export const MIN_WINDOW_PERIODS = 40;
export const MAX_WINDOW_PERIODS = 2000;

type Pwm = NonNullable<ControlSection['pwm']>;
type Scenario = Pick<ScenarioSection, 'duration_s'> & Partial<Pick<ScenarioSection, 'initialSpeed_rpm' | 'speedSteps' | 'loadSteps' | 'loadRamps'>>;

/** The first load event's time (a load step or a load ramp's start), s, or null. */
export function firstLoadEvent(s: Scenario): number | null {
  const ts = [...(s.loadSteps ?? []).map((l) => l.t_s), ...(s.loadRamps ?? []).map((l) => l.t_s)];
  return ts.length ? Math.min(...ts) : null;
}

/** The speed the scenario asks at time t: the last speed step at or before it, else the initial speed, rpm. */
export function speedAskedAt(s: Scenario, t: number): number {
  let v = s.initialSpeed_rpm ?? 0;
  for (const st of s.speedSteps ?? []) if (st.t_s <= t) v = st.speed_rpm;
  return v;
}

/** The problems of the window keys against the scenario, each with its path from the project root. */
export function switchingWindowProblems(pwm: Pwm | undefined, scenario: Scenario | undefined): { path: (string | number)[]; message: string }[] {
  if (!pwm) return [];
  const out: { path: (string | number)[]; message: string }[] = [];
  if (pwm.window_s !== undefined && pwm.windowAt !== undefined) {
    out.push({ path: ['control', 'pwm', 'windowAt'], message: 'cannot be given with control.pwm.window_s: give the window by its times (window_s) or by where it sits (windowAt), not both' });
  }
  if (!scenario || !(scenario.duration_s > 0)) return out;
  const T = scenario.duration_s;
  if (pwm.window_s !== undefined && !(pwm.window_s.from < T)) {
    out.push({ path: ['control', 'pwm', 'window_s', 'from'], message: `must be < scenario.duration_s (${T} s): the window starts after the run ends` });
  }
  if (pwm.windowAt === 'load-step') {
    const t = firstLoadEvent(scenario);
    if (t === null) out.push({ path: ['control', 'pwm', 'windowAt'], message: 'is "load-step" but the scenario has no load step or load ramp: add one (scenario.loadSteps) or choose "end"' });
    else if (!(t < T)) out.push({ path: ['control', 'pwm', 'windowAt'], message: `is "load-step" but the first load event (${t} s) is not before the run's end (scenario.duration_s ${T} s)` });
  }
  return out;
}

/**
 * The window's times, s, or null for the engine's default (the run's last two fundamental periods):
 * `fsw` the carrier frequency, Hz; `polePairs` the motor's.
 */
export function switchingWindow(pwm: Pwm | undefined, scenario: Scenario | undefined, fsw: number, polePairs: number): { from_s: number; to_s: number } | null {
  if (!pwm) return null;
  if (pwm.window_s) return { from_s: pwm.window_s.from, to_s: pwm.window_s.to };
  if (pwm.windowAt !== 'load-step' || !scenario) return null;
  const t = firstLoadEvent(scenario);
  if (t === null) return null;
  const fe = (Math.abs(speedAskedAt(scenario, t)) / 60) * polePairs;
  const L = Math.min(MAX_WINDOW_PERIODS / fsw, Math.max(MIN_WINDOW_PERIODS / fsw, fe > 0 ? 2 / fe : 0));
  const from = Math.max(0, t - L / 4);
  return { from_s: from, to_s: Math.min(scenario.duration_s, from + L) };
}
