/**
 * A machine model whose winding and magnet temperatures follow a thermal state: the winding's
 * resistance by copper's coefficient (thermal.ts, resistanceAt) and the magnet's flux by its
 * remanence coefficient. Set in place, so that a duty cycle or a thermal fixed point re-tempers the
 * model at every instant without building a new one; a run owns its instance (never share one).
 */
import type { DqMachine } from './dq-machine';
import type { MachineModel } from './machine-model';
import { LinearDqModel } from './linear-dq';
import { fluxAt, resistanceAt } from './thermal';

export interface TemperatureModel {
  /** the model at the temperatures last set (the same object every time) */
  readonly model: MachineModel;
  /** winding and magnet temperatures, °C */
  setTemperatures(winding_C: number, magnet_C: number): void;
}

/** A constant-parameter model re-tempered in place (its Rs, psiM and closed-form terms). */
class RetemperedLinearModel extends LinearDqModel {
  set(Rs: number, psiM: number): void {
    const w = this as { Rs: number; psiM: number };
    w.Rs = Rs;
    w.psiM = psiM;
    (this.linear as { psiM: number }).psiM = psiM;
  }
}

/** The temperature model of a constant-parameter machine given at 20 °C, alphaBr in 1/K. */
export function linearTemperatureModel(m20: DqMachine, alphaBr: number): TemperatureModel {
  const model = new RetemperedLinearModel(m20);
  return {
    model,
    setTemperatures(winding_C: number, magnet_C: number): void {
      model.set(resistanceAt(m20.Rs, winding_C), fluxAt(m20.psiM, magnet_C, alphaBr));
    },
  };
}
