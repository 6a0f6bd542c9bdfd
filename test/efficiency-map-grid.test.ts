// The app's efficiency map assembled a speed at a time (core/reports/efficiency-map-grid.ts): the same
// numbers as the engine's whole-grid map, the grid checked, the best point found, and the CSV.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadProjectText } from '../src/core/project/project';
import { lossConditionsFromProject } from '../src/core/project/loss-conditions-from-project';
import { efficiencyMap } from '../src/core/steady-state/efficiency-map';
import { bestPoint, efficiencyGridAxes, emptyEfficiencyMap, solveEfficiencyRow } from '../src/core/reports/efficiency-map-grid';
import { EFFICIENCY_APP_CSV_COLUMNS as EFFICIENCY_CSV_HEADER, efficiencyMapCsv as csvOf } from '../src/core/reports/efficiency-map-report';
const efficiencyMapCsv = (m: Parameters<typeof csvOf>[0]): string => csvOf(m, [], EFFICIENCY_CSV_HEADER);
import { parseCsv } from '../src/core/reports/csv';
import { isInputError } from '../src/core/base/errors';

const traction = () => loadProjectText(readFileSync(join(__dirname, '..', 'resources', 'demo-ipm-traction.json'), 'utf8'));
const spec = { corner: 'hot' as const, points: 20, speedMax: 1300, torqueMax: 250 };

describe('efficiency map a row at a time', () => {
  const p = traction();
  const { speeds, torques } = efficiencyGridAxes(spec);
  const map = emptyEfficiencyMap(speeds, torques);
  for (let i = 0; i < speeds.length; i++) solveEfficiencyRow(p, 'hot', map, i);

  it('equals the engine map over the whole grid, value for value', () => {
    // each speed is solved on its own by the engine (its first guesses restart at every speed): identical numbers
    const whole = efficiencyMap(p.models.hot, p.peak, lossConditionsFromProject(p), speeds, torques);
    expect(Array.from(map.feasible)).toEqual(Array.from(whole.feasible));
    for (const f of ['motor', 'inverter', 'system', 'copper', 'iron', 'mechanical', 'inverterLoss', 'dcPower', 'torqueEm'] as const) expect(Array.from(map[f])).toEqual(Array.from(whole[f]));
    const inside = map.feasible.reduce((a, b) => a + b, 0);
    expect(inside).toBeGreaterThan(100);
    expect(inside).toBeLessThan(400);
  });

  it('min-loss rows a speed at a time equal the engine\'s whole min-loss map and its least-current starts', () => {
    const T = torques, sub = { speeds: Float64Array.from([speeds[3]!, speeds[9]!, speeds[15]!]) };
    const ml = emptyEfficiencyMap(sub.speeds, T), lc = emptyEfficiencyMap(sub.speeds, T);
    for (let i = 0; i < 3; i++) solveEfficiencyRow(p, 'hot', ml, i, 'min-loss', lc);
    const wholeLc = emptyEfficiencyMap(sub.speeds, T);
    const whole = efficiencyMap(p.models.hot, p.peak, lossConditionsFromProject(p), sub.speeds, T, { control: 'min-loss', leastCurrent: wholeLc });
    // each speed is solved on its own: identical numbers (common practice (no source))
    for (const f of ['feasible', 'system', 'copper', 'iron', 'inverterLoss', 'torqueEm'] as const) {
      expect(Array.from(ml[f])).toEqual(Array.from(whole[f]));
      expect(Array.from(lc[f])).toEqual(Array.from(wholeLc[f]));
    }
    expect(ml.feasible.reduce((a, b) => a + b, 0)).toBeGreaterThan(10);
  });

  it('axes span 0..top speed and -T..+T with the points asked for', () => {
    expect(speeds.length).toBe(20);
    expect(speeds[0]).toBe(0);
    expect(speeds[19]).toBeCloseTo(1300, 12);
    expect(torques[0]).toBeCloseTo(-250, 12);
    expect(torques[19]).toBeCloseTo(250, 12);
  });

  it('refuses a grid outside 20..150 points, naming the field', () => {
    for (const points of [19, 151, 30.5]) {
      let err: unknown = null;
      try {
        efficiencyGridAxes({ ...spec, points });
      } catch (e) {
        err = e;
      }
      expect(isInputError(err)).toBe(true);
      expect((err as Error).message).toMatch(/^points must be a whole number from 20 to 150/);
    }
  });

  it('the best system efficiency is a feasible point of the map, in a plausible band', () => {
    const b = bestPoint(map, 'system')!;
    let max = -Infinity;
    for (let k = 0; k < map.system.length; k++) if (map.feasible[k]) max = Math.max(max, map.system[k]!);
    expect(b.value).toBe(max);
    // a traction drive peaks between 80 and 99 % system efficiency: common practice (no source)
    expect(b.value).toBeGreaterThan(0.8);
    expect(b.value).toBeLessThan(0.99);
    expect(b.speed).toBeGreaterThan(0);
  });

  it('writes one CSV record per grid point, reading back to the map', () => {
    const rows = parseCsv(efficiencyMapCsv(map));
    expect(rows[0]).toEqual([...EFFICIENCY_CSV_HEADER]);
    expect(rows.length).toBe(1 + 400);
    const k = map.feasible.findIndex((f, i) => f === 1 && i > 200);
    const r = rows[1 + k]!;
    expect(Number(r[0])).toBeCloseTo((map.speeds[Math.floor(k / 20)]! * 60) / (2 * Math.PI), 6);
    expect(Number(r[1])).toBeCloseTo(map.torques[k % 20]!, 8);
    expect(r[2]).toBe('1');
    expect(Number(r[5])).toBeCloseTo(map.system[k]!, 9);
    expect(Number(r[10])).toBeCloseTo(map.dcPower[k]!, 3);
    const out = map.feasible.findIndex((f) => f === 0);
    expect(rows[1 + out]![2]).toBe('0');
    expect(rows[1 + out]![5]).toBe('');
  });
});
