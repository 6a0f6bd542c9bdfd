/**
 * The constant-parameter dq machine as a machine model: psi_d = Ld id + psiM, psi_q = Lq iq.
 * Krause, Wasynczuk and Sudhoff (2002), Analysis of Electric Machinery and Drive Systems, ch. 5
 * (permanent-magnet synchronous machine in the rotor reference frame), amplitude-invariant form.
 */
import type { DqMachine } from './dq-machine';
import type { LinearTerms, MachineInput, MachineModel } from './machine-model';
import { isMachineModel } from './machine-model';

export class LinearDqModel implements MachineModel, DqMachine {
  readonly polePairs: number;
  readonly Rs: number;
  readonly Ld: number;
  readonly Lq: number;
  readonly psiM: number;
  readonly linear: LinearTerms;

  constructor(m: DqMachine) {
    this.polePairs = m.polePairs;
    this.Rs = m.Rs;
    this.Ld = m.Ld;
    this.Lq = m.Lq;
    this.psiM = m.psiM;
    this.linear = { Ld: m.Ld, Lq: m.Lq, psiM: m.psiM };
  }

  flux(id: number, iq: number, out: Float64Array): void {
    out[0] = this.Ld * id + this.psiM;
    out[1] = this.Lq * iq;
  }

  torque(id: number, iq: number): number {
    return 1.5 * this.polePairs * iq * (this.psiM + (this.Ld - this.Lq) * id);
  }

  steadyVoltage(id: number, iq: number, we: number, out: Float64Array): void {
    out[0] = this.Rs * id - we * this.Lq * iq;
    out[1] = this.Rs * iq + we * (this.Ld * id + this.psiM);
  }

  incrementalInductance(_id: number, _iq: number, out: Float64Array): void {
    out[0] = this.Ld;
    out[1] = 0;
    out[2] = 0;
    out[3] = this.Lq;
  }

  current(psid: number, psiq: number, out: Float64Array): void {
    out[0] = (psid - this.psiM) / this.Ld;
    out[1] = psiq / this.Lq;
  }
}

/** The machine model of a solver's input: a model as it is, constant dq terms wrapped. */
export const machineModel = (m: MachineInput): MachineModel => (isMachineModel(m) ? m : new LinearDqModel(m));
