import { describe, expect, it } from 'vitest';
import { DEFAULT_CONTROLLER_OPTIONS } from '../src/core/control/controller-config';

// the controller's documented defaults (common practice, no source): one period of computation
// delay, the speed loop every period, clamping anti-windup, decoupling and back-EMF feed-forward on
describe('controller configuration defaults', () => {
  it('are the documented ones', () => {
    expect(DEFAULT_CONTROLLER_OPTIONS).toEqual({
      delaySamples: 1, speedLoopDivider: 1, antiWindup: 'clamping', decoupling: true, backEmfFeedForward: true,
      delayAngleCompensation: true, speedRamp_rad_s2: Infinity, speedRefPrefilter_s: 0,
    });
  });
});
