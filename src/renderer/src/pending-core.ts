// TEMPORARY stand-in until src/core/sizing.ts and src/core/safety.ts land. Not to be committed.
import { solveOperatingPoint } from '../../core/operating-point';
import { maxTorquePoint } from '../../core/envelope';
import { rpmToRadS } from '../../core/units';
import type { DqMachine, InverterSpec, Requirement, Finding } from '../../core/types';
import { driveLimits } from '../../core/inverter';
export function sizeDrive(m: DqMachine, inv: InverterSpec, reqs: Requirement[]) {
  const lim = driveLimits(inv, 'peak');
  return {
    minImax: null as number | null, minVdc: null as number | null,
    points: reqs.map((r) => {
      const w = rpmToRadS(r.speed_rpm);
      const op = solveOperatingPoint(m, lim, w, r.torque_Nm);
      const mx = maxTorquePoint(m, lim, w, r.torque_Nm >= 0 ? 'motoring' : 'generating');
      return { label: r.label, speed_rpm: r.speed_rpm, torque_Nm: r.torque_Nm, met: op.feasible, torqueAvailable_Nm: mx.torque, current_A: op.current, voltage_V: op.voltage, currentHeadroom_A: lim.Imax - op.current, voltageHeadroom_V: lim.Vmax - op.voltage, limitedBy: op.limitedBy };
    }),
  };
}
export function safetyReport(cold: DqMachine, inv: InverterSpec, w: number) {
  const e = Math.sqrt(3) * cold.psiM * cold.polePairs * w;
  return { backEmfLineLinePeak_V: e, exceedsBus: e > inv.Vdc, uncontrolledGeneratorSpeed_rad_s: inv.Vdc / (Math.sqrt(3) * cold.psiM * cold.polePairs), characteristicCurrent_A: cold.psiM / cold.Ld, findings: [] as Finding[], caution: '' };
}
