/** The steady-state operating point of a current (id, iq) at a speed, through the machine model. */
import type { MachineModel } from '../machine/machine-model';
import type { OperatingPoint, Region } from './operating-point-types';

/** Voltage (the model's steady voltage) and torque of (id, iq) at mechanical speed `speed`; feasible, limitedBy 'none'. */
export function point(m: MachineModel, speed: number, id: number, iq: number, region: Region): OperatingPoint {
  const v = new Float64Array(2);
  m.steadyVoltage(id, iq, m.polePairs * speed, v);
  const vd = v[0]!, vq = v[1]!;
  return {
    feasible: true, speed, torque: m.torque(id, iq), id, iq, current: Math.hypot(id, iq),
    vd, vq, voltage: Math.hypot(vd, vq), region, limitedBy: 'none',
  };
}
