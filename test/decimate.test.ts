import { describe, expect, it } from 'vitest';
import { decimateMinMax, StreamingMinMax } from '../src/core/simulation/decimate';

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

describe('streaming min/max decimation', () => {
  const mk = (n: number) => {
    const t = Float64Array.from({ length: n }, (_, i) => i * 1e-4);
    let s = 12345;
    const rnd = () => ((s = (s * 1103515245 + 12345) % 2147483648) / 2147483648) - 0.5;
    const a = Float64Array.from(t, (x) => Math.sin(2 * Math.PI * 7 * x) + 0.1 * rnd());
    const b = Float64Array.from(t, () => rnd());
    b[n - 1] = 9; // a spike in the very last sample
    return { t, a, b };
  };
  it('gives exactly what decimateMinMax gives on the whole trace, for lengths around the bucket edges', () => {
    for (const [n, maxPoints] of [[100000, 1000], [8001, 300], [8001, 5000], [5001, 5000], [7, 4], [3001, 1001]] as const) {
      const { t, a, b } = mk(n);
      const ref = decimateMinMax(t, [a, b], n, maxPoints);
      const s = new StreamingMinMax(2, n, maxPoints);
      const row = new Float64Array(2);
      for (let i = 0; i < n; i++) { row[0] = a[i]!; row[1] = b[i]!; s.push(t[i]!, row); }
      const d = s.finish();
      expect(Array.from(d.t)).toEqual(Array.from(ref.t));
      expect(Array.from(d.channels[0]!)).toEqual(Array.from(ref.channels[0]!));
      expect(Array.from(d.channels[1]!)).toEqual(Array.from(ref.channels[1]!));
      expect(d.t[d.t.length - 1]).toBe(t[n - 1]);
      expect(Math.max(...d.channels[1]!)).toBe(9);
    }
  });
  it('keeps short traces whole and returns the filled buckets of a run that stops early', () => {
    const short = new StreamingMinMax(1, 5, 5000);
    [3, 1, 4].forEach((v, i) => short.push(i, [v]));
    const ds = short.finish();
    expect(Array.from(ds.t)).toEqual([0, 1, 2]);
    expect(Array.from(ds.channels[0]!)).toEqual([3, 1, 4]);
    // 1000 expected samples in 10 buckets of 100; stop after 250: two full buckets and a half one
    const s = new StreamingMinMax(1, 1000, 20);
    for (let i = 0; i < 250; i++) s.push(i, [i === 130 ? -5 : i]);
    const d = s.finish();
    expect(Array.from(d.t)).toEqual([0, 99, 100, 199, 200, 249]);
    expect(Array.from(d.channels[0]!)).toEqual([0, 99, -5, 199, 200, 249]);
  });
  it('says which sample its first held row is and when a commit ends a bucket', () => {
    // 100 samples in 10 buckets of 10: common practice (no source)
    const s = new StreamingMinMax(1, 100, 20);
    const ends: number[] = [];
    for (let k = 0; k < 100; k++) {
      const o = s.slot(k);
      expect(o).toBe((k - s.first) * 1);
      if (s.ending) ends.push(k);
      s.commit();
    }
    expect(ends).toEqual([9, 19, 29, 39, 49, 59, 69, 79, 89, 99]);
    expect(s.first).toBe(100);
    const raw = new StreamingMinMax(1, 5, 5000);
    raw.push(0, [1]);
    expect(raw.ending).toBe(false);
    expect(raw.first).toBe(0);
  });
  it('an odd number of channels, NaN and infinities: the streaming form gives what decimateMinMax gives', () => {
    // reference: decimateMinMax on the whole trace; common practice (no source)
    const n = 997;
    const t = Float64Array.from({ length: n }, (_, i) => i * 1e-3);
    const odd = [0, 1, 2].map((c) => Float64Array.from(t, (x, i) => (i % 37 === c ? NaN : i % 53 === c ? (c ? -Infinity : Infinity) : Math.sin(40 * x + c) + 0.3 * Math.sin(977 * x * (c + 1)))));
    odd[1]![0] = NaN; // the first of a bucket: it stays its minimum and maximum
    for (const maxPoints of [20, 200, 600]) {
      const want = decimateMinMax(t, odd, n, maxPoints);
      const s = new StreamingMinMax(3, n, maxPoints);
      for (let i = 0; i < n; i++) s.push(t[i]!, [odd[0]![i]!, odd[1]![i]!, odd[2]![i]!]);
      const got = s.finish();
      expect(Array.from(got.t)).toEqual(Array.from(want.t));
      for (let c = 0; c < 3; c++) expect(Array.from(got.channels[c]!)).toEqual(Array.from(want.channels[c]!));
      expect(Number.isNaN(got.channels[1]![0]!)).toBe(true);
      expect(s.allFinite).toBe(false);
    }
    // finite samples: every decimated value finite, said so (never while every sample is kept)
    const fin = new StreamingMinMax(2, n, 100);
    for (let i = 0; i < n; i++) fin.push(t[i]!, [Math.sin(i), 1e300 * Math.cos(i)]);
    fin.finish();
    expect(fin.allFinite).toBe(true);
    const wide = new StreamingMinMax(1, n, 100); // a range beyond the largest double: not vouched for
    for (let i = 0; i < n; i++) wide.push(t[i]!, [i % 2 ? 1.7e308 : -1.7e308]);
    expect(Array.from(wide.finish().channels[0]!).every(Number.isFinite)).toBe(true);
    expect(wide.allFinite).toBe(false);
    const raw = new StreamingMinMax(1, 5, 100);
    raw.push(0, [1]);
    expect(raw.allFinite).toBe(false);
  });
});
