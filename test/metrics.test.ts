import { describe, expect, it } from 'vitest';
import { stepResponse, loadStepResponse, steadyStateError, finiteOrNull, StepResponseTracker, LoadStepTracker, SteadyStateTracker } from '../src/core/simulation/metrics';

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

  it('a load step met by an unsettled loop is not measured; a settled one is, in both forms', () => {
    // common practice (no source): a disturbance response is read from a settled operating point
    const t = grid(2001, 1e-4);
    const ref = t.map(() => 1000);
    // still 100 rpm short of the reference when the load comes at 0.1 s, then slowly closing in
    const late = t.map((x) => 900 + 80 * Math.min(1, x / 0.2));
    const a = loadStepResponse(t, ref, late, t.length, 0.1, Infinity, undefined, 1);
    expect(a).toEqual({ dip: null, recovery_s: null, errorAtStep: 60, settled: false });
    expect(loadStepResponse(t, ref, late, t.length, 0.1, Infinity).settled).toBe(true); // no floor: always measured
    const lt = new LoadStepTracker(0.1, Infinity, undefined, 16, 1);
    for (let i = 0; i < t.length; i++) lt.push(t[i]!, ref[i]!, late[i]!);
    expect(lt.result()).toEqual(a);
    // settled within 2 % at the step: measured as before
    const ok = t.map((x) => (x < 0.1 ? 999 : 1000 - 10 * Math.exp(-(x - 0.1) / 0.01)));
    const b = loadStepResponse(t, ref, ok, t.length, 0.1, Infinity, undefined, 1);
    expect(b.dip!).toBeCloseTo(10, 9);
    expect(b.errorAtStep).toBeCloseTo(10, 9);
    // without a floor every step is measured (the default)
    expect(loadStepResponse(t, ref, late, t.length, 0.1, Infinity).dip!).toBeCloseTo(60, 9);
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

describe('streaming trackers give exactly the array forms', () => {
  // damped responses with noise (fixed seed), including runs that never settle
  let s = 987654321;
  const rnd = (): number => ((s = (s * 1103515245 + 12345) % 2147483648) / 2147483648) - 0.5;
  const cases = Array.from({ length: 40 }, (_, k) => {
    const n = 200 + 97 * k;
    const dt = 1e-4;
    const t = grid(n, dt);
    const zeta = 0.1 + 0.05 * (k % 12);
    const wn = 200 + 40 * (k % 5);
    const y = Float64Array.from(t, (x) => {
      const tt = Math.max(0, x - 0.003);
      const wd = wn * Math.sqrt(Math.max(1e-6, 1 - zeta * zeta));
      return 100 + 50 * (1 - Math.exp(-zeta * wn * tt) * Math.cos(wd * tt)) + (k % 3) * 0.5 * rnd();
    });
    const ref = Float64Array.from(t, () => 150);
    return { n, t, y, ref };
  });
  it('step response, load step and steady-state error, 40 cases', () => {
    let settled = 0, recovered = 0, unsettled = 0;
    for (const { n, t, y, ref } of cases) {
      const tEnd = k2(n);
      const a = stepResponse(t, y, n, 0.003, tEnd, 100, 150);
      const st = new StepResponseTracker(0.003, tEnd, 100, 150);
      const b = loadStepResponse(t, ref, y, n, 0.003, Infinity);
      const lt = new LoadStepTracker(0.003, Infinity, undefined, 16);
      const win = Math.max(0.05 * t[n - 1]!, 2e-4);
      const c = steadyStateError(t, ref, y, n, win);
      const sst = new SteadyStateTracker(Math.ceil(0.05 * n) + 8);
      for (let i = 0; i < n; i++) { st.push(t[i]!, y[i]!); lt.push(t[i]!, ref[i]!, y[i]!); sst.push(t[i]!, ref[i]!, y[i]!); }
      expect(st.result()).toEqual(a);
      expect(lt.result()).toEqual(b);
      expect(sst.result(win)).toBe(c);
      expect(b.dip).toBeGreaterThan(40); // the response starts 50 below the reference
      if (a.settlingTime_s !== null) settled++; else unsettled++;
      if (b.recovery_s !== null) recovered++;
    }
    // the cases cover settled and unsettled responses alike
    expect(settled).toBeGreaterThan(5);
    expect(unsettled).toBeGreaterThan(2);
    expect(recovered).toBeGreaterThan(5);
    function k2(n: number): number { return n % 2 ? Infinity : (0.6 * n) * 1e-4; }
  });
  it('rows taken at once (takeRows, times k·Ts) give what the samples taken one by one give', () => {
    // the same figures as the array forms above: common practice (no source)
    const Ts = 1e-4, n = 3000, stride = 5, at = 2;
    const rows = new Float64Array(n * stride);
    for (let i = 0; i < n; i++) {
      const t = i * Ts;
      rows[i * stride + at] = t < 0.05 ? 100 : 150;
      rows[i * stride + at + 1] = t < 0.05 ? 100 : 150 - 50 * Math.exp(-(t - 0.05) / 0.01) * Math.cos(300 * (t - 0.05)) - (t > 0.2 ? 8 * Math.exp(-(t - 0.2) / 0.005) : 0);
    }
    const one = [new StepResponseTracker(0.05, 0.2, 100, 150), new LoadStepTracker(0.2, Infinity, undefined, 16), new SteadyStateTracker(40)] as const;
    const many = [new StepResponseTracker(0.05, 0.2, 100, 150), new LoadStepTracker(0.2, Infinity, undefined, 16), new SteadyStateTracker(40)] as const;
    const s = new Float64Array(3);
    for (let i = 0; i < n; i++) {
      s[0] = i * Ts; s[1] = rows[i * stride + at]!; s[2] = rows[i * stride + at + 1]!;
      for (const tr of one) tr.take(s);
    }
    // uneven runs of rows, the last longer than the ring, from a block that starts at sample 7
    const k0 = 7;
    for (const tr of many) tr.takeRows(rows, stride, at, 0, k0, 0, Ts);
    const block = rows.subarray(k0 * stride);
    let i = 0;
    for (const len of [1, 2, 3, 900, 4, 5, 1000]) { for (const tr of many) tr.takeRows(block, stride, at, i, i + len, k0, Ts); i += len; }
    for (const tr of many) tr.takeRows(block, stride, at, i, n - k0, k0, Ts);
    expect(many[0].result()).toEqual(one[0].result());
    expect(many[0].result().overshoot_pct).toBeGreaterThan(10);
    expect(many[1].result()).toEqual(one[1].result());
    expect(many[1].result().dip).toBeGreaterThan(1);
    expect(many[2].result(0.003)).toBe(one[2].result(0.003));
    expect(many[2].result(0.003)).not.toBeNull();
  });
  it('a load step that never recovers gives null recovery, like the array form', () => {
    const n = 500;
    const t = grid(n, 1e-3);
    const y = Float64Array.from(t, (x) => (x < 0.1 ? 0 : -10 * x));
    const ref = new Float64Array(n);
    const lt = new LoadStepTracker(0.1, Infinity);
    for (let i = 0; i < n; i++) lt.push(t[i]!, ref[i]!, y[i]!);
    expect(lt.result()).toEqual(loadStepResponse(t, ref, y, n, 0.1, Infinity));
    expect(lt.result().recovery_s).toBeNull();
    expect(lt.result().dip).toBeCloseTo(4.99, 9);
  });
});
