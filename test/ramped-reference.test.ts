import { describe, expect, it } from 'vitest';
import { rampedReference } from '../src/core/simulation/ramped-reference';

// common practice (no source): a slew-rate-limited reference moves toward its target at the rate
describe('ramped speed reference', () => {
  const steps = [{ t: 0.1, v: 100 }];
  it('jumps with no ramp limit, moves at the rate with one', () => {
    expect(rampedReference(0, steps, Infinity, 0.2)).toBe(100);
    expect(rampedReference(0, steps, 500, 0.14)).toBeCloseTo(20, 12);
    expect(rampedReference(0, steps, 500, 1)).toBe(100);
  });
  it('reads the steps in time order whatever their order in the list', () => {
    expect(rampedReference(10, [{ t: 0.5, v: 0 }, { t: 0.1, v: 100 }], 1000, 0.6)).toBeCloseTo(0, 12);
    expect(rampedReference(10, [{ t: 0.5, v: 0 }, { t: 0.1, v: 100 }], 100, 0.3)).toBeCloseTo(30, 12);
  });
});
