import type { ResolvedProject } from './project';
import { computeEnvelope } from './envelope';
import { RPM_TO_RAD_S } from './units';

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
  const probe = computeEnvelope(p.hot, p.peak, { points: 2, direction: 'motoring' });
  let speedMax = probe.speed[probe.speed.length - 1]!;
  const rated = p.rated.maxSpeed_rad_s;
  const wanted = Math.max(0, ...p.requirements.map((q) => 1.08 * Math.abs(q.speed_rpm) * RPM_TO_RAD_S), 1.05 * (rated ?? 0));
  if (wanted > 0 && rated !== undefined) speedMax = Math.min(speedMax, wanted);
  speedMax = Math.max(speedMax, wanted);
  return { speedMax, safetySpeed: rated ?? speedMax };
}
