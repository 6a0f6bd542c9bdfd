import { describe, expect, it } from 'vitest';
import { OpenLoopStartup, STARTUP_BLEND, STARTUP_DONE, STARTUP_OPEN_LOOP } from '../src/core/control/sensorless-startup';
import { wrapToPi as wrapAngle } from '../src/core/control/angle-estimator';

// Open-loop (current-frequency) start with a speed ramp, then a linear blend of the angle to the
// observer's: common practice (no source). The checks are kinematics: the ramp reaches the
// hand-over speed w_h after w_h / a, having turned w_h^2 / (2 a); the blend is linear in time.
describe('open-loop start-up and hand-over', () => {
  const Ts = 1e-4;
  const spec = { handoverOmegaE: 200, rampE_rad_s2: 1000, current_A: 50, blend_s: 0.01, direction: 1 as const };

  it('the speed ramps at the stated rate; hand-over after w_h / a with the angle w_h^2 / (2 a) (kinematics)', () => {
    const s = new OpenLoopStartup(spec);
    s.start(0, 0);
    let k = 0, turned = 0, last = 0;
    while (s.phase === STARTUP_OPEN_LOOP && k < 100000) {
      s.step(0, 0, Ts);
      turned += wrapAngle(s.thetaOut - last);
      last = s.thetaOut;
      k++;
      if (k === 500) expect(s.omegaOut).toBeCloseTo(1000 * 499 * Ts, 9);
    }
    expect(s.handoverTime_s).toBeCloseTo(0.2, 3);
    expect(turned).toBeCloseTo((200 * 200) / 2000, 1);
    expect(s.current_A).toBe(0);
  });

  it('the output angle goes from the open-loop angle to the observer\'s linearly over the blend time, without a jump', () => {
    const s = new OpenLoopStartup(spec);
    s.start(0, 199.95);
    s.step(0.1, 200, Ts); // still open loop: this sample ramps to 200
    expect(s.phase).toBe(STARTUP_OPEN_LOOP);
    const thOl = s.theta;
    const thObs = thOl - 0.6; // the observer sees the rotor 0.6 rad behind the vector
    s.step(thObs, 200, Ts);
    expect(s.phase).toBe(STARTUP_BLEND);
    expect(s.handoverOffset_rad).toBeCloseTo(0.6, 12);
    expect(s.handoverIq_A).toBeCloseTo(50 * Math.cos(0.6), 12);
    // halfway through the blend: half the offset is left
    for (let k = 0; k < 50; k++) s.step(thObs, 200, Ts);
    expect(wrapAngle(s.thetaOut - thObs)).toBeCloseTo(0.3, 9);
    for (let k = 0; k < 60; k++) s.step(thObs, 200, Ts);
    expect(s.phase).toBe(STARTUP_DONE);
    expect(s.thetaOut).toBe(thObs);
  });

  it('backwards start ramps to -w_h; refuses a hand-over speed that is not positive', () => {
    const s = new OpenLoopStartup({ ...spec, direction: -1 });
    s.start(0, 0);
    for (let k = 0; k < 2500 && s.phase === STARTUP_OPEN_LOOP; k++) s.step(s.theta, s.omega, Ts); // an observer that agrees
    expect(s.phase).not.toBe(STARTUP_OPEN_LOOP);
    expect(s.omega).toBe(-200);
    expect(s.handoverIq_A).toBeCloseTo(-50, 9);
    expect(() => new OpenLoopStartup({ ...spec, handoverOmegaE: 0 })).toThrow(/hand-over/);
  });
});
