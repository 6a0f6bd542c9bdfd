import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { loadProject } from '../src/core/project/project';
import { comparisonSpeedMax, variantSteady } from '../src/core/reports/variant-comparison';
import { compareEnvelopeFigure, variantColour } from '../src/renderer/src/views/compare/compare-figures';
import type { PlotTheme } from '../src/renderer/src/components/plot-style';

const theme: PlotTheme = { ink: '#000', muted: '#666', line: '#ccc', panel: '#fff', bg: '#fff', ok: '#080', bad: '#b00', dark: false };
const text = readFileSync(new URL('../resources/demo-spm-48v.json', import.meta.url), 'utf8');

describe('the comparison figure', () => {
  it('one colour per variant, hot solid and cold dashed, speeds in rpm, the requirement points of each', () => {
    const p = loadProject(text).resolved;
    const vs = [{ name: 'A', project: p }, { name: 'B', project: p }];
    const top = comparisonSpeedMax(vs);
    const { data } = compareEnvelopeFigure(vs.map((v) => variantSteady(v, top, 20)), theme);
    const lines = data.filter((d: any) => d.mode === 'lines') as any[];
    expect(lines.map((d) => d.name)).toEqual(['A, hot', 'A, cold', 'B, hot', 'B, cold']);
    expect(lines.map((d) => d.line.dash)).toEqual(['solid', 'dash', 'solid', 'dash']);
    expect(lines[0].line.color).toBe(variantColour(0, false));
    expect(lines[2].line.color).toBe(variantColour(1, false));
    expect(lines[0].line.color).not.toBe(lines[2].line.color);
    // rad/s to rpm: 60 / (2 pi) (common practice (no source))
    expect(lines[0].x.at(-1)).toBeCloseTo(top * 60 / (2 * Math.PI), 9);
    const marks = data.filter((d: any) => d.mode === 'markers') as any[];
    expect(marks).toHaveLength(2);
    expect(marks[0].text).toEqual(p.requirements.map((q) => q.label));
  });
});
