// The estimator of each angle source (src/core/control/angle-estimator-for.ts): common practice (no source).
import { describe, expect, it } from 'vitest';
import { angleEstimatorFor } from '../src/core/control/angle-estimator-for';
import { EncoderEstimator } from '../src/core/control/encoder-estimator';
import { ResolverEstimator } from '../src/core/control/resolver-estimator';
import { messageOf } from './helpers';

describe('angleEstimatorFor', () => {
  it('none for the true angle; an encoder; a resolver; sensorless refused naming the field', () => {
    expect(angleEstimatorFor(undefined, 4)).toBeNull();
    expect(angleEstimatorFor({ source: 'ideal' }, 4)).toBeNull();
    expect(angleEstimatorFor({ source: 'encoder', linesPerRev: 100, speedWindowPeriods: 1, speedFilter_Hz: 0, offset_deg: 0 }, 4)).toBeInstanceOf(EncoderEstimator);
    expect(angleEstimatorFor({ source: 'resolver', bandwidth_Hz: 300, damping: 0.707 }, 4)).toBeInstanceOf(ResolverEstimator);
    expect(messageOf(() => angleEstimatorFor({ source: 'sensorless', bandwidth_Hz: 100, handoverSpeed_rpm: 100, fluxError_pct: 0, resistanceError_pct: 0, inductanceError_pct: 0 }, 4))).toMatch(/^control\.angle\.source/);
  });
});
