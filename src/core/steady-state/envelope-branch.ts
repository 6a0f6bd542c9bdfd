/**
 * An envelope branch as drawn: its feasible points, cut where the torque reaches zero (the maximum
 * speed of that branch), with the crossing itself added as the branch's last point at zero torque.
 * A curve then ends on the zero-torque line at the speed it stops, never hanging open at the last
 * feasible sample, and never running on along the zero line past its end.
 */
import type { Envelope } from './envelope';
import { RAD_S_TO_RPM } from '../base/units';

export interface EnvelopeBranch {
  /** speeds, rpm; NaN separates pieces (only if the engine found torque again after an end) */
  speed_rpm: number[];
  /** signed torque, N·m (0 at an end) */
  torque_Nm: number[];
  /** mechanical power, W (0 at an end) */
  power_W: number[];
  /** speeds where the branch's torque reaches zero inside the computed range, rpm (empty: torque all the way) */
  ends_rpm: number[];
}

/**
 * The speed between feasible sample k and infeasible sample k + 1 where the torque reaches zero:
 * the engine's maximum speed when it lies in that interval (found by bisection to 1e-13), else the
 * straight line through the last two feasible samples continued to zero torque, kept in the interval.
 */
export function zeroCrossing(env: Envelope, k: number): number {
  const w0 = env.speed[k]!;
  const w1 = env.speed[k + 1]!;
  if (env.maxSpeed !== null && env.maxSpeed >= w0 && env.maxSpeed <= w1) return env.maxSpeed;
  if (k > 0 && env.feasible[k - 1]) {
    const wa = env.speed[k - 1]!;
    const ta = env.torque[k - 1]!;
    const tb = env.torque[k]!;
    if (ta !== tb) {
      const w = w0 + ((w0 - wa) * tb) / (ta - tb);
      if (w >= w0 && w <= w1) return w;
    }
  }
  return 0.5 * (w0 + w1);
}

export function envelopeBranch(env: Envelope): EnvelopeBranch {
  const out: EnvelopeBranch = { speed_rpm: [], torque_Nm: [], power_W: [], ends_rpm: [] };
  const n = env.speed.length;
  for (let k = 0; k < n; k++) {
    if (!env.feasible[k]) continue;
    if (k > 0 && !env.feasible[k - 1] && out.speed_rpm.length) {
      out.speed_rpm.push(NaN);
      out.torque_Nm.push(NaN);
      out.power_W.push(NaN);
    }
    out.speed_rpm.push(env.speed[k]! * RAD_S_TO_RPM);
    out.torque_Nm.push(env.torque[k]!);
    out.power_W.push(env.power[k]!);
    if (k + 1 < n && !env.feasible[k + 1]) {
      const w = zeroCrossing(env, k) * RAD_S_TO_RPM;
      out.speed_rpm.push(w);
      out.torque_Nm.push(0);
      out.power_W.push(0);
      out.ends_rpm.push(w);
    }
  }
  return out;
}
