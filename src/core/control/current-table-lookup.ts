/**
 * Reading a current-reference table as the firmware does (current-table.ts builds it): the speed
 * measure x = w_e / V_bus taken as |x| (a negative speed mirrors: same i_d, opposite i_q, opposite
 * torque) and clamped to the axis; the row's largest motoring and generating torque interpolated
 * linearly in x and the demand clamped to them; then i_d and i_q bilinear in (x, T) on the uniform
 * axes. Allocates nothing. Common practice (no source).
 */

/** What a lookup needs: the axes' sizes and ends and the arrays (row-major [speed][torque]). */
export interface CurrentTableView {
  nS: number;
  nT: number;
  /** top of the speed axis (the axis is uniform from 0), electrical rad/s per V */
  xMax: number;
  /** the torque axis runs uniformly from -torquePeak to +torquePeak, N·m */
  torquePeak: number;
  tMot: ArrayLike<number>;
  tGen: ArrayLike<number>;
  id: ArrayLike<number>;
  iq: ArrayLike<number>;
}

/**
 * (i_d, i_q) for torque demand T (N·m, electromagnetic) at speed measure x (electrical rad/s per V of
 * effective bus): out[0] = i_d, out[1] = i_q. Returns the torque asked after the clamp.
 */
export function lookupCurrentTable(t: CurrentTableView, x: number, T: number, out: Float64Array): number {
  const neg = x < 0;
  const xa = Math.min(Math.abs(x), t.xMax);
  const Tp = neg ? -T : T;
  const sx = (xa / t.xMax) * (t.nS - 1);
  const r = Math.min(Math.floor(sx), t.nS - 2);
  const f = sx - r;
  const mot = t.tMot[r]! + f * (t.tMot[r + 1]! - t.tMot[r]!);
  const gen = t.tGen[r]! + f * (t.tGen[r + 1]! - t.tGen[r]!);
  const Tc = Math.min(Math.max(Tp, -gen), mot);
  const st = ((Tc + t.torquePeak) / (2 * t.torquePeak)) * (t.nT - 1);
  const c = Math.max(0, Math.min(Math.floor(st), t.nT - 2));
  const g = Math.min(1, Math.max(0, st - c));
  const k = r * t.nT + c;
  const w00 = (1 - f) * (1 - g), w10 = f * (1 - g), w01 = (1 - f) * g, w11 = f * g;
  out[0] = w00 * t.id[k]! + w10 * t.id[k + t.nT]! + w01 * t.id[k + 1]! + w11 * t.id[k + t.nT + 1]!;
  const iq = w00 * t.iq[k]! + w10 * t.iq[k + t.nT]! + w01 * t.iq[k + 1]! + w11 * t.iq[k + t.nT + 1]!;
  out[1] = neg ? -iq : iq;
  return neg ? -Tc : Tc;
}
