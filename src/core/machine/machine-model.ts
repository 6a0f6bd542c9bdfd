/**
 * The machine model: the only place that knows how flux follows current. Every solver (MTPA, MTPV,
 * operating point, envelope, sizing, safety, plant, controller, tuning) asks it, never a formula of
 * its own. Motor reference direction and amplitude-invariant scaling (../shared/conventions.md):
 *
 *   psi_dq = psi(id, iq)
 *   T  = 1.5 p (psi_d iq - psi_q id)
 *   vd = Rs id - we psi_q,   vq = Rs iq + we psi_d        (steady state, we = p omega_m)
 *   L_inc = d psi_dq / d i_dq = [[Ldd, Ldq], [Lqd, Lqq]]  (incremental inductances)
 *
 * Results go into caller-owned scratch arrays: no call allocates. A model whose flux is affine in
 * current with constant Ld, Lq and psiM says so through `linear`; solvers may then take a closed
 * form, and every closed form has a generic numeric path (tested on the linear model to agree).
 */
import type { DqMachine } from './dq-machine';

/** The constant-parameter terms of a linear model (the closed forms' inputs). */
export type LinearTerms = Readonly<Pick<DqMachine, 'Ld' | 'Lq' | 'psiM'>>;

export interface MachineModel {
  /** pole pairs p (integer >= 1) */
  readonly polePairs: number;
  /** stator resistance per phase at the model's winding temperature, ohm */
  readonly Rs: number;
  /** the constant Ld, Lq, psiM when flux is affine in current (closed forms allowed), else null */
  readonly linear: LinearTerms | null;
  /** flux linkage (psi_d, psi_q), Wb peak, into out[0], out[1] */
  flux(id: number, iq: number, out: Float64Array): void;
  /** electromagnetic torque, N·m */
  torque(id: number, iq: number): number;
  /** steady-state voltage (vd, vq), V peak phase, at electrical speed we (rad/s) into out[0], out[1] */
  steadyVoltage(id: number, iq: number, we: number, out: Float64Array): void;
  /** incremental inductances [Ldd, Ldq, Lqd, Lqq], H, into out[0..3] */
  incrementalInductance(id: number, iq: number, out: Float64Array): void;
  /** the current (id, iq), A peak, whose flux is (psid, psiq), into out[0], out[1] */
  current(psid: number, psiq: number, out: Float64Array): void;
}

/** What a solver may be handed: a machine model, or the constant-parameter terms it wraps. */
export type MachineInput = MachineModel | DqMachine;

export const isMachineModel = (m: MachineInput): m is MachineModel => typeof (m as MachineModel).flux === 'function';
