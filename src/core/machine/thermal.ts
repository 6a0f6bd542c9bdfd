import type { DqMachine } from './dq-machine';

/** Temperature coefficient of resistance of annealed copper at 20 °C, 1/K (IEC 60028). */
export const COPPER_ALPHA_20 = 0.00393;
/** Typical reversible remanence coefficients, 1/K (typical datasheet values, from memory). */
export const NDFEB_ALPHA_BR = -0.0012;
export const SMCO_ALPHA_BR = -0.0004;

/** R_s(T) = R_s20 (1 + 0.00393 (T - 20)). */
export const resistanceAt = (Rs20: number, T_C: number): number => Rs20 * (1 + COPPER_ALPHA_20 * (T_C - 20));

/** psi_m(T) = psi_m20 (1 + alpha_Br (T - 20)). */
export const fluxAt = (psiM20: number, T_C: number, alphaBr: number = NDFEB_ALPHA_BR): number =>
  psiM20 * (1 + alphaBr * (T_C - 20));

/** The dq model at a winding and magnet temperature, from its 20 °C values. */
export function machineAt(m20: DqMachine, windingTemp_C: number, magnetTemp_C: number, alphaBr: number): DqMachine {
  return { ...m20, Rs: resistanceAt(m20.Rs, windingTemp_C), psiM: fluxAt(m20.psiM, magnetTemp_C, alphaBr) };
}
