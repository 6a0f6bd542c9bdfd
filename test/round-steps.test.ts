import { describe, expect, it } from 'vitest';
import { roundStep, roundTicks, stepsWithin } from '../src/core/mathematics/round-steps';

describe('round 1-2-5 steps', () => {
  it('gives the smallest 1-2-5 step that keeps the count within the bound', () => {
    expect(roundStep(1000, 10)).toBe(100);
    expect(roundStep(1001, 10)).toBe(200);
    expect(roundStep(6480, 20)).toBe(500); // 324 per interval -> 500: 12.96 intervals
    expect(roundStep(14000, 20)).toBe(1000);
    expect(roundStep(0.37, 6)).toBeCloseTo(0.1, 15);
    expect(roundStep(45, 6)).toBe(10);
    expect(roundStep(35, 6)).toBe(10); // 5.83 -> 10
    expect(roundStep(29, 6)).toBe(5);
  });
  it('lists the multiples of a step within a range, rounded to the step', () => {
    expect(stepsWithin(0, 1000, 250)).toEqual([0, 250, 500, 750, 1000]);
    expect(stepsWithin(-0.3, 0.3, 0.1)).toEqual([-0.3, -0.2, -0.1, 0, 0.1, 0.2, 0.3]);
    expect(stepsWithin(1, 0, 1)).toEqual([]);
  });
  it('pads an axis range out to round ticks', () => {
    const t = roundTicks(-12.3, 47.9, 6);
    expect(t.step).toBe(20);
    expect(t.min).toBe(-20);
    expect(t.max).toBe(60);
    expect(t.ticks).toEqual([-20, 0, 20, 40, 60]);
    const flat = roundTicks(5, 5);
    expect(flat.min).toBeLessThan(5);
    expect(flat.max).toBeGreaterThan(5);
  });
});
