/**
 * The table of current-loop gains against current (control/gain-schedule.ts) as columns with their
 * units, shared by the `tune` command and the tuning view: the current magnitude in A peak and A rms,
 * the MTPA currents, the incremental inductances in mH and the PI gains per axis. Pure unit scaling
 * of the schedule's numbers; no physics here.
 */
import type { GainSchedule, GainScheduleRow } from '../control/gain-schedule';
import { peakToRms } from '../base/units';

/** One column: its key, a short header with the unit, and the row's value in that unit. */
export interface GainScheduleColumn {
  key: string;
  header: string;
  value: (r: GainScheduleRow) => number;
}

export const GAIN_SCHEDULE_COLUMNS: readonly GainScheduleColumn[] = [
  { key: 'current-peak', header: 'I A peak', value: (r) => r.current_A },
  { key: 'current-rms', header: 'I A rms', value: (r) => peakToRms(r.current_A) },
  { key: 'id', header: 'id A', value: (r) => r.id_A },
  { key: 'iq', header: 'iq A', value: (r) => r.iq_A },
  { key: 'Ldd', header: 'Ldd mH', value: (r) => r.Ldd_H * 1e3 },
  { key: 'Lqq', header: 'Lqq mH', value: (r) => r.Lqq_H * 1e3 },
  { key: 'Kp_d', header: 'Kp d V/A', value: (r) => r.Kp_d },
  { key: 'Ki_d', header: 'Ki d V/(A·s)', value: (r) => r.Ki_d },
  { key: 'Kp_q', header: 'Kp q V/A', value: (r) => r.Kp_q },
  { key: 'Ki_q', header: 'Ki q V/(A·s)', value: (r) => r.Ki_q },
];

/** The schedule's rows as numbers in the columns' units (one array per row, in column order). */
export function gainScheduleCells(s: GainSchedule): number[][] {
  return s.rows.map((r) => GAIN_SCHEDULE_COLUMNS.map((c) => c.value(r)));
}

const g = (x: number): string => String(Number(x.toPrecision(4)));

/** The sentence above the table (under its title): where the gains come from and what they keep. */
export function gainScheduleCaption(s: GainSchedule): string {
  const bw = s.bandwidthD_Hz === s.bandwidthQ_Hz ? `${g(s.bandwidthD_Hz)} Hz on both axes` : `${g(s.bandwidthD_Hz)} Hz on d, ${g(s.bandwidthQ_Hz)} Hz on q`;
  return (
    `Along MTPA (motoring), from the incremental inductances of the flux map at each point: ` +
    `Kp = L_inc·ωc, Ki = Rs·ωc with Rs ${g(s.Rs_ohm)} Ω (hot winding), crossover kept at ${bw}; the gains a firmware would schedule.`
  );
}

/** The one line shown instead of the table for a machine of constant inductances. */
export const CONSTANT_GAINS_LINE = 'The current-loop gains do not change with current: the inductances are constant.';
