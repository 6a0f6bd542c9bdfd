import { describe, expect, it } from 'vitest';
import { decimateMinMax } from '../src/core/decimate';

describe('min/max decimation', () => {
  it('keeps every channel\'s extremes and the shared length', () => {
    const n = 100000;
    const t = Float64Array.from({ length: n }, (_, i) => i * 1e-4);
    const a = Float64Array.from(t, (x) => Math.sin(2 * Math.PI * 3 * x));
    const b = new Float64Array(n);
    b[54321] = 7; // a one-sample spike
    b[777] = -3;
    const d = decimateMinMax(t, [a, b], n, 1000);
    expect(d.t.length).toBe(1000);
    expect(d.channels[0]!.length).toBe(1000);
    expect(d.channels[1]!.length).toBe(1000);
    expect(Math.max(...d.channels[1]!)).toBe(7);
    expect(Math.min(...d.channels[1]!)).toBe(-3);
    expect(Math.max(...d.channels[0]!)).toBe(Math.max(...a));
    expect(Math.min(...d.channels[0]!)).toBe(Math.min(...a));
    // time axis ascending and covering the span
    for (let i = 1; i < d.t.length; i++) expect(d.t[i]!).toBeGreaterThanOrEqual(d.t[i - 1]!);
    expect(d.t[0]).toBe(0);
    expect(d.t[d.t.length - 1]).toBe(t[n - 1]);
  });

  it('copies short traces unchanged and honours n', () => {
    const t = Float64Array.from([0, 1, 2, 3, 4]);
    const d = decimateMinMax(t, [Float64Array.from([5, 6, 7, 8, 9])], 3, 5000);
    expect(Array.from(d.t)).toEqual([0, 1, 2]);
    expect(Array.from(d.channels[0]!)).toEqual([5, 6, 7]);
  });

  it('orders min and max by their occurrence in the bucket', () => {
    const t = Float64Array.from({ length: 8 }, (_, i) => i);
    const x = Float64Array.from([0, 9, 1, 2, -4, 0, 0, 0]);
    const d = decimateMinMax(t, [x], 8, 4);
    expect(Array.from(d.channels[0]!)).toEqual([0, 9, -4, 0]);
  });
});
