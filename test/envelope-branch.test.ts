import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { computeEnvelope, type Envelope } from '../src/core/steady-state/envelope';
import { envelopeBranch, zeroCrossing } from '../src/core/steady-state/envelope-branch';
import { loadProjectText } from '../src/core/project/project';
import { RAD_S_TO_RPM } from '../src/core/base/units';

const servo = loadProjectText(readFileSync(join(__dirname, '..', 'resources', 'demo-servo-axis.json'), 'utf8'));
const speedMax = (6300 * Math.PI) / 30;

describe('envelope branch cut at zero torque', () => {
  for (const direction of ['motoring', 'generating'] as const) {
    it(`ends the continuous ${direction} curve on the zero line at the engine's maximum speed`, () => {
      const env = computeEnvelope(servo.hot, servo.continuous, { points: 200, speedMax, direction });
      expect(env.maxSpeed).not.toBeNull();
      const b = envelopeBranch(env);
      const last = b.speed_rpm.length - 1;
      expect(b.torque_Nm[last]).toBe(0);
      expect(b.power_W[last]).toBe(0);
      expect(b.speed_rpm[last]).toBeCloseTo(env.maxSpeed! * RAD_S_TO_RPM, 9);
      expect(b.ends_rpm).toEqual([b.speed_rpm[last]]);
      // the last feasible sample before it still has torque of the branch's sign (the curve would hang open without the cut)
      const sign = direction === 'motoring' ? 1 : -1;
      expect(sign * b.torque_Nm[last - 1]!).toBeGreaterThan(0);
      // nothing drawn beyond the end, speeds rising
      for (let k = 1; k <= last; k++) expect(b.speed_rpm[k]!).toBeGreaterThan(b.speed_rpm[k - 1]!);
      // every feasible sample kept, plus the end
      let feasible = 0;
      for (let k = 0; k < env.feasible.length; k++) feasible += env.feasible[k]!;
      expect(b.speed_rpm).toHaveLength(feasible + 1);
    });
  }
  it('adds no end where the torque lasts over the whole range', () => {
    const env = computeEnvelope(servo.hot, servo.peak, { points: 50, speedMax, direction: 'motoring' });
    const b = envelopeBranch(env);
    expect(b.ends_rpm).toEqual([]);
    expect(b.speed_rpm).toHaveLength(50);
    expect(b.torque_Nm.every((t) => t > 0)).toBe(true);
  });
  it('continues the last two samples to zero torque when the engine gives no maximum speed in the interval', () => {
    // a hand-made envelope: torque falling 10 -> 4 from 0 to 1 rad/s, none at 2 rad/s; line hits zero at 1 + 4/6 rad/s
    const env = {
      speed: Float64Array.from([0, 1, 2]), torque: Float64Array.from([10, 4, 0]), power: Float64Array.from([0, 4, 0]),
      feasible: Uint8Array.from([1, 1, 0]), maxSpeed: null,
    } as unknown as Envelope;
    expect(zeroCrossing(env, 1)).toBeCloseTo(1 + 4 / 6, 12);
    const b = envelopeBranch(env);
    expect(b.speed_rpm[2]).toBeCloseTo((1 + 4 / 6) * RAD_S_TO_RPM, 9);
  });
});
