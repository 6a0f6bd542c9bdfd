// The gain schedule's table columns (core/reports/gain-schedule-table.ts): unit scaling of the
// schedule's numbers and the caption naming the design.
import { describe, expect, it } from 'vitest';
import { GAIN_SCHEDULE_COLUMNS, gainScheduleCaption, gainScheduleCells, CONSTANT_GAINS_LINE } from '../src/core/reports/gain-schedule-table';
import type { GainSchedule } from '../src/core/control/gain-schedule';

const s: GainSchedule = {
  bandwidthD_Hz: 600,
  bandwidthQ_Hz: 600,
  Rs_ohm: 0.05,
  rows: [
    { current_A: 0, id_A: 0, iq_A: 0, Ldd_H: 0.3e-3, Lqq_H: 0.9e-3, Ldq_H: 0, Lqd_H: 0, Kp_d: 1.131, Ki_d: 188.5, Kp_q: 3.393, Ki_q: 188.5 },
    { current_A: 200, id_A: -120, iq_A: 160, Ldd_H: 0.31e-3, Lqq_H: 0.5e-3, Ldq_H: -1e-5, Lqd_H: -1e-5, Kp_d: 1.169, Ki_d: 188.5, Kp_q: 1.885, Ki_q: 188.5 },
  ],
};

describe('gain schedule table', () => {
  it('columns in order with units; current peak and rms, inductances in mH', () => {
    expect(GAIN_SCHEDULE_COLUMNS.map((c) => c.header)).toEqual(['I A peak', 'I A rms', 'id A', 'iq A', 'Ldd mH', 'Lqq mH', 'Kp d V/A', 'Ki d V/(A·s)', 'Kp q V/A', 'Ki q V/(A·s)']);
    const c = gainScheduleCells(s);
    expect(c.length).toBe(2);
    // rms = peak / sqrt 2 for a sinusoid: common practice (no source)
    expect(c[1]![1]).toBeCloseTo(141.42, 2);
    expect(c[1]!.slice(2, 6).map((x) => Number(x.toPrecision(12)))).toEqual([-120, 160, 0.31, 0.5]);
    expect(c[1]!.slice(6)).toEqual([1.169, 188.5, 1.885, 188.5]);
  });

  it('the caption states the design rule and the crossover; different bandwidths per axis are named', () => {
    // Kp = L omega_c, Ki = Rs omega_c: Harnefors and Nee (1998), "Model-based current control of AC
    // machines using the internal model control method", IEEE Trans. Ind. Appl. 34(1)
    expect(gainScheduleCaption(s)).toMatch(/Kp = L_inc·ωc, Ki = Rs·ωc with Rs 0\.05 Ω \(hot winding\), crossover kept at 600 Hz on both axes/);
    expect(gainScheduleCaption({ ...s, bandwidthQ_Hz: 212.2 })).toMatch(/600 Hz on d, 212\.2 Hz on q/);
    expect(CONSTANT_GAINS_LINE).toMatch(/do not change with current/);
  });
});
