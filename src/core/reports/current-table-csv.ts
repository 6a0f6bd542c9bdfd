/**
 * The current-reference table (control/current-table.ts) as CSV (csv.ts, RFC 4180): '#' comment
 * rows (project, date, control, bus, the stated bound), then one row per corner, speed row and
 * torque column: corner, x (electrical rad/s per V of effective bus), the mechanical speed of that x
 * at the bus the table was built at (rpm), torque (N·m, electromagnetic), i_d and i_q (A peak), the
 * row's largest motoring and generating torque, and whether the node lies within the row's envelope
 * (1) or holds the row's maximum-torque point (0). Float32 values as the header holds them.
 */
import type { CurrentTable } from '../control/current-table';
import { rowSpeed } from '../control/current-table';
import { radSToRpm } from '../base/units';
import { type CsvCell, csvDocument } from './csv';
import type { CurrentTableAbout } from './current-table-header';

export const CURRENT_TABLE_CSV_HEADER = ['corner', 'x_rad_s_per_V', 'speed_rpm', 'torque_Nm', 'id_A', 'iq_A', 'row_max_motoring_Nm', 'row_max_generating_Nm', 'inside'] as const;

const g6 = (x: number): string => String(Number(x.toPrecision(6)));

export function currentTableCsv(t: CurrentTable, about: CurrentTableAbout): string {
  const b = about.bound;
  const rows: CsvCell[][] = [
    [`# torquewise current-reference table; project: ${about.project || 'unnamed'}; ${about.date}; ${t.control === 'min-loss' ? 'loss-minimising' : 'least'} current; torque electromagnetic`],
    [`# x = electrical speed / (Vdc - 2 device drop); built at Vdc ${g6(about.Vdc)} V (effective ${g6(t.bus_V)} V), Vmax ${g6(t.limits.Vmax)} V, Imax ${g6(t.limits.Imax)} A peak; speed_rpm at that bus`],
    [`# bound (bilinear, demand clamped to the row maximum): torque ${g6(b.torque_Nm)} N·m, current over Imax ${g6(b.current_A)} A, voltage over Vmax ${g6(b.voltage_V)} V`],
    [...CURRENT_TABLE_CSV_HEADER],
  ];
  for (const c of t.corners) {
    for (let r = 0; r < t.nS; r++) {
      const x = t.x[r]!;
      const rpm = radSToRpm(rowSpeed(x, t.bus_V, about.polePairs));
      const mot = c.tMot[r]!, gen = c.tGen[r]!;
      for (let j = 0; j < t.nT; j++) {
        const T = t.torque[j]!;
        const inside = T > 0 ? T < mot * (1 - 1e-9) : T < 0 ? -T < gen * (1 - 1e-9) : true;
        rows.push([c.name, x, rpm, T, c.id[r * t.nT + j]!, c.iq[r * t.nT + j]!, mot, gen, inside ? 1 : 0]);
      }
    }
  }
  return csvDocument(rows);
}
