import { describe, expect, it } from 'vitest';
import { BudgetWatch, CurrentOscillationWatch, SpeedSwingWatch, divergence, integratorFailure, OSC_LIMIT, SWING_LIMIT } from '../src/core/simulation/watchdogs';
import { StepCollapse } from '../src/core/simulation/stepper';
import { periodSample } from '../src/core/simulation/period-sample';

// The thresholds are common practice (no source): an error reversing sign 16 times in 64 periods,
// a torque reference swinging between its limits 8 times within a second each.
describe('current-loop oscillation watch', () => {
  it('fires at the OSC_LIMIT-th reversal of an error above 5 % of Imax, not for small errors', () => {
    const w = new CurrentOscillationWatch(100);
    let k = 0;
    for (; k < 100; k++) expect(w.check(k, periodSample(k * 1e-4, 0, 0, 0, k % 2 ? 4 : -4, 0))).toBeNull(); // |e| < 5 A
    const big = new CurrentOscillationWatch(100);
    let fired: string | null = null;
    let n = 0;
    for (k = 0; k < 64 && !fired; k++) { fired = big.check(k, periodSample(k * 1e-4, 1, 2, 0, 1 + (k % 2 ? 10 : -10), 2)); n = k; }
    expect(n).toBe(OSC_LIMIT); // the first sample sets the sign, then one reversal per period
    expect(fired).toMatch(/the current loop oscillates \(16 reversals .* in 64 periods/);
    expect(fired).toMatch(/^diverged at t = 0\.00160000 s/);
  });
});

describe('current-loop oscillation watch over time', () => {
  it('reversals leave the count once they are OSC_WINDOW periods old, quiet periods in between included', () => {
    const w = new CurrentOscillationWatch(100);
    let k = 0;
    const big = (j: number) => periodSample(j * 1e-4, 0, 0, 0, j % 2 ? 10 : -10, 0);
    for (; k < 10; k++) expect(w.check(k, big(k))).toBeNull(); // 9 reversals
    for (; k < 80; k++) expect(w.check(k, periodSample(k * 1e-4, 0, 0, 0, 1, -1))).toBeNull(); // small errors: the 9 slide out
    let fired: string | null = null;
    const k0 = k;
    for (; k < 200 && !fired; k++) fired = w.check(k, big(k));
    // the error's last sign (period 9, +10) is still remembered: period 80 (-10) is already a reversal
    expect(k - k0).toBe(OSC_LIMIT);
    expect(fired).toMatch(/16 reversals/);
  });
});

describe('speed-loop swing watch', () => {
  it('fires at the SWING_LIMIT-th swing between the torque limits, each within 1 s', () => {
    const w = new SpeedSwingWatch();
    let fired: string | null = null;
    let k = 0;
    for (; k < 20 && !fired; k++) fired = w.check(periodSample(k * 0.1, 0, 0, 100, 0, 0, k % 2 ? 5 : -5), true);
    expect(k - 1).toBe(SWING_LIMIT);
    expect(fired).toMatch(/swung between the motoring and the generating limit 8 times/);
    expect(new SpeedSwingWatch().check(periodSample(0, 0, 0, 0, 0, 0, 5), false)).toBeNull();
  });
  it('swings further apart than 1 s start the count again', () => {
    const w = new SpeedSwingWatch();
    for (let k = 0; k < 30; k++) expect(w.check(periodSample(k * 1.5, 0, 0, 0, 0, 0, k % 2 ? 5 : -5), true)).toBeNull();
  });
});

describe('divergence', () => {
  const b = { trip_A: 30, Imax: 10, speed_rad_s: 1000, Ts: 1e-4 };
  const last = Float64Array.from([0.1, 500, 1, 2]);
  it('null within the bounds; the trip, the speed and a non-finite state named', () => {
    expect(divergence(b, 0, Float64Array.of(10, 20, 100, 1), last)).toBeNull();
    expect(divergence(b, 0, Float64Array.of(20, 25, 100, 1), last)).toMatch(/overcurrent trip 30\.00 A \(3\.00·Imax\)/);
    expect(divergence(b, 0, Float64Array.of(0, 0, -1001, 1), last)).toMatch(/\|speed\| exceeded 9549 rpm/);
    expect(divergence(b, 0, Float64Array.of(NaN, 0, 0, 1), last)).toMatch(/a state became non-finite \(id\); at t = 0\.00000 s it was id = 1\.00000 A/);
    // a sum of the states that cancels or overflows: the full test decides
    expect(divergence(b, 0, Float64Array.of(1e200, -1e200, 0, 1), last)).toMatch(/overcurrent trip/);
    expect(divergence(b, 0, Float64Array.of(Infinity, -Infinity, 0, 1), last)).toMatch(/non-finite \(id, iq\)/);
    expect(divergence(b, 0, Float64Array.of(1e308, 0, 1e308, 1), last)).toMatch(/overcurrent trip/);
    expect(divergence(b, 0, Float64Array.of(-20, 22, -999, 6.28), last)).toBeNull();
  });
  it('names the integrator failure in our words', () => {
    expect(integratorFailure(new StepCollapse(), 0.5, 1, 2, 3)).toMatch(/step size collapsed/);
    expect(integratorFailure(new Error('lib text'), 0.5, 1, 2, 3)).not.toMatch(/lib text/);
  });
});

describe('budget watch', () => {
  it('the abort signal first, then the wall-time budget', () => {
    let t = 0;
    const w = new BudgetWatch(() => (t += 1), 2.5);
    expect(w.check(0.1)).toBeNull(); // 1 s
    expect(w.check(0.2)).toBeNull(); // 2 s
    expect(w.check(0.3)).toEqual({ kind: 'budget', message: 'stopped at t = 0.300000 s: the wall-time budget of 2.5 s is used up' });
    expect(new BudgetWatch(() => 0, 1, { aborted: true }).check(1)).toEqual({ kind: 'aborted', message: 'aborted at t = 1.00000 s' });
  });
});
