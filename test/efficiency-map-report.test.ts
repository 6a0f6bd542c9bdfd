// src/core/reports/efficiency-map-report.ts: the map's JSON arrays, CSV rows and summary on a hand-made map.
import { describe, expect, it } from 'vitest';
import type { EfficiencyMap } from '../src/core/steady-state/efficiency-map';
import { EFFICIENCY_GAIN_CSV_COLUMNS, EFFICIENCY_MAP_CSV_HEADER, efficiencyMapCsv, efficiencyMapJson, efficiencyMapSummary } from '../src/core/reports/efficiency-map-report';
import { parseCsv } from '../src/core/reports/csv';
import type { MinLossGainMap } from '../src/core/steady-state/min-loss-gain-map';

// 2 speeds (0 and 100 rad/s) x 3 torques; the point (1, 2) is outside
const f = (...x: number[]) => Float64Array.from(x);
const map: EfficiencyMap = {
  speeds: f(0, 100), torques: f(-10, 0, 10), feasible: Uint8Array.from([1, 1, 1, 1, 1, 0]),
  motor: f(0, 0, 0, 0.9, 0, NaN), inverter: f(0, 0, 0, 0.95, 0, NaN), system: f(0, 0, 0, 0.855, 0, NaN),
  copper: f(5, 0, 5, 50, 0, NaN), iron: f(0, 0, 0, 20, 10, NaN), mechanical: f(0, 0, 0, 30, 30, NaN), inverterLoss: f(3, 0, 3, 40, 8, NaN),
  dcPower: f(8, 0, 8, -860, 48, NaN), torqueEm: f(-10, 0, 10, -9.5, 0.4, NaN),
};

describe('efficiency map report', () => {
  it('summary: the best system efficiency inside and where (rpm = rad/s x 30 / pi, common practice (no source))', () => {
    const s = efficiencyMapSummary(map);
    expect(s).toMatchObject({ speedPoints: 2, torquePoints: 3, pointsInside: 5 });
    expect(s.peakSystem!.efficiency).toBe(0.855);
    expect(s.peakSystem!.speed_rpm).toBeCloseTo((100 * 30) / Math.PI, 9);
    expect(s.peakSystem!.torque_Nm).toBe(-10);
    expect(efficiencyMapSummary({ ...map, feasible: new Uint8Array(6) }).peakSystem).toBeNull();
  });

  it('JSON: speed-major arrays with null outside', () => {
    const j = efficiencyMapJson(map);
    expect(j.torques_Nm).toEqual([-10, 0, 10]);
    expect(j.feasible).toEqual([true, true, true, true, true, false]);
    expect(j.system).toEqual([0, 0, 0, 0.855, 0, null]);
    expect(j.inverter_W[3]).toBe(40);
  });

  it('CSV: comments, header, one row per point, empty cells outside (RFC 4180 via csv.ts)', () => {
    const rows = parseCsv(efficiencyMapCsv(map, ['# about']));
    expect(rows[0]).toEqual(['# about']);
    expect(rows[1]).toEqual([...EFFICIENCY_MAP_CSV_HEADER]);
    expect(rows).toHaveLength(2 + 6);
    expect(rows[2 + 3]).toEqual([String(Number(((100 * 30) / Math.PI).toPrecision(10))), '-10', '1', '0.9', '0.95', '0.855', '50', '20', '30', '40', '-860', '-9.5']);
    expect(rows[2 + 5]!.slice(2)).toEqual(['0', '', '', '', '', '', '', '', '', '']);
  });

  it('CSV: the gain columns chosen by the caller, empty where the gain has no point', () => {
    const gain: MinLossGainMap = {
      speeds: map.speeds, torques: map.torques, feasible: Uint8Array.from([1, 1, 1, 1, 0, 0]),
      lossLeastCurrent: f(8, 0, 8, 140, NaN, NaN), lossMinLoss: f(8, 0, 8, 131.5, NaN, NaN), lossSaved: f(0, 0, 0, 8.5, NaN, NaN), systemGain_pts: f(0, 0, 0, 0.25, NaN, NaN),
    };
    const rows = parseCsv(efficiencyMapCsv(map, [], ['speed_rpm', 'torque_Nm', 'system', ...EFFICIENCY_GAIN_CSV_COLUMNS], gain));
    expect(rows[0]).toEqual(['speed_rpm', 'torque_Nm', 'system', 'lossLeastCurrent_W', 'lossMinLoss_W', 'lossSaved_W', 'systemGain_pts']);
    // values written as given (RFC 4180 via csv.ts, common practice (no source))
    expect(rows[1 + 3]!.slice(1)).toEqual(['-10', '0.855', '140', '131.5', '8.5', '0.25']);
    expect(rows[1 + 4]!.slice(2)).toEqual(['0', '', '', '', '']);
    expect(() => efficiencyMapCsv(map, [], ['lossSaved_W'])).toThrow(/without the gain map/);
  });
});
