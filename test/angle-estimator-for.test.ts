// The estimator of each angle source (src/core/control/angle-estimator-for.ts): common practice (no source).
import { describe, expect, it } from 'vitest';
import { angleEstimatorFor } from '../src/core/control/angle-estimator-for';
import { EncoderEstimator } from '../src/core/control/encoder-estimator';
import { ResolverEstimator } from '../src/core/control/resolver-estimator';
import { messageOf } from './helpers';
import { SensorlessEstimator } from '../src/core/control/sensorless-estimator';

const sl = { source: 'sensorless', bandwidth_Hz: 100, handoverSpeed_rpm: 100, fluxError_pct: 0, resistanceError_pct: 0, inductanceError_pct: 0 } as const;
const machine = { Rs: 0.01, Ld: 1e-4, Lq: 1e-4, psiM: 0.01, polePairs: 4 };

describe('angleEstimatorFor', () => {
  it('none for the true angle; an encoder; a resolver; sensorless needs the machine, refused naming the field without it', () => {
    expect(angleEstimatorFor(undefined, 4)).toBeNull();
    expect(angleEstimatorFor({ source: 'ideal' }, 4)).toBeNull();
    expect(angleEstimatorFor({ source: 'encoder', linesPerRev: 100, speedWindowPeriods: 1, speedFilter_Hz: 0, offset_deg: 0 }, 4)).toBeInstanceOf(EncoderEstimator);
    expect(angleEstimatorFor({ source: 'resolver', bandwidth_Hz: 300, damping: 0.707 }, 4)).toBeInstanceOf(ResolverEstimator);
    expect(messageOf(() => angleEstimatorFor({ source: 'sensorless', bandwidth_Hz: 100, handoverSpeed_rpm: 100, fluxError_pct: 0, resistanceError_pct: 0, inductanceError_pct: 0 }, 4))).toMatch(/^control\.angle\.source/);
  });
  it('sensorless: the estimator with the start-up current at a quarter of Imax and the correction at min(bandwidth/10, 30 Hz)', () => {
    const e = angleEstimatorFor(sl, 4, { machine, Imax: 200 }) as SensorlessEstimator;
    expect(e).toBeInstanceOf(SensorlessEstimator);
    e.reset(0, 0);
    expect(e.openLoop).toBe(true);
    expect(e.startupCurrent_A).toBe(50);
  });
});
