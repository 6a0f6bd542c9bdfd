// The datasheet's efficiency map: its grid, the map (the core's, least-current control, hot corner)
// and its summary.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadProjectText } from '../src/core/project/project';
import { datasheetCurves } from '../src/core/reports/datasheet-parts';
import { DEFAULT_DATASHEET_RESULTS_OPTIONS } from '../src/core/reports/datasheet-results';
import { DATASHEET_MAP_POINTS, datasheetEfficiency, datasheetEfficiencyGrid, datasheetEfficiencySummary } from '../src/core/reports/datasheet-efficiency';
import { RAD_S_TO_RPM } from '../src/core/base/units';

const fileOf = (n: string) => JSON.parse(readFileSync(join(__dirname, '..', 'resources', `${n}.json`), 'utf8'));
const servo = loadProjectText(JSON.stringify(fileOf('demo-servo-axis')));
const servoCurves = datasheetCurves(servo, DEFAULT_DATASHEET_RESULTS_OPTIONS);
const hotPeak = (c: typeof servoCurves) => c.curves.filter((q) => q.corner === 'hot' && q.current === 'peak').map((q) => q.env);
const grid = datasheetEfficiencyGrid(servo, servoCurves.speedMax, hotPeak(servoCurves))!;
const eff = datasheetEfficiency(servo, grid);

describe('datasheet efficiency map', () => {
  it('has a grid only for a file with a losses section, even an empty one (copper and friction alone)', () => {
    // common practice (no source): absent section, no map; the datasheet stays what it was
    const without = fileOf('demo-servo-axis');
    delete without.losses;
    const p0 = loadProjectText(JSON.stringify(without));
    expect(datasheetEfficiencyGrid(p0, servoCurves.speedMax, hotPeak(servoCurves))).toBeNull();
    const p1 = loadProjectText(JSON.stringify({ ...without, losses: {} }));
    expect(datasheetEfficiencyGrid(p1, servoCurves.speedMax, hotPeak(servoCurves))).not.toBeNull();
  });

  it('spans speed 0 to the datasheet top and shaft torque 5 % past the hot peak envelopes, 60 points for constant parameters, 30 for a flux map', () => {
    // common practice (no source): the generating shaft torque exceeds the electromagnetic one by the losses
    let tmax = 0;
    for (const env of hotPeak(servoCurves)) for (let k = 0; k < env.torque.length; k++) if (env.feasible[k]) tmax = Math.max(tmax, Math.abs(env.torque[k]!));
    expect(grid).toEqual({ corner: 'hot', points: DATASHEET_MAP_POINTS.linear, speedMax: servoCurves.speedMax, torqueMax: 1.05 * tmax });
    expect(DATASHEET_MAP_POINTS).toEqual({ linear: 60, fluxMap: 30 });
    expect(eff.map.speeds[0]).toBe(0);
    expect(eff.map.speeds[59]).toBeCloseTo(servoCurves.speedMax, 12);
    expect(eff.map.torques[0]).toBeCloseTo(-1.05 * tmax, 12);
    const sat = loadProjectText(JSON.stringify(fileOf('demo-ipm-saturated')));
    const satCurves = datasheetCurves(sat, { points: 20, speedMax: undefined });
    expect(sat.models.hot.linear).toBeNull();
    expect(datasheetEfficiencyGrid(sat, satCurves.speedMax, hotPeak(satCurves))!.points).toBe(DATASHEET_MAP_POINTS.fluxMap);
  });

  it('summarises the best system efficiency motoring and generating, each by the definition of issue 12', () => {
    const s = datasheetEfficiencySummary(eff);
    const m = eff.map;
    const nT = m.torques.length;
    let inside = 0, best = -Infinity;
    for (let k = 0; k < m.feasible.length; k++) if (m.feasible[k]) { inside++; best = Math.max(best, m.system[k]!); }
    expect(s).toMatchObject({ quantity: 'system', corner: 'hot', control: 'least-current', speedPoints: 60, torquePoints: 60, pointsInside: inside });
    expect(s.peakSystem!.efficiency).toBe(best);
    expect(best).toBe(Math.max(s.peakMotoring!.efficiency, s.peakGenerating!.efficiency));
    expect(s.peakMotoring!.torque_Nm).toBeGreaterThan(0);
    expect(s.peakGenerating!.torque_Nm).toBeLessThan(0);
    // motoring: shaft power over DC-link power; generating: DC-link power out over shaft power in (issue 12)
    for (const q of [s.peakMotoring!, s.peakGenerating!]) {
      const i = m.speeds.findIndex((w) => Math.abs(w * RAD_S_TO_RPM - q.speed_rpm) < 1e-9);
      const j = Array.from(m.torques).indexOf(q.torque_Nm);
      const k = i * nT + j;
      const shaft = q.torque_Nm * m.speeds[i]!;
      expect(q.efficiency).toBeCloseTo(shaft > 0 ? shaft / m.dcPower[k]! : m.dcPower[k]! / shaft, 12);
      expect(q.efficiency).toBeGreaterThan(0.8);
      expect(q.efficiency).toBeLessThan(1);
    }
  });

  it('is low where little shaft power comes out: zero at standstill, rising with speed at a torque (common practice)', () => {
    const m = eff.map;
    const nT = m.torques.length;
    // no shaft power at standstill: efficiency 0 by definition
    for (let j = 0; j < nT; j++) if (m.feasible[j]) expect(m.system[j]).toBe(0);
    // along the row nearest half the peak torque, motoring, efficiency rises from the lowest speeds (copper loss fixed, output grows with speed)
    const j = Array.from(m.torques).findIndex((t) => t > 0.45 * grid.torqueMax);
    expect(m.system[1 * nT + j]!).toBeLessThan(m.system[5 * nT + j]!);
    expect(m.system[5 * nT + j]!).toBeLessThan(m.system[20 * nT + j]!);
  });
});
