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
  it('each estimator: sample(...) and the same inputs written into input then sampleFromInput() give the same bits, period after period', () => {
    const make = () => [
      angleEstimatorFor({ source: 'encoder', linesPerRev: 1024, speedWindowPeriods: 4, speedFilter_Hz: 500, offset_deg: 0 }, 4)!,
      angleEstimatorFor({ source: 'resolver', bandwidth_Hz: 300, damping: 0.707, amplitudeImbalance: 0.01, quadratureError_deg: 0.5 }, 4)!,
      angleEstimatorFor({ ...sl, handoverSpeed_rpm: 10 }, 4, { machine, Imax: 200 })!,
    ];
    const a = make(), b = make();
    for (const e of [...a, ...b]) e.reset(0.3, 400);
    const Ts = 1e-4;
    for (let k = 0; k < 200; k++) {
      const th = 0.3 + 400 * k * Ts, ia = 10 * Math.cos(th + 1.7), ib = 10 * Math.sin(th + 1.7), va = 5 * Math.cos(th + 1.6), vb = 5 * Math.sin(th + 1.6);
      for (let j = 0; j < a.length; j++) {
        a[j]!.sample(th, 100, ia, ib, va, vb, Ts);
        const x = b[j]!.input;
        x[0] = th; x[1] = 100; x[2] = ia; x[3] = ib; x[4] = va; x[5] = vb; x[6] = Ts;
        b[j]!.sampleFromInput();
        expect(b[j]!.thetaE).toBe(a[j]!.thetaE);
        expect(b[j]!.omegaE).toBe(a[j]!.omegaE);
      }
    }
    // the estimates move: the check compares something
    expect(a.every((e) => e.omegaE !== 0)).toBe(true);
  });
});
