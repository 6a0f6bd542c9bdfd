import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { computeDatasheetResults } from '../src/core/reports/datasheet-results';
import { datasheetHtml, datasheetTableStep } from '../src/core/reports/datasheet-html';
import { figureConditions } from '../src/core/reports/figure-conditions';
import { loadProjectText } from '../src/core/project/project';
import { SAFETY_CAUTION } from '../src/core/steady-state/safety';
import { RAD_S_TO_RPM } from '../src/core/base/units';
import { TOOL_VERSION } from '../src/core/base/version';
import { datasheetEfficiencySummary } from '../src/core/reports/datasheet-efficiency';

const text = (n: string) => readFileSync(join(__dirname, '..', 'resources', `${n}.json`), 'utf8');
/** A demo without its `losses` section, as the demos were before they gained one. */
const withoutLosses = (n: string): string => {
  const j = JSON.parse(text(n));
  delete j.losses;
  return JSON.stringify(j);
};
// the datasheet of a file without losses (no efficiency map); the map's card is checked below with the demo as it is
const servo = loadProjectText(withoutLosses('demo-servo-axis'));
const servoResults = computeDatasheetResults(servo);
const servoHtml = datasheetHtml(servoResults, { date: '2026-12-03' });

const rowsOf = (html: string, testId: string): string[] => {
  const table = new RegExp(`<table data-testid="${testId}">[\\s\\S]*?<tbody>([\\s\\S]*?)</tbody>`).exec(html);
  return table ? table[1]!.split('</tr>').filter((r) => r.includes('<tr')) : [];
};

