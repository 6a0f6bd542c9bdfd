import { describe, expect, it } from 'vitest';
import { stepResponse, loadStepResponse, steadyStateError, finiteOrNull } from '../src/core/metrics';

const grid = (n: number, dt: number): Float64Array => Float64Array.from({ length: n }, (_, i) => i * dt);

describe('response metrics on synthetic signals', () => {
  it('first-order step: rise time tau·ln 9, no overshoot, 2 % settling at tau·ln 50', () => {
    // first-order lag 1 - exp(-t/tau): 10-90 % in tau ln 9, inside 2 % after tau ln 50 (circuit theory)
    const tau = 0.01;
    const dt = 1e-6;
    const t = grid(100001, dt);
    const tStep = 0.005;
    const y = t.map((x) => (x < tStep ? 100 : 100 + 50 * (1 - Math.exp(-(x - tStep) / tau))));
    const r = stepResponse(t, y, t.length, tStep, 0.1, 100, 150);
    expect(r.riseTime_s!).toBeCloseTo(tau * Math.log(9), 6);
    expect(r.overshoot_pct).toBe(0);
    expect(r.settlingTime_s!).toBeCloseTo(tau * Math.log(50), 5);
  });

  it('second-order step: overshoot exp(-pi zeta / sqrt(1 - zeta^2))', () => {
    // underdamped second-order step response, peak overshoot formula (common practice, control textbooks)
    const zeta = 0.3;
    const wn = 2 * Math.PI * 50;
    const wd = wn * Math.sqrt(1 - zeta * zeta);
    const t = grid(200001, 1e-6);
    const y = t.map((x) => 1 - Math.exp(-zeta * wn * x) * (Math.cos(wd * x) + (zeta / Math.sqrt(1 - zeta * zeta)) * Math.sin(wd * x)));
    const r = stepResponse(t, y, t.length, 0, 0.2, 0, 1);
    expect(r.overshoot_pct!).toBeCloseTo(100 * Math.exp((-Math.PI * zeta) / Math.sqrt(1 - zeta * zeta)), 2);
  });

  it('a response that never settles gives null, not NaN; no step gives nulls', () => {
    const t = grid(1000, 1e-3);
    const y = t.map((x) => Math.sin(100 * x));
    const r = stepResponse(t, y, t.length, 0, 1, 0, 1);
    expect(r.settlingTime_s).toBeNull();
    expect(stepResponse(t, y, t.length, 0, 1, 2, 2)).toEqual({ riseTime_s: null, overshoot_pct: null, settlingTime_s: null });
  });

  it('load-step dip and recovery of an exponential disturbance response', () => {
    // dip profile A (t/T) exp(1 - t/T): peak A at t = T; within 5 % of A after the root of x e^{1-x} = 0.05 beyond x = 1
    const A = 20;
    const T = 0.01;
    const t = grid(200001, 1e-6);
    const ref = t.map(() => 1000);
    const y = t.map((x) => (x < 0.02 ? 1000 : 1000 - A * ((x - 0.02) / T) * Math.exp(1 - (x - 0.02) / T)));
    const r = loadStepResponse(t, ref, y, t.length, 0.02, 0.2);
    expect(r.dip!).toBeCloseTo(A, 6);
    let lo = 1, hi = 20;
    for (let i = 0; i < 100; i++) { const m = (lo + hi) / 2; if (m * Math.exp(1 - m) > 0.05) lo = m; else hi = m; }
    expect(r.recovery_s!).toBeCloseTo(lo * T, 5);
  });

  it('steady-state error averages the last window', () => {
    const t = grid(1001, 1e-3);
    const ref = t.map(() => 10);
    const y = t.map((x) => (x < 0.9 ? 0 : 9.5));
    expect(steadyStateError(t, ref, y, t.length, 0.05)).toBeCloseTo(0.5, 12);
    expect(finiteOrNull(NaN)).toBeNull();
    expect(finiteOrNull(3)).toBe(3);
  });
});
