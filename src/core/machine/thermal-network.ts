/**
 * The lumped thermal network (thermal-network-spec.ts) solved exactly for losses held constant over
 * a step. With the temperature rises above the coolant x = [T_w - T_c, T_s - T_c]:
 *
 *   C_w dx_w/dt = P_cu - (x_w - x_s) / R_ws
 *   C_s dx_s/dt = P_fe + (x_w - x_s) / R_ws - x_s / R_sc          i.e.  dx/dt = A x + b
 *
 * Steady state x_inf = -A^-1 b: x_s = (P_cu + P_fe) R_sc, x_w = x_s + P_cu R_ws. Over a step dt the
 * exact solution is x(dt) = x_inf + e^(A dt) (x(0) - x_inf); the 2 x 2 matrix exponential by the
 * Cayley-Hamilton theorem, e^(A t) = a0 I + a1 A with the divided differences of e^(lambda t) at the
 * two eigenvalues (Moler and Van Loan 2003, Nineteen dubious ways to compute the exponential of a
 * matrix, twenty-five years later, SIAM Review 45(1), method 11 for distinct eigenvalues). An RC
 * network's A has real, negative and distinct eigenvalues: its off-diagonal product is > 0. The heat
 * removed to the coolant over the step is the exact integral of x_s / R_sc (the same form with
 * (e^(lambda t) - 1) / lambda). The junction of a switch position has no heat capacity here: it is
 * at T_c + R_jc P_inv / 6 at every instant. Nothing allocates.
 */
import type { ThermalNetworkSpec } from './thermal-network-spec';

/** Stator/housing to coolant resistance at a speed, K/W: the speed table (linear in |speed|, held beyond its ends) or the constant. */
export function statorToCoolantAt(s: ThermalNetworkSpec, speed_rpm: number): number {
  const t = s.statorToCoolantBySpeed;
  if (t === undefined || t.speed_rpm.length === 0) return s.statorToCoolant_K_per_W;
  const v = Math.abs(speed_rpm), x = t.speed_rpm, y = t.K_per_W, n = x.length;
  if (v <= x[0]!) return y[0]!;
  if (v >= x[n - 1]!) return y[n - 1]!;
  let k = 1;
  while (x[k]! < v) k++;
  const f = (v - x[k - 1]!) / (x[k]! - x[k - 1]!);
  return y[k - 1]! + f * (y[k]! - y[k - 1]!);
}

/** Steady winding and stator temperatures, °C, into out[0], out[1]. */
export function steadyTemperatures(s: ThermalNetworkSpec, copper_W: number, iron_W: number, speed_rpm: number, out: Float64Array): void {
  const xs = (copper_W + iron_W) * statorToCoolantAt(s, speed_rpm);
  out[0] = s.coolantTemp_C + xs + copper_W * s.windingToStator_K_per_W;
  out[1] = s.coolantTemp_C + xs;
}

/** The magnet's temperature at a stator temperature, °C. */
export const magnetTemperature = (s: ThermalNetworkSpec, statorTemp_C: number): number => statorTemp_C + s.magnetAboveStator_K;

/** A switch position's junction temperature, °C, at a bridge loss (one sixth each); the coolant's when the junction is not rated. */
export const junctionTemperature = (s: ThermalNetworkSpec, inverter_W: number): number =>
  s.coolantTemp_C + (s.junctionToCoolant_K_per_W ?? 0) * inverter_W / 6;

/** (e^x - 1) / x, 1 at 0, without cancellation. */
const expm1x = (x: number): number => (Math.abs(x) < 1e-300 ? 1 : Math.expm1(x) / x);

/**
 * Advance T = [T_w, T_s] (°C, in place) by dt under constant losses, exactly. Returns the heat
 * removed to the coolant over the step, J.
 */
export function stepTemperatures(s: ThermalNetworkSpec, T: Float64Array, copper_W: number, iron_W: number, speed_rpm: number, dt_s: number): number {
  const Rws = s.windingToStator_K_per_W, Rsc = statorToCoolantAt(s, speed_rpm);
  const Cw = s.windingCapacity_J_per_K, Cs = s.statorCapacity_J_per_K, Tc = s.coolantTemp_C;
  // A = [[a, b], [c, d]]
  const a = -1 / (Cw * Rws), b = 1 / (Cw * Rws), c = 1 / (Cs * Rws), d = -(1 / Rws + 1 / Rsc) / Cs;
  const xsInf = (copper_W + iron_W) * Rsc, xwInf = xsInf + copper_W * Rws;
  const yw = T[0]! - Tc - xwInf, ys = T[1]! - Tc - xsInf;
  const half = 0.5 * (a + d), disc = Math.sqrt(0.25 * (a - d) * (a - d) + b * c);
  const l1 = half + disc, l2 = half - disc; // l2 < l1 < 0
  const e1 = Math.exp(l1 * dt_s), e2 = Math.exp(l2 * dt_s);
  // e^(A t) = a0 I + a1 A, a1 = (e1 - e2) / (l1 - l2), a0 = e1 - a1 l1
  // (the second form where the eigenvalues are close on the step's scale, the first where e2 may underflow)
  const sep = (l1 - l2) * dt_s;
  const a1 = sep > 1 ? (e1 - e2) / (l1 - l2) : e2 * dt_s * expm1x(sep), a0 = e1 - a1 * l1;
  const Ayw = a * yw + b * ys, Ays = c * yw + d * ys;
  T[0] = Tc + xwInf + a0 * yw + a1 * Ayw;
  T[1] = Tc + xsInf + a0 * ys + a1 * Ays;
  // integral of e^(A t) over dt = g0 I + g1 A, g(l) = dt (e^(l dt) - 1) / (l dt)
  const g1v = dt_s * expm1x(l1 * dt_s), g2v = dt_s * expm1x(l2 * dt_s);
  const g1 = (g1v - g2v) / (l1 - l2), g0 = g1v - g1 * l1;
  return (xsInf * dt_s + g0 * ys + g1 * Ays) / Rsc;
}
