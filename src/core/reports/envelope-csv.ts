/**
 * The envelope as CSV, one row per speed point, for the command line's --csv and the app's export
 * alike (through csv.ts: text quoted, formula starts neutralised, numbers as numbers). Speed in rpm
 * (mechanical), currents in A peak and rms, voltage in V peak phase. Two namings of the columns:
 * 'cli', the command line's (one curve), and 'app', the app's export (a curve column first, several
 * curves in long form).
 */
import { csvDocument, type CsvCell } from './csv';
import { RAD_S_TO_RPM, SQRT2 } from '../base/units';
import type { Envelope } from '../steady-state/envelope';

/** The header row of each naming. */
export const ENVELOPE_CSV_HEADERS = {
  cli: ['speed_rpm', 'torque_Nm', 'power_W', 'id_A', 'iq_A', 'current_A_peak', 'current_A_rms', 'voltage_V_peak_phase', 'region'],
  app: ['curve', 'speed_rpm', 'torque_Nm', 'power_W', 'id_A', 'iq_A', 'current_A_peak', 'current_A_rms', 'voltage_V', 'region'],
} as const satisfies Record<string, readonly string[]>;

export type EnvelopeCsvNaming = keyof typeof ENVELOPE_CSV_HEADERS;

export interface EnvelopeCsvCurve {
  /** the curve's name in the 'app' naming's curve column, e.g. "peak-hot-motoring" */
  key: string;
  env: Envelope;
}

export interface EnvelopeCsvOptions {
  /** '#' rows before the header, one quoted cell each (a project name may hold commas or line breaks) */
  comments?: readonly string[];
  /** the column names; 'cli' (no curve column: give it one curve) by default */
  naming?: EnvelopeCsvNaming;
}

/** The region of point k, or 'beyond-max-speed' where no torque exists in the curve's direction. */
export function envelopeRegionAt(env: Envelope, k: number): string {
  return env.feasible[k] === 1 ? env.region[k]! : 'beyond-max-speed';
}

/** Every curve's points, one row each, after the comment rows and the header of the naming. */
export function envelopeCsv(curves: readonly EnvelopeCsvCurve[], options: EnvelopeCsvOptions = {}): string {
  const naming = options.naming ?? 'cli';
  const rows: CsvCell[][] = (options.comments ?? []).map((c) => [c]);
  rows.push([...ENVELOPE_CSV_HEADERS[naming]]);
  for (const { key, env } of curves) {
    for (let k = 0; k < env.speed.length; k++) {
      const cells: CsvCell[] = [env.speed[k]! * RAD_S_TO_RPM, env.torque[k]!, env.power[k]!, env.id[k]!, env.iq[k]!, env.current[k]!, env.current[k]! / SQRT2, env.voltage[k]!, envelopeRegionAt(env, k)];
      rows.push(naming === 'app' ? [key, ...cells] : cells);
    }
  }
  return csvDocument(rows);
}