describe('datasheet as one self-contained HTML page', () => {
  it('carries the title, the conditions of every figure, the date and the version', () => {
    expect(servoHtml.startsWith('<!doctype html>')).toBe(true);
    expect(servoHtml).toContain('<h1>Invented demo: servo axis on a 320 V rectified bus</h1>');
    for (const line of figureConditions(servo, { date: '2026-12-03' })) {
      // in the header list, and in the caption of both charts (wrapped there, so word by word)
      expect(servoHtml).toContain(`<li>${line}</li>`);
    }
    expect(servoHtml).toContain(`Torquewise ${TOOL_VERSION} · 2026-12-03`);
    expect(servoHtml.match(/<svg /g)).toHaveLength(2);
    expect(servoHtml).toContain('torque against speed');
    expect(servoHtml).toContain('mechanical power against speed');
    for (const chart of ['chart-torque', 'chart-power']) {
      const svg = new RegExp(`<svg [^>]*data-testid="${chart}"[\\s\\S]*?</svg>`).exec(servoHtml)![0];
      expect(svg).toContain('Vdc 320 V, SVPWM');
      expect(svg).toContain('peak current 15 A peak (10.61 A rms), inverter binds');
      expect(svg).toContain('>peak current, hot corner</text>'); // legend
    }
  });
  it('needs nothing outside itself: no script, no link, no external source', () => {
    expect(servoHtml).not.toMatch(/<script|<link|<img|<iframe|\bsrc=|\bhref=|@import|url\((?!#)/i);
    expect(servoHtml.replace(/http:\/\/www\.w3\.org\/2000\/svg/g, '')).not.toMatch(/https?:/);
  });
  it('prints portrait with charts scaled to the page width', () => {
    expect(servoHtml).toContain('@page { size: portrait;');
    expect(servoHtml).toContain('svg { display: block; max-width: 100%; height: auto; }');
    expect(servoHtml).toMatch(/<svg [^>]*viewBox="0 0 720 \d+" width="100%"/);
  });
  it('gives the safety cautions (IEC 61800-5-1, local codes, licensed practice) and the hazards', () => {
    expect(servoHtml).toContain(SAFETY_CAUTION);
    expect(servoHtml).toMatch(/local codes, licensed practice and IEC 61800-5-1/);
    // the servo demo's bus is exceeded by the cold back-EMF at its rated 6000 rpm: that hazard is in the caution box
    const back = servoResults.safety.findings.find((f) => /back-emf/i.test(f.code));
    expect(back).toBeDefined();
    const box = /<div class="caution"[\s\S]*?<\/div>/.exec(servoHtml)![0];
    expect(box).toContain(back!.message.slice(0, 40));
  });
  it('ends each continuous curve at the speed its torque reaches zero, labelled', () => {
    const end = (corner: 'hot' | 'cold', direction: 'motoring' | 'generating') =>
      Math.round(servoResults.curves.find((c) => c.current === 'continuous' && c.corner === corner && c.direction === direction)!.env.maxSpeed! * RAD_S_TO_RPM);
    // servo demo: 5551 / 5577 rpm hot, 4720 / 4731 rpm cold (engine bisection; close ends share one label)
    expect([end('hot', 'motoring'), end('hot', 'generating'), end('cold', 'motoring'), end('cold', 'generating')]).toEqual([5551, 5577, 4720, 4731]);
    const torque = /<svg [^>]*data-testid="chart-torque"[\s\S]*?<\/svg>/.exec(servoHtml)![0];
    expect(torque).toContain('>5551 / 5577 rpm</text>');
    expect(torque).toContain('>4720 / 4731 rpm</text>');
  });
  it('lists every requirement point with its verdict hot and cold', () => {
    const rows = rowsOf(servoHtml, 'verdicts');
    expect(rows).toHaveLength(servo.requirements.length);
    rows.forEach((row, i) => {
      expect(row).toContain(`<td>${servo.requirements[i]!.label}</td>`);
      const both = servoResults.sizing.points[i]!.met && servoResults.sizingCold.points[i]!.met;
      expect(row).toContain(`data-met="${both ? 'yes' : 'no'}"`);
    });
    // 8 N·m at 4000 rpm is beyond the servo demo's hot peak envelope (7.9 N·m there): not met
    expect(rows[3]).toContain('NOT met');
    expect(rows[0]).toContain('class="pass">met');
  });
  it('tabulates the envelope hot and cold at round speeds, the step the user sets or a 1-2-5 default', () => {
    expect(datasheetTableStep(servoResults, {})).toBe(500); // range 0..6300 rpm
    expect(rowsOf(servoHtml, 'envelope-table-hot')).toHaveLength(13);
    expect(rowsOf(servoHtml, 'envelope-table-cold')).toHaveLength(13);
    const coarse = datasheetHtml(servoResults, { date: 'd', tableStep_rpm: 1000 });
    const hot = rowsOf(coarse, 'envelope-table-hot');
    expect(hot.map((r) => /<td class="num">(\d+)<\/td>/.exec(r)![1])).toEqual(['0', '1000', '2000', '3000', '4000', '5000', '6000']);
    // beyond the continuous maximum speed (5551 rpm hot) the continuous columns say none
    expect(hot[6]!.match(/<td class="num">–<\/td>/g)).toHaveLength(3);
    expect(hot[5]).not.toContain('–');
    expect(() => datasheetHtml(servoResults, { date: 'd', tableStep_rpm: 1, stepField: '--step' })).toThrow(/^--step gives more than 500 rows/);
  });
  it('escapes names and labels from the file', () => {
    const j = JSON.parse(text('demo-servo-axis'));
    j.name = '<img src=x onerror="alert(1)"> & co';
    j.requirements[0].label = '</td><script>alert(2)</script>';
    const html = datasheetHtml(computeDatasheetResults(loadProjectText(JSON.stringify(j)), { points: 40 }), { date: 'd' });
    expect(html).not.toMatch(/<img|<script/);
    expect(html).toContain('&lt;img src=x onerror=&quot;alert(1)&quot;&gt; &amp; co');
    expect(html).toContain('&lt;/td&gt;&lt;script&gt;alert(2)&lt;/script&gt;');
  });
  it('lists in the legend only what the chart shows', () => {
    const torque = /<svg [^>]*data-testid="chart-torque"[\s\S]*?<\/svg>/.exec(servoHtml)![0];
    expect(torque).toContain('>requirement met (hot and cold)</text>');
    expect(torque).toContain('>requirement not met</text>');
    expect(torque).toContain('>curve ends: torque reaches zero</text>');
    // the 48 V demo: every point met, no curve ends within its range (maximum speeds beyond 6825 rpm)
    const spm = datasheetHtml(computeDatasheetResults(loadProjectText(text('demo-spm-48v'))), { date: 'd' });
    const t2 = /<svg [^>]*data-testid="chart-torque"[\s\S]*?<\/svg>/.exec(spm)![0];
    expect(t2).toContain('>requirement met (hot and cold)</text>');
    expect(t2).not.toContain('requirement not met');
    expect(t2).not.toContain('curve ends');
  });
  it('gains the system-efficiency map for a file with a losses section, after the power figure', () => {
    const p = loadProjectText(text('demo-servo-axis'));
    const r = computeDatasheetResults(p);
    const html = datasheetHtml(r, { date: '2026-12-03' });
    expect(html.match(/<svg /g)).toHaveLength(3);
    expect(html.indexOf('data-testid="chart-efficiency"')).toBeGreaterThan(html.indexOf('data-testid="chart-power"'));
    expect(html).toContain('<h2>System efficiency, hot corner, least-current control</h2>');
    const s = datasheetEfficiencySummary(r.efficiency!);
    const note = /<p class="note" data-testid="efficiency-peaks">([^<]*)<\/p>/.exec(html)![1]!;
    expect(note).toContain(`${Number((100 * s.peakMotoring!.efficiency).toPrecision(4))} % motoring at ${Math.round(s.peakMotoring!.speed_rpm)} rpm`);
    expect(note).toContain(`${Number((100 * s.peakGenerating!.efficiency).toPrecision(4))} % generating at ${Math.round(s.peakGenerating!.speed_rpm)} rpm`);
    expect(note).toContain(`grid 60 x 60, ${s.pointsInside} points inside the envelope`);
  });
  it('without a losses section is the page it was: the same bytes as the results with the map left out', () => {
    // common practice (no source): the losses feed the map alone
    const r = computeDatasheetResults(loadProjectText(text('demo-servo-axis')));
    const { efficiency: _map, ...rest } = r;
    expect(servoResults.efficiency).toBeUndefined();
    expect(servoHtml).toBe(datasheetHtml({ ...rest, project: servo }, { date: '2026-12-03' }));
  });
});
