import { describe, expect, it } from 'vitest';
import { periodSample, PERIOD_SAMPLE_SIZE, S_T, S_ID, S_IQ, S_W, S_ID_REF, S_IQ_REF, S_TORQUE_REF, S_SPEED_REF } from '../src/core/simulation/period-sample';

// common practice (no source): a fixed layout, each slot its own
describe('period sample', () => {
  it('eight distinct slots in the documented order', () => {
    const x = periodSample(1, 2, 3, 4, 5, 6, 7, 8);
    expect(x).toHaveLength(PERIOD_SAMPLE_SIZE);
    expect([S_T, S_ID, S_IQ, S_W, S_ID_REF, S_IQ_REF, S_TORQUE_REF, S_SPEED_REF].map((i) => x[i])).toEqual([1, 2, 3, 4, 5, 6, 7, 8]);
  });
});
