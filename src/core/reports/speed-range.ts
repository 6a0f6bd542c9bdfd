import type { ResolvedProject } from '../project/project';
import { computeEnvelope } from '../steady-state/envelope';
import { RPM_TO_RAD_S } from '../base/units';

/** Highest top speed a plot or an envelope is drawn to, rpm (the CLI's --speed-max and the app's 'plot to'). */
export const PLOT_SPEED_MAX_RPM = 1e6;

/**
 * A typed top speed for plotting: a number in rpm within (0, PLOT_SPEED_MAX_RPM], blank for the
 * project's own range (null), or the message saying what is allowed.
 */
export function parsePlotTop(text: string): { rpm: number | null } | { message: string } {
  const t = text.trim();
  if (t === '') return { rpm: null };
  const v = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(t) ? Number(t) : NaN;
  if (!Number.isFinite(v)) return { message: `must be a number in rpm (got '${t}'), or blank for the project's range` };
  if (!(v > 0)) return { message: 'must be > 0 rpm' };
  if (v > PLOT_SPEED_MAX_RPM) return { message: `must be <= ${PLOT_SPEED_MAX_RPM} rpm` };
  return { rpm: v };
}

/**
 * The speeds a project's results are drawn and checked over, one rule for every screen and the CLI:
 * - `speedMax`: the engine's range for the hot, peak-current, motoring envelope (just past its
 *   maximum speed, or 4 x base speed when unbounded), widened to every requirement point (+8 %) and
 *   to the motor's rated maximum speed (+5 %); capped there when a rated maximum speed is given.
 * - `safetySpeed`: the speed the back-EMF caution is for: the rated maximum speed when the file
 *   gives one, else `speedMax`.
 * rad/s mechanical.
 */
export function projectSpeedRange(p: ResolvedProject): { speedMax: number; safetySpeed: number } {
  const probe = computeEnvelope(p.models.hot, p.peak, { points: 2, direction: 'motoring' });
  let speedMax = probe.speed[probe.speed.length - 1]!;
  const rated = p.rated.maxSpeed_rad_s;
  const wanted = Math.max(0, ...p.requirements.map((q) => 1.08 * Math.abs(q.speed_rpm) * RPM_TO_RAD_S), 1.05 * (rated ?? 0));
  if (wanted > 0 && rated !== undefined) speedMax = Math.min(speedMax, wanted);
  speedMax = Math.max(speedMax, wanted);
  return { speedMax, safetySpeed: rated ?? speedMax };
}
