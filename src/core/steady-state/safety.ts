/**
 * Safety figures that can hurt someone: open-circuit back-EMF at maximum speed with the cold magnet
 * against the bus, the uncontrolled-generator speed, and the characteristic current against Imax.
 */
import type { MachineInput } from '../machine/machine-model';
import type { Finding } from '../base/finding';
import type { InverterSpec } from '../drive/inverter-spec';
import { InputError } from '../base/errors';
import { assertMachine } from './mtpa';
import { machineModel } from '../machine/linear-dq';
import { SQRT3, radSToRpm } from '../base/units';

export const SAFETY_CAUTION =
  'High DC-bus voltage is dangerous. A permanent-magnet machine makes voltage whenever it turns, with the ' +
  'inverter off; at overspeed its back-EMF can exceed the bus and charge it through the diodes. Follow local ' +
  'codes, licensed practice and IEC 61800-5-1.';

export interface SafetyReport {
  /** speed the report is for, rad/s */
  maxSpeed_rad_s: number;
  /** open-circuit line-to-line peak back-EMF at maxSpeed with the cold magnet, sqrt(3) p omega psiM, V */
  backEmfLineLinePeak_V: number;
  Vdc: number;
  exceedsBus: boolean;
  /** speed above which the line-to-line peak back-EMF exceeds Vdc, Vdc / (sqrt(3) p psiM), rad/s; null when psiM = 0 */
  uncontrolledGeneratorSpeed_rad_s: number | null;
  /** psiM / Ld, A peak (the short-circuit current at high speed) */
  characteristicCurrent_A: number;
  Imax: number;
  findings: Finding[];
  caution: string;
}

const rpm = (w: number) => `${Math.round(radSToRpm(w))} rpm`;

const amps = (x: number): string => `${x.toFixed(1)} A peak (${(x / Math.SQRT2).toFixed(1)} A rms)`;

/**
 * `speedGiven`: false when the file gives no maximum speed and `maxSpeed_rad_s` is only the top of
 * the plotted range; the back-EMF finding then says so and asks for the motor's maximum speed.
 */
export function safetyReport(coldInput: MachineInput, inverter: InverterSpec, maxSpeed_rad_s: number, speedGiven = true): SafetyReport {
  assertMachine(coldInput);
  if (!(Number.isFinite(maxSpeed_rad_s) && maxSpeed_rad_s >= 0)) throw new InputError('maxSpeed', 'must be >= 0 rad/s');
  if (!(Number.isFinite(inverter.Vdc) && inverter.Vdc > 0)) throw new InputError('inverter.Vdc', 'must be > 0 V');
  if (!(Number.isFinite(inverter.Imax) && inverter.Imax > 0)) throw new InputError('inverter.Imax', 'must be > 0 A');
  const cold = machineModel(coldInput);
  // the magnet's flux: the model's flux linkage at zero current, and the d inductance there
  const f = new Float64Array(2), L = new Float64Array(4);
  cold.flux(0, 0, f);
  cold.incrementalInductance(0, 0, L);
  const psiM = Math.hypot(f[0]!, f[1]!), Ld = L[0]!;
  const p = cold.polePairs;
  const emf = SQRT3 * p * maxSpeed_rad_s * psiM;
  const Vdc = inverter.Vdc;
  const exceeds = emf > Vdc;
  const wUcg = psiM > 0 ? Vdc / (SQRT3 * p * psiM) : null;
  const ich = psiM / Ld;
  const findings: Finding[] = [];
  if (exceeds) {
    findings.push({
      code: 'back-emf-above-bus', severity: 'danger', field: 'inverter.Vdc',
      message: `At ${rpm(maxSpeed_rad_s)} the cold-magnet back-EMF is ${emf.toFixed(0)} V line-to-line peak, above the ${Vdc.toFixed(0)} V bus. ` +
        'If gating stops, the diodes rectify it into the bus: uncontrolled braking and a rising bus voltage that can destroy the inverter and its capacitors.' +
        (speedGiven ? '' : ` No maximum speed is given (motor.maxSpeed_rpm or nameplate.maxSpeed_rpm): ${rpm(maxSpeed_rad_s)} is only the top of the plotted range; give the motor's maximum speed.`),
    });
  }
  if (wUcg !== null) {
    findings.push({
      code: 'uncontrolled-generator-speed', severity: exceeds ? 'danger' : 'info', field: 'inverter.Vdc',
      message: `Above ${rpm(wUcg)} the cold-magnet back-EMF exceeds the bus (uncontrolled generator if gating stops).`,
    });
  }
  if (psiM > 0 && ich < inverter.Imax) {
    findings.push({
      code: 'field-weakening-trip-braking', severity: 'warning', field: 'inverter.Imax',
      message: `The characteristic current psiM/Ld of the cold magnet, ${amps(ich)}, is below Imax = ${amps(inverter.Imax)}: the drive field-weakens deep, ` +
        'and a trip there leaves a braking current (into the bus through the diodes, or about psiM/Ld in a short circuit).',
    });
  } else if (psiM > 0) {
    findings.push({
      code: 'short-circuit-current-above-imax', severity: 'warning', field: 'inverter.Imax',
      message: `The characteristic current psiM/Ld of the cold magnet, ${amps(ich)}, is above Imax = ${amps(inverter.Imax)}: a short-circuit safe state at speed would exceed the inverter's peak current.`,
    });
  }
  return {
    maxSpeed_rad_s, backEmfLineLinePeak_V: emf, Vdc, exceedsBus: exceeds, uncontrolledGeneratorSpeed_rad_s: wUcg,
    characteristicCurrent_A: ich, Imax: inverter.Imax, findings, caution: SAFETY_CAUTION,
  };
}
