// One switching segment of a constant-parameter plant by the exact propagator and the Hermite
// mechanics (src/core/simulation/switching-segment.ts), against many small classical RK4 steps of the
// plant's own derivative (the reference), and the cases where it declines. Common practice (no source).
import { describe, expect, it } from 'vitest';
import { Plant, STATE_SIZE, loadSchedule } from '../src/core/simulation/plant';
import { Rk4Stepper } from '../src/core/simulation/stepper';
import { ExactSegment } from '../src/core/simulation/switching-segment';
import { DqPropagator } from '../src/core/simulation/dq-propagator';

const machine = { polePairs: 4, Rs: 0.02, Ld: 1.5e-4, Lq: 3.5e-4, psiM: 0.06 };
const plantOf = (over: Partial<ConstructorParameters<typeof Plant>[0]> = {}): Plant => new Plant({
  machine, inertia: 0.02, viscousFriction: 0.002, coulombFriction: 0.5, coulombWidth_rad_s: 1e-3,
  load: loadSchedule([{ t_s: 0, torque_Nm: 20 }], [], 0.001), mechanics: 'free', inputFrame: 'alpha-beta', ...over,
});

function start(plant: Plant): Float64Array {
  const y = new Float64Array(STATE_SIZE);
  y[0] = -80; y[1] = 150; y[2] = 300; y[3] = 1.2; y[4] = 5;
  plant.setAngleOrigin(1.1);
  plant.input[0] = 232; plant.input[1] = -115; // a switching state's voltage, alpha-beta
  return y;
}

describe('exact switching segment', () => {
  it('matches 2000 RK4 steps over segments of 3, 30 and 50 µs (the current moving by up to 80 A in one): currents within 1e-7 Imax (Imax 400 A; 3.5e-8 at 50 µs), speed within 1e-6 rad/s, angle within 1e-10 rad, energy within 1e-6 relative', () => {
    for (const h of [3e-6, 30e-6, 50e-6]) {
      const plant = plantOf();
      plant.setLoadSegment(0, h);
      const ex = new ExactSegment(plant, 400);
      const y = start(plant);
      const ref = Float64Array.from(y);
      ex.span[0] = 0; ex.span[1] = h;
      expect(ex.step(y)).toBe(true);
      new Rk4Stepper(plant, h, 2000).run(ref, 0, h, 2000);
      expect(Math.abs(y[0]! - ref[0]!)).toBeLessThan(1e-7 * 400);
      expect(Math.abs(y[1]! - ref[1]!)).toBeLessThan(1e-7 * 400);
      expect(Math.abs(y[2]! - ref[2]!)).toBeLessThan(1e-6);
      expect(Math.abs(y[3]! - ref[3]!)).toBeLessThan(1e-10);
      expect(Math.abs((y[4]! - 5) / (ref[4]! - 5) - 1)).toBeLessThan(1e-6);
      expect(Math.abs(y[2]! - 300)).toBeGreaterThan(1e-4); // the speed did change
    }
  });

  it('locked mechanics: the currents are DqPropagator.propagate\'s at the frozen speed (to 1e-12 A), the speed stays, the angle advances by p omega h', () => {
    const plant = plantOf({ mechanics: 'locked' });
    plant.setLoadSegment(0, 2e-5);
    const ex = new ExactSegment(plant, 400);
    const y = start(plant);
    ex.span[0] = 0; ex.span[1] = 2e-5;
    expect(ex.step(y)).toBe(true);
    const prop = new DqPropagator(machine);
    prop.setStep(4 * 300, 2e-5);
    const out = new Float64Array(2);
    const c = Math.cos(1.2), sn = Math.sin(1.2);
    prop.propagate(-80, 150, 232 * c - 115 * sn, -232 * sn - 115 * c, out, 0);
    expect(Math.abs(y[0]! - out[0]!)).toBeLessThan(1e-12);
    expect(Math.abs(y[1]! - out[1]!)).toBeLessThan(1e-12);
    expect(y[2]).toBe(300);
    expect(y[3]).toBeCloseTo(1.2 + 4 * 300 * 2e-5, 14);
  });

  it('declines (state untouched) near zero speed with friction, for a non-finite state, and refuses a plant it cannot take', () => {
    const plant = plantOf();
    plant.setLoadSegment(0, 2e-5);
    const ex = new ExactSegment(plant, 400);
    const y = start(plant);
    y[2] = 0.005;
    const before = Float64Array.from(y);
    ex.span[0] = 0; ex.span[1] = 2e-5;
    expect(ex.step(y)).toBe(false);
    expect(Array.from(y)).toEqual(Array.from(before));
    y[2] = 300; y[0] = NaN;
    expect(ex.step(y)).toBe(false);
    expect(ex.fallbacks).toBe(2);
    expect(() => new ExactSegment(plantOf({ states: 'flux' }), 400)).toThrow(/constant-parameter plant in current states/);
  });
});
