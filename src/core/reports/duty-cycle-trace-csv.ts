/**
 * A duty cycle's last repeat as CSV, one row per evaluation instant (through csv.ts: text quoted,
 * formula starts neutralised, numbers as numbers): speed, shaft torque, current (A peak), the losses
 * and the DC power (W), the temperature traces (°C), why the instant is outside the envelope (empty
 * inside) and whether its loss point was solved (1) or interpolated between solved ones (0).
 */
import { csvDocument, type CsvCell } from './csv';
import type { DutyCycleResult } from '../simulation/duty-cycle';
import { OUTSIDE } from '../simulation/instant-losses';

export const DUTY_CYCLE_TRACE_CSV_HEADER = [
  't_s', 'speed_rpm', 'torque_Nm', 'current_A_peak', 'copper_W', 'iron_W', 'mechanical_W', 'inverter_W', 'dcPower_W',
  'winding_C', 'stator_C', 'magnet_C', 'junction_C', 'outside', 'solved',
] as const;

/** The rows after the comment rows (one cell each, starting with "#") and the header. */
export function dutyCycleTraceCsv(r: DutyCycleResult, comments: readonly string[] = []): string {
  const a = r.traces;
  function* rows(): Generator<readonly CsvCell[]> {
    for (const c of comments) yield [c];
    yield DUTY_CYCLE_TRACE_CSV_HEADER;
    for (let k = 0; k < r.t_s.length; k++) {
      yield [
        r.t_s[k]!, r.speed_rpm[k]!, r.torque_Nm[k]!, a.current_A[k]!, a.copper_W[k]!, a.iron_W[k]!, a.mechanical_W[k]!, a.inverter_W[k]!, a.dcPower_W[k]!,
        a.winding_C[k]!, a.stator_C[k]!, r.magnet_C[k]!, r.junction_C[k]!, a.outside[k] === 0 ? '' : OUTSIDE[a.outside[k]!]!, a.solved[k]!,
      ];
    }
  }
  return csvDocument(rows());
}
