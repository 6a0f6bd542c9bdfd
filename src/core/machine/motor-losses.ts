/**
 * The motor's losses besides copper: iron (a motor-level Steinmetz-type model in the flux-linkage
 * amplitude) and mechanical (friction and windage). The flux comes from the machine model only.
 *
 * Iron: P_fe = kh f psi^beta + ke f^2 psi^2, psi = |psi_dq| (Wb peak), f = |we| / (2 pi) (Hz):
 * the hysteresis term in Steinmetz's form (Steinmetz (1892), "On the law of hysteresis", Trans. AIEE 9),
 * the classical eddy-current term of the loss separation (Bertotti (1988), "General properties of
 * power losses in soft ferromagnetic materials", IEEE Trans. Magn. 24(1)), with the flux-linkage
 * amplitude standing for the peak induction and the coefficients fitted to a no-load loss test.
 * Bertotti's excess term (f^1.5 psi^1.5) is not modelled.
 *
 * Mechanical: P_mech = B w^2 + Tc |w| + kw |w|^3 (viscous, Coulomb friction, windage), w mechanical rad/s.
 */
import type { MachineModel } from './machine-model';

/** Iron-loss coefficients (the project file's `losses.iron`, same keys). */
export interface IronLossSpec {
  /** hysteresis coefficient, W per Hz per Wb^beta */
  kh: number;
  /** Steinmetz exponent of the hysteresis term (the schema's default is 2) */
  beta: number;
  /** eddy-current coefficient, W per Hz^2 per Wb^2 */
  ke: number;
}

/** Windage coefficient (the project file's `losses.windage`, same key). */
export interface WindageSpec {
  /** windage, W per (rad/s)^3 */
  kw: number;
}

/** Friction terms as the machine's mechanics give them. */
export interface FrictionSpec {
  /** viscous friction, N·m·s/rad */
  B: number;
  /** Coulomb friction, N·m */
  Tc: number;
}

/** Iron loss, W, at electrical frequency f (Hz, sign ignored) and flux-linkage amplitude psi (Wb). */
export function ironLoss(s: IronLossSpec | undefined, f: number, psi: number): number {
  if (s === undefined) return 0;
  const fa = Math.abs(f);
  return s.kh * fa * Math.pow(psi, s.beta) + s.ke * fa * fa * psi * psi;
}

/**
 * Iron loss, W, of the current (id, iq) at electrical speed we (rad/s), the flux from the model;
 * `flux` is the caller's 2-element scratch.
 */
export function ironLossAt(m: MachineModel, s: IronLossSpec | undefined, id: number, iq: number, we: number, flux: Float64Array): number {
  if (s === undefined || we === 0) return 0;
  m.flux(id, iq, flux);
  return ironLoss(s, we / (2 * Math.PI), Math.hypot(flux[0]!, flux[1]!));
}

/** Mechanical loss, W, at mechanical speed w (rad/s): friction B w^2 + Tc |w| plus windage kw |w|^3. */
export function mechanicalLoss(f: FrictionSpec, wind: WindageSpec | undefined, w: number): number {
  const a = Math.abs(w);
  return f.B * w * w + f.Tc * a + (wind === undefined ? 0 : wind.kw * a * a * a);
}
