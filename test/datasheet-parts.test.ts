import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { datasheetCurves, datasheetEfficiencyGridOf, datasheetEfficiencyOf, datasheetVerdicts } from '../src/core/reports/datasheet-parts';
import { efficiencyGridAxes, emptyEfficiencyMap, solveEfficiencyRow } from '../src/core/reports/efficiency-map-grid';
import { computeDatasheetResults, DEFAULT_DATASHEET_RESULTS_OPTIONS } from '../src/core/reports/datasheet-results';
import { loadProjectText } from '../src/core/project/project';
import { RPM_TO_RAD_S } from '../src/core/base/units';
import { computeEnvelopes, computeVerdicts, DEFAULT_ENVELOPE_OPTIONS } from '../src/renderer/src/state/compute';

const load = (name: string) => loadProjectText(readFileSync(join(__dirname, '..', 'resources', name), 'utf8'));
const traction = load('demo-ipm-traction.json');
const servo = load('demo-servo-axis.json');
/** A project without the file's `losses` section (no efficiency map), as the demos were before they gained one. */
const withoutLosses = (name: string) => {
  const j = JSON.parse(readFileSync(join(__dirname, '..', 'resources', name), 'utf8'));
  delete j.losses;
  return loadProjectText(JSON.stringify(j));
};

describe('datasheet parts', () => {
  it('the curves and the verdicts together are the datasheet results, key for key and bit for bit', () => {
    // common practice (no source): a split computation must give what the whole one gave
    for (const p of [withoutLosses('demo-ipm-traction.json'), withoutLosses('demo-servo-axis.json')]) {
      const c = datasheetCurves(p, DEFAULT_DATASHEET_RESULTS_OPTIONS);
      const whole = computeDatasheetResults(p);
      const parts = { ...c, ...datasheetVerdicts(p, c.speedMax) };
      expect(Object.keys(parts)).toEqual(['project', 'speedMax', 'curves', 'constantsHot', 'constantsCold', 'sizing', 'sizingCold', 'safety', 'safetySpeed']);
      expect(parts).toEqual(whole);
    }
  });

  it('with a losses section the whole adds the efficiency map, and the app\'s worker solves the same map', () => {
    // common practice (no source): a split computation must give what the whole one gave
    const c = datasheetCurves(servo, DEFAULT_DATASHEET_RESULTS_OPTIONS);
    const whole = computeDatasheetResults(servo);
    const parts = { ...c, ...datasheetVerdicts(servo, c.speedMax), efficiency: datasheetEfficiencyOf(c) };
    expect(Object.keys(whole)).toEqual(['project', 'speedMax', 'curves', 'constantsHot', 'constantsCold', 'sizing', 'sizingCold', 'safety', 'safetySpeed', 'efficiency']);
    expect(parts).toEqual(whole);
    // the efficiency worker solves the grid row by row (efficiency-map-grid.ts): bit for bit the same map
    const grid = datasheetEfficiencyGridOf(c)!;
    const { speeds, torques } = efficiencyGridAxes(grid);
    const rows = emptyEfficiencyMap(speeds, torques);
    for (let i = 0; i < speeds.length; i++) solveEfficiencyRow(servo, grid.corner, rows, i);
    expect(rows).toEqual(whole.efficiency!.map);
  });

  it('the eight curves come peak then continuous, hot then cold, motoring then generating', () => {
    // common practice (no source): the CSV and the legend list the curves in this order
    const c = datasheetCurves(traction, { points: 12, speedMax: undefined });
    expect(c.curves.map((q) => `${q.current}-${q.corner}-${q.direction}`)).toEqual([
      'peak-hot-motoring', 'peak-hot-generating', 'peak-cold-motoring', 'peak-cold-generating',
      'continuous-hot-motoring', 'continuous-hot-generating', 'continuous-cold-motoring', 'continuous-cold-generating',
    ]);
    for (const q of c.curves) expect(q.env.speed).toHaveLength(12);
  });

  it('a given top speed is the end of every curve; the safety figures are for the rated maximum speed', () => {
    // from memory: the demo's motor is rated to 12000 rpm (resources/demo-ipm-traction.json)
    const c = datasheetCurves(traction, { points: 30, speedMax: 500 });
    expect(c.speedMax).toBe(500);
    for (const q of c.curves) expect(q.env.speed[q.env.speed.length - 1]).toBeCloseTo(500, 9);
    const v = datasheetVerdicts(traction, 500);
    expect(v.safetySpeed).toBeCloseTo(12000 * RPM_TO_RAD_S, 9);
    expect(v.sizing.points).toHaveLength(traction.requirements.length);
  });

  it('without a rated maximum speed the safety figures are for the top of the range', () => {
    // common practice (no source): the worst speed shown is the speed the hazards are checked at
    const p = { ...traction, rated: { ...traction.rated, maxSpeed_rad_s: undefined } };
    expect(datasheetVerdicts(p, 777).safetySpeed).toBe(777);
  });

  it('the app computes its curves and verdicts with these parts (one sizing for the app and the CLI)', () => {
    // common practice (no source)
    const e = computeEnvelopes(traction, DEFAULT_ENVELOPE_OPTIONS);
    const v = computeVerdicts(traction, e.speedMax);
    const whole = computeDatasheetResults(traction);
    expect(e.speedMax).toBe(whole.speedMax);
    expect(e.curves.map(({ key: _k, ...rest }) => rest)).toEqual(whole.curves);
    expect(e.curves.map((q) => q.key)).toEqual(whole.curves.map((q) => `${q.current}-${q.corner}-${q.direction}`));
    expect(v.sizing).toEqual(whole.sizing);
    expect(v.sizingCold).toEqual(whole.sizingCold);
    expect(v.safety).toEqual(whole.safety);
    expect(v.safetySpeed).toBe(whole.safetySpeed);
  });
});
