import { describe, expect, it } from 'vitest';
import { escapeXml, svgChart, wrapText } from '../src/core/reports/svg-chart';

const spec = () => ({
  title: 'Motor <A> & "B": torque',
  xLabel: 'speed, rpm',
  yLabel: 'torque, N·m',
  series: [
    { name: 'peak <hot>', colour: '#b3261e', x: [0, 1000, 2000, NaN, 0, 1000], y: [10, 10, 0, NaN, -10, -9] },
    { name: 'hidden', colour: '#000000', x: [0, 1], y: [0, 1], legend: false },
  ],
  markers: [{ x: 1500, y: 5, shape: 'circle' as const, colour: '#1f7a33', label: '<script>alert(1)</script>' }],
  caption: ['Project <x> · Torquewise 0.1.0 · 2026-12-03'],
  testId: 'chart-t',
});

describe('svg chart', () => {
  it('escapes every text from a file', () => {
    const svg = svgChart(spec());
    expect(svg).not.toContain('<script>');
    expect(svg).not.toContain('<A>');
    expect(svg).toContain('&lt;script&gt;alert(1)&lt;/script&gt;');
    expect(svg).toContain('Motor &lt;A&gt; &amp; &quot;B&quot;: torque');
    expect(svg).toContain('peak &lt;hot&gt;');
    expect(svg).toContain('Project &lt;x&gt;');
    expect(escapeXml(`a'b`)).toBe('a&#39;b');
  });
  it('scales with its container: a viewBox, width 100%, no fixed height', () => {
    const svg = svgChart(spec());
    expect(svg).toMatch(/^<svg xmlns="http:\/\/www.w3.org\/2000\/svg" viewBox="0 0 720 \d+" width="100%"/);
    expect(svg).not.toMatch(/<svg[^>]* height=/);
  });
  it('draws round ticks with the axis labels and units', () => {
    const svg = svgChart(spec());
    // x from 0 to 2000: at most 8 intervals -> 250 rpm each at least -> the 1-2-5 step 500 rpm
    expect(svg).not.toMatch(/>250<\/text>/);
    for (const t of ['0', '500', '1000', '1500', '2000']) expect(svg).toMatch(new RegExp(`text-anchor="middle" font-size="11" fill="#5a5a60">${t}</text>`));
    // y from -10 to 10 padded by 4 %: -10.8..10.8 -> step 5 -> -15..15
    for (const t of ['-15', '-10', '-5', '0', '5', '10', '15']) expect(svg).toContain(`fill="#5a5a60">${t}</text>`);
    expect(svg).toContain('>speed, rpm</text>');
    expect(svg).toContain('>torque, N·m</text>');
  });
  it('breaks a line at NaN (two pieces: M ... M ...), and lists only legend series', () => {
    const svg = svgChart(spec());
    const d = /<path d="([^"]+)" stroke="#b3261e"/.exec(svg)![1]!;
    expect(d.match(/M/g)).toHaveLength(2);
    expect(d.match(/L/g)).toHaveLength(3);
    expect(svg).toContain('>peak &lt;hot&gt;</text>');
    expect(svg).not.toContain('>hidden</text>');
  });
  it('wraps long caption lines at spaces', () => {
    expect(wrapText('aaa bbb ccc', 7)).toEqual(['aaa bbb', 'ccc']);
    expect(wrapText('short', 70)).toEqual(['short']);
    const long = svgChart({ ...spec(), caption: ['word '.repeat(60).trim()] });
    expect((long.match(/font-size="10.5"/g) ?? []).length).toBeGreaterThanOrEqual(2);
  });
  it('writes free texts centred at their data point, escaped, on a white halo; none asked, none drawn', () => {
    // common practice (no source): x 1000 of 0..2000 over 66..702 px is 384 px; y 0 of -15..15 over 40..340 px is 190 px (+3.5 to centre the type)
    const svg = svgChart({ ...spec(), texts: [{ x: 1000, y: 0, text: '9<0', colour: '#123456' }, { x: NaN, y: 0, text: 'gone', colour: '#000000' }] });
    expect(svg).toContain('<text x="384" y="193.5" text-anchor="middle" font-size="10" fill="#123456" stroke="#ffffff" stroke-width="3" paint-order="stroke">9&lt;0</text>');
    expect(svg).not.toContain('>gone<');
    expect(svgChart(spec())).toBe(svgChart({ ...spec(), texts: [] }));
  });
});
