/**
 * The estimator of an angle source (angle-spec.ts) for a motor of p pole pairs: none for the true
 * angle ("ideal"), an encoder, a resolver with its tracking loop. The sensorless observer's case is
 * added with it.
 */
import { InputError } from '../base/errors';
import type { AngleSpec } from './angle-spec';
import type { AngleEstimator } from './angle-estimator';
import { EncoderEstimator } from './encoder-estimator';
import { ResolverEstimator } from './resolver-estimator';

export function angleEstimatorFor(spec: AngleSpec | undefined, polePairs: number): AngleEstimator | null {
  if (spec === undefined || spec.source === 'ideal') return null;
  if (spec.source === 'encoder') return new EncoderEstimator(spec, polePairs);
  if (spec.source === 'resolver') return new ResolverEstimator(spec, polePairs);
  throw new InputError('control.angle.source', `"${spec.source}" cannot be simulated yet: use "ideal", "encoder" or "resolver"`);
}
