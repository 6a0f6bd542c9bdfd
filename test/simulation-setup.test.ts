import { describe, expect, it } from 'vitest';
import { DEFAULT_RUN_OPTIONS, DEFAULT_SOLVER_OPTIONS, DEFAULT_TRIP_FACTOR, MAX_CONTROL_PERIODS } from '../src/core/simulation/simulation-setup';
import { TRACE_NAMES } from '../src/core/simulation/simulation-result';

// the run's documented defaults (common practice, no source)
describe('simulation setup and result', () => {
  it('run defaults: 5000 trace points, 60 s wall budget, 2 000 000 periods, merge gap 20', () => {
    expect(DEFAULT_RUN_OPTIONS).toEqual({ maxPoints: 5000, wallBudget_s: 60, maxSteps: 2_000_000, eventMergeGap: 20 });
    expect(MAX_CONTROL_PERIODS).toBe(2_000_000);
    expect(DEFAULT_TRIP_FACTOR).toBe(3);
  });
  it('solver defaults: Cash-Karp at tol 1e-6 with floors, the exact periods for a constant-parameter machine', () => {
    expect(DEFAULT_SOLVER_OPTIONS).toEqual({ method: 'cash-karp', tol: 1e-6, rk4Substeps: 1, currentFloor: 1e-3, speedFloor: 1e-3, angleFloor: 1, exactPeriods: true });
  });
  it('sixteen channels, time first', () => {
    expect(TRACE_NAMES).toHaveLength(16);
    expect(TRACE_NAMES[0]).toBe('t_s');
    expect(TRACE_NAMES.slice(12, 15)).toEqual(['ia_A', 'ib_A', 'ic_A']);
  });
});
