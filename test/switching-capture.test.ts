// The switching model's capture (src/core/simulation/switching-capture.ts): the ring of carrier
// periods and the window traces, ring and bounded. Common practice (no source).
import { describe, expect, it } from 'vitest';
import { SwitchingCapture, WindowTrace, RECORD_CAPACITY } from '../src/core/simulation/switching-capture';

describe('switching capture', () => {
  it('the ring keeps the last cap periods, oldest first; sized from the run (at most RECORD_CAPACITY)', () => {
    const c = new SwitchingCapture(5, null, 10000);
    expect(c.cap).toBe(7);
    for (let k = 0; k < 10; k++) c.t[c.slot()] = k;
    expect(Array.from(c.order(), (j) => c.t[j])).toEqual([3, 4, 5, 6, 7, 8, 9]);
    expect(new SwitchingCapture(1e7, null, 10000).cap).toBe(RECORD_CAPACITY);
    expect(new SwitchingCapture(1e5, null, 10000).recordFrom).toBeCloseTo(10 - (RECORD_CAPACITY - 2) / 10000, 12);
  });

  it('a window keeps its first cap samples then refuses (-1); a ring wraps', () => {
    const w = new WindowTrace(0, 1, 3, false);
    expect([w.slot(), w.slot(), w.slot(), w.slot()]).toEqual([0, 1, 2, -1]);
    const r = new WindowTrace(-Infinity, Infinity, 3, true);
    expect([r.slot(), r.slot(), r.slot(), r.slot(), r.slot()]).toEqual([0, 1, 2, 0, 1]);
    expect(r.n).toBe(5);
  });

  it('a project window is sized from its span at 14 boundaries per carrier period', () => {
    expect(new SwitchingCapture(1000, { from_s: 0.01, to_s: 0.02 }, 10000).window.cap).toBe(14 * 100 + 16);
  });
});
