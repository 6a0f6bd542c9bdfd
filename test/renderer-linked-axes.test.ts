// The torque and power plots share their speed axis: what a plotly relayout event means for it,
// and the layouts that result. Plotly's relayout event keys: common practice (no source).
import { describe, expect, it } from 'vitest';
import type { Layout } from 'plotly.js-dist-min';
import { sameRange, withXRange, xRangeFromRelayout } from '../src/renderer/src/components/linked-axes';

describe('linked speed axes', () => {
  it('reads a box or x zoom, a pan given as a pair, and a reset', () => {
    expect(xRangeFromRelayout({ 'xaxis.range[0]': 2000, 'xaxis.range[1]': 6000, 'yaxis.range[0]': -10, 'yaxis.range[1]': 50 })).toEqual([2000, 6000]);
    expect(xRangeFromRelayout({ 'xaxis.range': [7000, 3000] })).toEqual([3000, 7000]);
    expect(xRangeFromRelayout({ 'xaxis.autorange': true, 'yaxis.autorange': true })).toBe('reset');
  });

  it('ignores events that do not move the speed axis', () => {
    expect(xRangeFromRelayout({ 'yaxis.range[0]': -10, 'yaxis.range[1]': 50 })).toBeNull();
    expect(xRangeFromRelayout({ autosize: true })).toBeNull();
    expect(xRangeFromRelayout({ 'xaxis.range[0]': 100 })).toBeNull();
    expect(xRangeFromRelayout({ 'xaxis.range[0]': Number.NaN, 'xaxis.range[1]': 5 })).toBeNull();
    expect(xRangeFromRelayout({ 'xaxis.range[0]': 5, 'xaxis.range[1]': 5 })).toBeNull();
    expect(xRangeFromRelayout(null)).toBeNull();
  });

  it('treats an echo of the same range as no change', () => {
    expect(sameRange([1000, 5000], [1000 + 1e-7, 5000])).toBe(true);
    expect(sameRange([1000, 5000], [1000.01, 5000])).toBe(false);
    expect(sameRange(null, null)).toBe(true);
    expect(sameRange(null, [0, 1])).toBe(false);
  });

  it('puts the range on the x axis and keeps the rest of the layout', () => {
    const base = { xaxis: { range: [0, 12000], title: { text: 'speed' } }, yaxis: { range: [-400, 400] }, height: 300 } as unknown as Layout;
    const z = withXRange(base, [2000, 6000]) as unknown as Record<string, any>;
    expect(z.xaxis.range).toEqual([2000, 6000]);
    expect(z.xaxis.autorange).toBe(false);
    expect(z.xaxis.title.text).toBe('speed');
    expect(z.yaxis.range).toEqual([-400, 400]);
    expect(z.uirevision).toBe('speed-axis');
    const n = withXRange(base, null) as unknown as Record<string, any>;
    expect(n.xaxis.range).toEqual([0, 12000]);
    expect(n.uirevision).toBe('speed-axis');
    expect((base as unknown as Record<string, any>).xaxis.range).toEqual([0, 12000]); // not mutated
  });
});
