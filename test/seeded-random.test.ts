// Seeded random numbers (src/core/mathematics/seeded-random.ts). The moments of the uniform law
// (mean 1/2, variance 1/12) and of the normal law: common practice (no source); mulberry32 and the
// MurmurHash3 finaliser from memory.
import { describe, expect, it } from 'vitest';
import { mix32, mulberry32, randomFor, truncatedNormal } from '../src/core/mathematics/seeded-random';

describe('seeded random numbers', () => {
  it('the same (seed, index) gives the same numbers; another index or seed others', () => {
    const a = randomFor(7, 123), b = randomFor(7, 123), c = randomFor(7, 124), d = randomFor(8, 123);
    const xs = [a.next(), a.next()], ys = [b.next(), b.next()];
    expect(xs).toEqual(ys);
    expect(c.next()).not.toBe(xs[0]);
    expect(d.next()).not.toBe(xs[0]);
  });

  it('uniform in [0, 1) with mean 1/2 and variance 1/12 (within 5 standard errors over 1e5 draws)', () => {
    const r = mulberry32(12345);
    const n = 100_000;
    let s = 0, s2 = 0, lo = 1, hi = 0;
    for (let i = 0; i < n; i++) {
      const x = r.next();
      s += x; s2 += x * x; lo = Math.min(lo, x); hi = Math.max(hi, x);
    }
    expect(lo).toBeGreaterThanOrEqual(0);
    expect(hi).toBeLessThan(1);
    expect(Math.abs(s / n - 0.5)).toBeLessThan(5 * Math.sqrt(1 / 12 / n));
    expect(Math.abs(s2 / n - (s / n) ** 2 - 1 / 12)).toBeLessThan(0.002);
  });

  it('the first draws of consecutive indices are uncorrelated (|r| < 5 / sqrt(n))', () => {
    const n = 20_000;
    const x = Array.from({ length: n }, (_, i) => randomFor(1, i).next());
    let sxy = 0, sx = 0, sxx = 0;
    for (let i = 0; i + 1 < n; i++) { sxy += x[i]! * x[i + 1]!; sx += x[i]!; sxx += x[i]! * x[i]!; }
    const m = sx / (n - 1), v = sxx / (n - 1) - m * m;
    expect(Math.abs((sxy / (n - 1) - m * m) / v)).toBeLessThan(5 / Math.sqrt(n));
  });

  it('truncated normal: inside the interval; untruncated in effect, the standard deviation asked', () => {
    const r = mulberry32(99);
    const n = 50_000;
    let s = 0, s2 = 0;
    for (let i = 0; i < n; i++) {
      const x = truncatedNormal(r, 10, 1, 0, 20);
      s += x; s2 += x * x;
    }
    expect(Math.abs(s / n - 10)).toBeLessThan(5 / Math.sqrt(n));
    expect(Math.sqrt(s2 / n - (s / n) ** 2)).toBeCloseTo(1, 1);
    for (let i = 0; i < 1000; i++) {
      const x = truncatedNormal(r, 1, 2, 0.5, 1.5);
      expect(x >= 0.5 && x <= 1.5).toBe(true);
    }
    expect(truncatedNormal(r, 3, 1, 2, 2)).toBe(2);
  });

  it('mix32 is a bijection on a sample of words (no two of 1e5 collide)', () => {
    const seen = new Set<number>();
    for (let i = 0; i < 100_000; i++) seen.add(mix32(i * 2654435761));
    expect(seen.size).toBe(100_000);
  });
});
