// The datasheet's efficiency figure: iso-efficiency lines with their levels, the envelopes over
// them, the best points, axis titles with units and the conditions every figure carries.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadProjectText } from '../src/core/project/project';
import { computeDatasheetResults } from '../src/core/reports/datasheet-results';
import { datasheetCharts } from '../src/core/reports/datasheet-html';
import { efficiencyMapChart, LEVEL_COLOURS } from '../src/core/reports/efficiency-map-chart';
import { datasheetEfficiencySummary, EFFICIENCY_LEVELS } from '../src/core/reports/datasheet-efficiency';
import { contourLines } from '../src/core/mathematics/contour-lines';
import { figureConditions } from '../src/core/reports/figure-conditions';
import { RAD_S_TO_RPM } from '../src/core/base/units';

const fileOf = (n: string) => JSON.parse(readFileSync(join(__dirname, '..', 'resources', `${n}.json`), 'utf8'));
const servoFile = fileOf('demo-servo-axis');
const servo = loadProjectText(JSON.stringify(servoFile));
const r = computeDatasheetResults(servo);
const e = r.efficiency!;
const chart = (name?: string) =>
  efficiencyMapChart(
    { project: name === undefined ? servo : { ...servo, name }, efficiency: e, envelopes: r.curves.filter((q) => q.corner === 'hot') },
    { date: '2026-12-03', version: '9.9.9' },
  );
const svg = chart();
const s = datasheetEfficiencySummary(e);

describe('efficiency map chart', () => {
  it('is titled, has axis titles with units and carries the conditions of every figure', () => {
    expect(svg).toContain('data-testid="chart-efficiency"');
    expect(svg).toContain('Invented demo: servo axis on a 320 V rectified bus: system efficiency map, hot');
    expect(svg).toContain('>speed, rpm (mechanical)</text>');
    expect(svg).toContain('>shaft torque, N·m (negative: generating)</text>');
    // the short conditions lines whole; the long ones wrapped, so word by word
    const lines = figureConditions(servo, { date: '2026-12-03', version: '9.9.9' });
    expect(svg).toContain(`>${lines[0]}</text>`);
    for (const word of lines[1]!.split(' ')) expect(svg).toContain(word);
    // the caption's lines joined again where they were wrapped
    const caption = Array.from(svg.matchAll(/font-size="10.5" fill="#5a5a60">([^<]*)<\/text>/g), (m) => m[1]).join(' ');
    for (const line of lines) expect(caption).toContain(line);
    expect(caption).toContain('system efficiency: shaft power over DC-link power motoring, DC-link power over shaft power generating');
    expect(caption).toContain('grid 60 speeds x 60 shaft torques');
  });

  it('draws one line per level below the best efficiency, in its colour, each labelled with its level in per cent', () => {
    // common practice (no source): a level above the best point has no line
    const below = EFFICIENCY_LEVELS.filter((l) => l < s.peakSystem!.efficiency);
    expect(below).toEqual([0.7, 0.8, 0.85, 0.9, 0.92]); // the servo demo's best system efficiency is about 92.6 %
    EFFICIENCY_LEVELS.forEach((level, n) => {
      const drawn = svg.includes(`stroke="${LEVEL_COLOURS[n]}" stroke-width="1.3"/>`);
      expect(drawn, `level ${level}`).toBe(level < s.peakSystem!.efficiency);
      if (drawn) expect(svg).toMatch(new RegExp(`fill="${LEVEL_COLOURS[n]}"[^>]*>${Math.round(100 * level)}</text>`));
    });
  });

  it('draws each line where marching squares finds it on the map (Lorensen and Cline 1987)', () => {
    // the 90 % line's first point, in the chart's own pixels: on the path of its colour
    const lines = contourLines(Array.from(e.map.speeds, (w) => w * RAD_S_TO_RPM), e.map.torques, e.map.system, 0.9);
    expect(lines.length).toBeGreaterThan(0);
    const path = new RegExp(`<path d="M([\\d.]+) ([\\d.]+)[^"]*" stroke="${LEVEL_COLOURS[3]}"`).exec(svg);
    expect(path).not.toBeNull();
    // the axes: 0..7000 rpm over 66..702 px; torque -10..10 N·m over the plot height (servo: the chart's round ticks)
    const top = /<rect x="66" y="(\d+)" width="636" height="360"/.exec(svg);
    expect(top).not.toBeNull();
    const T = Number(top![1]);
    const px = 66 + (lines[0]!.x[0]! / 7000) * 636;
    const py = T + 360 - ((lines[0]!.y[0]! + 10) / 20) * 360;
    expect(Number(path![1])).toBeCloseTo(px, 0);
    expect(Number(path![2])).toBeCloseTo(py, 0);
  });

  it('marks the best points motoring and generating with their efficiency, and draws the hot envelopes over the map', () => {
    expect(svg).toContain(`>${(100 * s.peakMotoring!.efficiency).toFixed(1)} %</text>`);
    expect(svg).toContain(`>${(100 * s.peakGenerating!.efficiency).toFixed(1)} %</text>`);
    expect(svg).toContain('>peak-current envelope, hot corner</text>');
    expect(svg).toContain('>continuous-current envelope, hot corner</text>');
    expect(svg).toContain('>highest system efficiency, motoring and generating</text>');
  });

  it('escapes the project name', () => {
    const bad = chart('Motor <b> & "x"');
    expect(bad).not.toContain('<b>');
    expect(bad).toContain('Motor &lt;b&gt; &amp; &quot;x&quot;: system efficiency map');
  });

  it('is absent from the datasheet figures of a file without losses', () => {
    const without = { ...servoFile };
    delete without.losses;
    const c = datasheetCharts(computeDatasheetResults(loadProjectText(JSON.stringify(without))), { date: '2026-12-03' });
    expect(c.efficiency).toBeNull();
    expect(datasheetCharts(r, { date: '2026-12-03' }).efficiency).toContain('data-testid="chart-efficiency"');
  });
});
