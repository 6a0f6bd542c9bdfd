import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { computeDatasheetResults, type DatasheetResults } from '../src/core/reports/datasheet-results';
import { loadProjectText } from '../src/core/project/project';
import { computeResults, DEFAULT_ENVELOPE_OPTIONS } from '../src/renderer/src/state/compute';

const traction = loadProjectText(readFileSync(join(__dirname, '..', 'resources', 'demo-ipm-traction.json'), 'utf8'));

describe('datasheet results', () => {
  it('are what the app computes for its views (the CLI and the app write the same datasheet)', () => {
    const cli = computeDatasheetResults(traction);
    const app: DatasheetResults = computeResults(traction, DEFAULT_ENVELOPE_OPTIONS);
    expect(cli.speedMax).toBe(app.speedMax);
    expect(cli.curves).toHaveLength(8);
    for (const c of cli.curves) {
      const a = app.curves.find((q) => q.current === c.current && q.corner === c.corner && q.direction === c.direction)!;
      expect(Array.from(c.env.torque)).toEqual(Array.from(a.env.torque));
      expect(Array.from(c.env.speed)).toEqual(Array.from(a.env.speed));
    }
    expect(cli.sizing).toEqual(app.sizing);
    expect(cli.sizingCold).toEqual(app.sizingCold);
    expect(cli.safety).toEqual(app.safety);
    expect(cli.safetySpeed).toBe(app.safetySpeed);
    expect(cli.constantsHot).toEqual(app.constantsHot);
  });
  it('use the effective limits: peak curves at p.peak, continuous at p.continuous', () => {
    const r = computeDatasheetResults(traction, { points: 20 });
    const at = (current: 'peak' | 'continuous') => r.curves.find((c) => c.current === current && c.corner === 'hot' && c.direction === 'motoring')!.env;
    // standstill: |i| is the current limit itself (MTPA at the limit)
    expect(at('peak').current[0]).toBeCloseTo(traction.peak.Imax, 9);
    expect(at('continuous').current[0]).toBeCloseTo(traction.continuous.Imax, 9);
    expect(r.speedMax).toBeGreaterThan(0);
    expect(at('peak').speed).toHaveLength(20);
  });
});
