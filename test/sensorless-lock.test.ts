import { describe, expect, it } from 'vitest';
import { LockMonitor } from '../src/core/control/sensorless-lock';

// Loss of lock = |wrapped angle error| above a bound for a time without a break: common practice
// (no source). The checks count periods exactly.
describe('loss-of-lock monitor', () => {
  const Ts = 1e-4;
  it('trips after exactly time_s above the bound, not before; a break restarts the count', () => {
    const m = new LockMonitor(0.5, 0.002);
    for (let k = 0; k < 19; k++) expect(m.update(0.6, 0, Ts)).toBe(false);
    m.update(0.1, 0, Ts); // a break
    for (let k = 0; k < 19; k++) expect(m.update(-0.7, 0, Ts)).toBe(false);
    expect(m.update(-0.7, 0, Ts)).toBe(true);
    expect(m.lostAt_s).toBeCloseTo(40 * Ts, 12);
    expect(m.peak).toBeCloseTo(0.7, 12);
    expect(m.message()).toMatch(/loss of lock: .*28\.6° electrical .* 2\.0 ms .*peak error 40\.1°/);
  });
  it('the error is wrapped: 2 pi off is locked', () => {
    const m = new LockMonitor(0.5, 0);
    expect(m.update(3.1, 3.1 - 2 * Math.PI, Ts)).toBe(false);
    expect(m.message()).toBeNull();
    expect(() => new LockMonitor(0)).toThrow(/bound/);
  });
});
