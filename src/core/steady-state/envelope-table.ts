/**
 * The envelope as a table at round speeds, for one corner: the largest motoring and generating
 * torque under the peak and under the continuous current, and the power, at 0, step, 2 step, ...
 * up to the top of the range. Each value is solved at its speed by the engine (not read off a curve).
 */
import type { MachineInput } from '../machine/machine-model';
import type { DriveLimits } from '../drive/inverter-spec';
import { maxTorquePoint } from './envelope';
import { machineModel } from '../machine/linear-dq';
import { InputError } from '../base/errors';
import { roundStep, stepsWithin } from '../mathematics/round-steps';
import { rpmToRadS } from '../base/units';

export interface EnvelopeTableRow {
  speed_rpm: number;
  /** N·m, null beyond the maximum speed of that curve */
  peakMotoring_Nm: number | null;
  peakMotoring_kW: number | null;
  peakGenerating_Nm: number | null;
  continuousMotoring_Nm: number | null;
  continuousMotoring_kW: number | null;
  continuousGenerating_Nm: number | null;
}

/** Most rows a table may have (a step too small for the range is refused by name). */
export const MAX_TABLE_ROWS = 500;

/** The default step: the smallest 1-2-5 step in rpm giving at most 20 intervals over the range (9 to 21 rows). */
export const defaultTableStep = (speedMax_rpm: number): number => roundStep(speedMax_rpm, 20);

/**
 * @param field the name a bad step is reported under (the CLI's flag or the app's field)
 */
export function envelopeTable(input: MachineInput, peak: DriveLimits, continuous: DriveLimits, speedMax_rpm: number, step_rpm: number, field = 'table step'): EnvelopeTableRow[] {
  if (!(Number.isFinite(step_rpm) && step_rpm > 0)) throw new InputError(field, `must be a speed step > 0 rpm (got ${step_rpm})`);
  if (speedMax_rpm / step_rpm > MAX_TABLE_ROWS) {
    throw new InputError(field, `gives more than ${MAX_TABLE_ROWS} rows over 0 to ${Math.round(speedMax_rpm)} rpm; use a step >= ${Math.ceil(speedMax_rpm / MAX_TABLE_ROWS)} rpm`);
  }
  const m = machineModel(input);
  const torque = (lim: DriveLimits, w: number, dir: 'motoring' | 'generating'): number | null => {
    const op = maxTorquePoint(m, lim, w, dir);
    return op.feasible ? op.torque : null;
  };
  return stepsWithin(0, speedMax_rpm, step_rpm).map((speed_rpm) => {
    const w = rpmToRadS(speed_rpm);
    const pm = torque(peak, w, 'motoring');
    const cm = torque(continuous, w, 'motoring');
    return {
      speed_rpm,
      peakMotoring_Nm: pm,
      peakMotoring_kW: pm === null ? null : (pm * w) / 1000,
      peakGenerating_Nm: torque(peak, w, 'generating'),
      continuousMotoring_Nm: cm,
      continuousMotoring_kW: cm === null ? null : (cm * w) / 1000,
      continuousGenerating_Nm: torque(continuous, w, 'generating'),
    };
  });
}

/** A typed table step (the app's field): blank for the default, or rpm giving at most MAX_TABLE_ROWS rows over the range; else what is allowed. */
export function parseTableStep(text: string, speedMax_rpm: number): { step: number | undefined } | { message: string } {
  const t = text.trim();
  if (t === '') return { step: undefined };
  const v = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(t) ? Number(t) : NaN;
  if (!(Number.isFinite(v) && v > 0)) return { message: `must be a speed step > 0 rpm (got '${t}'), or blank for the default` };
  if (speedMax_rpm / v > MAX_TABLE_ROWS) return { message: `gives more than ${MAX_TABLE_ROWS} rows; use a step >= ${Math.ceil(speedMax_rpm / MAX_TABLE_ROWS)} rpm` };
  return { step: v };
}
