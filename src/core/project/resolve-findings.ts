/**
 * Findings of a resolved machine against its drive, said plainly: the motor's ratings against the
 * inverter's limits (current, and the rated point at the hot corner), and legal but unusual inputs
 * (a lossless winding, a reluctance machine, inverse saliency, a current limit below friction, a
 * bus that reaches no requirement).
 */
import type { DqMachine, Mechanics } from '../machine/dq-machine';
import type { DriveLimits, InverterSpec } from '../drive/inverter-spec';
import type { Finding } from '../base/finding';
import { fmt, type RatedData } from '../machine/nameplate';
import { solveOperatingPoint } from '../steady-state/operating-point';
import { mtpaTorque } from '../steady-state/mtpa';
import { RPM_TO_RAD_S, SQRT2 } from '../base/units';

/** The motor's rated point against this inverter: current limits, and voltage at the hot corner. */
export function ratedFindings(rated: RatedData, hot: DqMachine, inv: InverterSpec, peak: DriveLimits, section: 'motor' | 'nameplate'): Finding[] {
  const out: Finding[] = [];
  const amps = (x: number): string => `${fmt(x)} A peak (${fmt(x / SQRT2)} A rms)`;
  if (rated.current_A !== undefined) {
    if (rated.current_A > inv.Imax) {
      out.push({
        code: 'rated-current-above-imax',
        severity: 'warning',
        field: `${section}.ratedCurrent`,
        message: `The motor's rated current ${amps(rated.current_A)} is above the inverter's peak current ${amps(inv.Imax)}: the motor cannot reach its rated torque on this inverter.`,
      });
    } else if (rated.current_A > 1.01 * inv.Icont) {
      out.push({
        code: 'rated-current-above-icont',
        severity: 'warning',
        field: `${section}.ratedCurrent`,
        message: `The motor's rated current ${amps(rated.current_A)} is above the inverter's continuous current ${amps(inv.Icont)}: rated torque is available only for short periods.`,
      });
    }
  }
  // the inverter can drive more current than the motor is rated for: a demagnetisation risk
  // (allowing 1 % for rounding between an rms datasheet figure and a peak inverter rating)
  if (rated.peakCurrent_A !== undefined && inv.Imax > 1.01 * rated.peakCurrent_A) {
    out.push({
      code: 'imax-above-motor-peak',
      severity: 'danger',
      field: 'inverter.Imax',
      message: `The inverter's peak current ${amps(inv.Imax)} is above the motor's peak current ${amps(rated.peakCurrent_A)}: ` +
        'current beyond the motor rating, above all negative d-axis current in field weakening at a hot magnet, risks demagnetising the magnets for good. ' +
        `Torquewise limits every result to the motor's ${amps(rated.peakCurrent_A)}; set the drive's own current limit there too, or confirm the magnets' demagnetisation limit with the motor's maker.`,
    });
  }
  // a drive that may hold more current than the motor is rated for overheats the winding
  if (rated.current_A !== undefined && inv.Icont > 1.01 * rated.current_A) {
    out.push({
      code: 'icont-above-motor-rated',
      severity: 'warning',
      field: 'inverter.Icont',
      message: `The inverter's continuous current ${amps(inv.Icont)} is above the motor's rated current ${amps(rated.current_A)}: ` +
        "held for long, it overheats the winding. Continuous results here use the motor's rated current; set the drive's continuous limit (or its overload protection) to it.",
    });
  }
  if (rated.speed_rad_s !== undefined && rated.torque_Nm !== undefined) {
    const op = solveOperatingPoint(hot, peak, rated.speed_rad_s, rated.torque_Nm);
    if (!op.feasible) {
      const why =
        op.limitedBy === 'current'
          ? `it needs ${amps(op.current)}, above Imax`
          : op.limitedBy === 'beyond-mtpv'
            ? `no current reaches it within ${fmt(peak.Vmax)} V peak phase (beyond the maximum-torque-per-volt limit)`
            : `it needs ${amps(op.current)} to stay within ${fmt(peak.Vmax)} V peak phase, above Imax`;
      out.push({
        code: 'rated-point-infeasible',
        severity: 'warning',
        field: 'nameplate.ratedTorque_Nm',
        message: `The rated point (${fmt(rated.torque_Nm)} N·m at ${fmt((rated.speed_rad_s * 60) / (2 * Math.PI))} rpm) is outside this inverter at the hot corner: ${why}.`,
      });
    }
  }
  return out;
}

/**
 * Legal but unusual inputs, said plainly: a lossless winding, a reluctance machine, inverse
 * saliency, a bus that reaches no requirement, a current limit that cannot overcome friction.
 */
export function oddMachineFindings(section: string, m20: DqMachine, hot: DqMachine, mech: Mechanics, peak: DriveLimits, reqs: ReadonlyArray<{ speed_rpm: number; torque_Nm: number }>): Finding[] {
  const out: Finding[] = [];
  if (m20.Rs === 0) {
    out.push({
      code: 'lossless-winding',
      severity: 'info',
      field: `${section}.Rs`,
      message: 'Rs = 0: lossless winding assumed (no copper loss, no resistive drop); the internal-model current PI then has Ki = Rs·bandwidth = 0 (proportional only).',
    });
  }
  if (m20.psiM === 0) {
    out.push({
      code: 'reluctance-machine',
      severity: 'info',
      field: `${section}.psiM`,
      message: 'psiM = 0: reluctance machine: no magnet torque, torque from (Ld - Lq)·id·iq only; back-EMF checks do not apply.',
    });
  } else if (m20.Ld > m20.Lq) {
    out.push({
      code: 'inverse-saliency',
      severity: 'info',
      field: `${section}.Ld`,
      message: `Ld > Lq (inverse saliency, Lq/Ld = ${fmt(m20.Lq / m20.Ld)}): reluctance torque needs positive (magnetising) id, which raises the flux and the voltage at speed.`,
    });
  }
  const tStall = mtpaTorque(hot, peak.Imax);
  if (mech.coulombFriction > 0 && tStall < mech.coulombFriction) {
    out.push({
      code: 'imax-below-friction',
      severity: 'warning',
      field: 'inverter.Imax',
      message: `At Imax ${fmt(peak.Imax)} A peak the motor makes at most ${fmt(tStall)} N·m (hot corner), below its Coulomb friction ${fmt(mech.coulombFriction)} N·m: it cannot start even without load.`,
    });
  }
  if (reqs.length > 0) {
    let reached = false;
    let byVoltage = 0;
    for (let k = 0; k < reqs.length && !reached; k++) {
      const q = reqs[k]!;
      const op = solveOperatingPoint(hot, peak, q.speed_rpm * RPM_TO_RAD_S, q.torque_Nm);
      if (op.feasible) reached = true;
      else if (op.limitedBy !== 'current') byVoltage++;
    }
    if (!reached && byVoltage > 0) {
      out.push({
        code: 'bus-reaches-no-requirement',
        severity: 'warning',
        field: 'inverter.Vdc',
        message: `No requirement is reachable at the hot corner (${byVoltage} of ${reqs.length} fail on the voltage limit ${fmt(peak.Vmax)} V peak phase): the bus is too low for this motor at these speeds.`,
      });
    }
  }
  return out;
}
