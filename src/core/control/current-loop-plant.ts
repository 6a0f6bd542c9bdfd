/**
 * The current loop's plant per axis, R and L, from the machine model: the winding resistance and
 * the incremental inductances at the operating point (zero current by default), L_d = d psi_d / d i_d,
 * L_q = d psi_q / d i_q; the cross terms are left to the decoupling. For the constant-parameter
 * model these are its Ld and Lq exactly. Harnefors and Nee (1998), "Model-based current control of
 * AC machines using the internal model control method" (the per-axis R-L plant of the rules).
 */
import type { MachineInput } from '../machine/machine-model';
import { machineModel } from '../machine/linear-dq';

export interface CurrentLoopPlant {
  /** winding resistance, ohm */
  Rs: number;
  /** d-axis incremental inductance, H */
  Ld: number;
  /** q-axis incremental inductance, H */
  Lq: number;
}

export function currentLoopPlant(machine: MachineInput, id = 0, iq = 0): CurrentLoopPlant {
  const model = machineModel(machine);
  const L = new Float64Array(4);
  model.incrementalInductance(id, iq, L);
  return { Rs: model.Rs, Ld: L[0]!, Lq: L[3]! };
}
