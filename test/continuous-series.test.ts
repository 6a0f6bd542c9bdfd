// The S1 curves as chart lines (core/reports/continuous-series.ts) and on the datasheet's charts: runs
// of one binding limit, one legend entry per limit, power = torque x speed; a datasheet without S1
// curves is the one written before.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadProjectText } from '../src/core/project/project';
import { computeDatasheetResults } from '../src/core/reports/datasheet-results';
import { datasheetContinuousOf } from '../src/core/reports/datasheet-parts';
import { datasheetHtml } from '../src/core/reports/datasheet-html';
import { continuousName, continuousRuns, continuousSeries, CONTINUOUS_SVG_DASH } from '../src/core/reports/continuous-series';
import type { ContinuousPoint } from '../src/core/steady-state/continuous-torque';

const spm = loadProjectText(readFileSync(join(__dirname, '..', 'resources', 'demo-spm-48v.json'), 'utf8'));
const r = computeDatasheetResults(spm, { points: 40 });
const s1 = datasheetContinuousOf(spm, r.speedMax, 40)!;
const pt = (limitedBy: ContinuousPoint['limitedBy'], k: number): ContinuousPoint => ({ speed_rpm: k, torque_Nm: 2, limitedBy, windingTemp_C: 1, magnetTemp_C: 1, junctionTemp_C: 1 });

describe('runs of one binding limit', () => {
  it('split where the limit changes, a later run starting at the last point of the one before', () => {
    expect(continuousRuns([pt('winding', 0), pt('winding', 1), pt('current', 2), pt('voltage', 3)])).toEqual([
      { limit: 'winding', k0: 0, k1: 1 }, { limit: 'current', k0: 1, k1: 2 }, { limit: 'voltage', k0: 2, k1: 3 },
    ]);
    expect(continuousRuns([])).toEqual([]);
  });
});

describe('S1 chart series', () => {
  it('one legend entry per limit, each run in its limit\'s dash, power = torque x speed in kW', () => {
    const t = continuousSeries(s1, 'torque', '#000');
    const p = continuousSeries(s1, 'power', '#000');
    const limits = new Set([...s1.motoring, ...s1.generating].map((q) => q.limitedBy));
    expect(t.filter((s) => s.legend).map((s) => s.name).sort()).toEqual([...limits].map(continuousName).sort());
    for (const s of t) expect(s.dash).toBe(CONTINUOUS_SVG_DASH[[...limits].find((l) => continuousName(l) === s.name)!]);
    // P = T w (common practice (no source))
    expect(p[0]!.y[5]).toBeCloseTo((t[0]!.y[5]! * t[0]!.x[5]! * Math.PI) / 30 / 1000, 12);
    expect(t[0]!.x[0]).toBe(0);
    expect(t[0]!.y[0]).toBe(s1.motoring[0]!.torque_Nm);
  });

  it('are drawn on the datasheet\'s torque and power charts only when given', () => {
    const plain = datasheetHtml(r, { date: 'd' });
    const withS1 = datasheetHtml({ ...r, continuous: s1 }, { date: 'd' });
    expect(plain).not.toContain('S1 continuous');
    for (const chart of ['chart-torque', 'chart-power']) {
      const svg = new RegExp(`<svg [^>]*data-testid="${chart}"[\\s\\S]*?</svg>`).exec(withS1)![0];
      expect(svg).toContain(`>${continuousName(s1.motoring[0]!.limitedBy)}</text>`);
    }
    expect(datasheetHtml({ ...r, continuous: null }, { date: 'd' })).toBe(plain);
  });
});
