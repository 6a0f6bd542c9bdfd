import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { sampledCurrentOpenLoop, sampledMargins, sampledSpeedOpenLoop, UnwrappedResponse, zohFirstOrder, zohStateSpace, type SampledSpeedLoopSpec } from '../src/core/control/sampled-loop';
import { tuneFromProject } from '../src/core/project/tuning-from-project';
import { loadProjectText } from '../src/core/project/project';

// ---------------------------------------------------------------- an independent route
// The loops are rebuilt here by time stepping: the winding (and shaft) integrated by classical RK4
// with many sub-steps under the held voltage, the PI and the delay line written out as difference
// equations the way controller.ts runs them (u = Kp e + x, then x += Ki T e; the voltage waits d
// periods). A sinusoidal reference is applied until the transient has died, and the sampled response
// is fitted by least squares over whole periods of the input.

interface Axis { R: number; L: number; Kp: number; Ki: number; T: number; D: number }

/** one control period of di/dt = (u - R i)/L (and d omega/dt = (i - B omega)/J), RK4 with n sub-steps */
function rk4Period(x: [number, number], u: number, R: number, L: number, J: number, B: number, T: number, n = 40): void {
  const h = T / n;
  const f = (i: number, w: number): [number, number] => [(u - R * i) / L, (i - B * w) / J];
  for (let k = 0; k < n; k++) {
    const [i, w] = x;
    const k1 = f(i, w);
    const k2 = f(i + (h / 2) * k1[0], w + (h / 2) * k1[1]);
    const k3 = f(i + (h / 2) * k2[0], w + (h / 2) * k2[1]);
    const k4 = f(i + h * k3[0], w + h * k3[1]);
    x[0] = i + (h / 6) * (k1[0] + 2 * k2[0] + 2 * k3[0] + k4[0]);
    x[1] = w + (h / 6) * (k1[1] + 2 * k2[1] + 2 * k3[1] + k4[1]);
  }
}

/** complex amplitude of y[k] ~ Re(A e^{j theta k}) over the last `periods` input periods */
function fit(y: number[], theta: number, start: number): [number, number] {
  let cc = 0, ss = 0, cs = 0, yc = 0, ys = 0;
  for (let k = start; k < y.length; k++) {
    const c = Math.cos(theta * k);
    const s = Math.sin(theta * k);
    cc += c * c; ss += s * s; cs += c * s; yc += y[k]! * c; ys += y[k]! * s;
  }
  const det = cc * ss - cs * cs;
  const a = (yc * ss - ys * cs) / det; // y = a cos - b sin  =>  A = a + j b
  const b = -(ys * cc - yc * cs) / det;
  return [a, b];
}

/** closed current loop i/r at theta, by time stepping */
function currentClosedByStepping(ax: Axis, theta: number): [number, number] {
  const x: [number, number] = [0, 0];
  let integ = 0;
  const line: number[] = new Array(ax.D).fill(0);
  const y: number[] = [];
  const N = Math.ceil((2 * Math.PI) / theta) * 60 + 4000;
  for (let k = 0; k < N; k++) {
    const r = Math.cos(theta * k);
    const e = r - x[0];
    const v = ax.Kp * e + integ;
    integ += ax.Ki * ax.T * e;
    line.push(v);
    const u = line.shift()!;
    y.push(x[0]);
    rk4Period(x, u, ax.R, ax.L, 1, 0, ax.T);
  }
  return fit(y, theta, Math.floor(N / 2));
}

const div = (a: [number, number], b: [number, number]): [number, number] => {
  const d = b[0] * b[0] + b[1] * b[1];
  return [(a[0] * b[0] + a[1] * b[1]) / d, (a[1] * b[0] - a[0] * b[1]) / d];
};

describe('sampled-data loops', () => {
  it('ZOH equivalent of 1/(R + sL): a = e^{-RT/L}, b = (1 - a)/R, as one period of the held winding integrates', () => {
    // Franklin, Powell and Workman, 1998, Digital Control of Dynamic Systems (ZOH equivalent of a first-order lag)
    const R = 0.2, L = 1e-3, T = 1e-4;
    const { a, b } = zohFirstOrder(R, L, T);
    expect(a).toBeCloseTo(Math.exp(-(R / L) * T), 15);
    const x0: [number, number] = [1, 0];
    rk4Period(x0, 0, R, L, 1, 0, T, 200);
    expect(x0[0]).toBeCloseTo(a, 12);
    const x1: [number, number] = [0, 0];
    rk4Period(x1, 1, R, L, 1, 0, T, 200);
    expect(x1[0]).toBeCloseTo(b, 12);
    // R = 0: the limit T/L
    expect(zohFirstOrder(0, L, T)).toEqual({ a: 1, b: T / L });
    // the matrix route gives the same numbers
    const ss = zohStateSpace([[-R / L]], [1 / L], T);
    expect(ss.Phi[0]![0]!).toBeCloseTo(a, 14);
    expect(ss.Gamma[0]! / b).toBeCloseTo(1, 12);
  });

  it('current loop: L/(1+L) on the unit circle equals the closed loop stepped in time', () => {
    for (const ax of [
      { R: 0.2, L: 1e-3, Kp: 2 * Math.PI * 500 * 1e-3, Ki: 2 * Math.PI * 500 * 0.2, T: 1e-4, D: 1 },
      { R: 1.5, L: 4e-3, Kp: 30, Ki: 9000, T: 1 / 16000, D: 2 },
      { R: 0.05, L: 2e-4, Kp: 0.5, Ki: 200, T: 5e-5, D: 0 },
    ]) {
      const open = sampledCurrentOpenLoop(ax.Kp, ax.Ki, ax.R, ax.L, ax.T, ax.D);
      for (const theta of [0.05, 0.3, 1.1, 2.5]) {
        const o = new Float64Array(2);
        open(theta, o);
        const cl = div([o[0]!, o[1]!], [1 + o[0]!, o[1]!]);
        const st = currentClosedByStepping(ax, theta);
        expect(Math.hypot(st[0] - cl[0], st[1] - cl[1])).toBeLessThan(2e-5 * Math.max(1, Math.hypot(cl[0], cl[1])));
      }
    }
  });

  it('speed loop: the lifted plant equals the inner loop and shaft stepped in time (divider 1 and 3, delay 0 to 2)', () => {
    for (const [divider, D] of [[1, 1], [3, 2], [2, 0]] as const) {
      const sp: SampledSpeedLoopSpec = { currentKp: 2 * Math.PI * 400 * 2e-3, currentKi: 2 * Math.PI * 400 * 0.3, R: 0.3, L: 2e-3, J: 2e-3, B: 0.1, T: 1e-4, delaySamples: D, divider, speedKp: 0.4, speedKi: 30 };
      const open = sampledSpeedOpenLoop(sp);
      for (const theta of [0.1, 0.7, 2.0]) {
        const o = new Float64Array(2);
        open(theta, o);
        // divide out the speed PI to get the plant P = L / C
        const sh = Math.sin(theta / 2);
        const zc: [number, number] = [-2 * sh * sh, Math.sin(theta)];
        const piC = div([sp.speedKi * sp.T * divider, 0], zc);
        const P = div([o[0]!, o[1]!], [sp.speedKp + piC[0], piC[1]]);
        // time stepping: torque reference held over `divider` periods, speed read every `divider` periods
        const x: [number, number] = [0, 0];
        let integ = 0;
        const line: number[] = new Array(D).fill(0);
        const y: number[] = [];
        const M = Math.ceil((2 * Math.PI) / theta) * 40 + 3000;
        for (let m = 0; m < M; m++) {
          const r = Math.cos(theta * m);
          y.push(x[1]);
          for (let k = 0; k < divider; k++) {
            const e = r - x[0];
            const v = sp.currentKp * e + integ;
            integ += sp.currentKi * sp.T * e;
            line.push(v);
            rk4Period(x, line.shift()!, sp.R, sp.L, sp.J, sp.B, sp.T);
          }
        }
        const st = fit(y, theta, Math.floor(M / 2));
        expect(Math.hypot(st[0] - P[0], st[1] - P[1])).toBeLessThan(1e-5 * Math.hypot(P[0], P[1]));
      }
    }
  });

  it('gain margin: the closed current loop at (1 - 3 %) of the margin decays, at (1 + 3 %) grows', () => {
    const ax = { R: 0.2, L: 1e-3, Kp: 2 * Math.PI * 800 * 1e-3, Ki: 2 * Math.PI * 800 * 0.2, T: 1e-4, D: 1 };
    const u = new UnwrappedResponse(sampledCurrentOpenLoop(ax.Kp, ax.Ki, ax.R, ax.L, ax.T, ax.D), 1e-5, -Math.PI / 2);
    const m = sampledMargins(u, ax.T);
    expect(m.gainMargin_dB!).toBeGreaterThan(1);
    const k = Math.pow(10, m.gainMargin_dB! / 20);
    const growth = (g: number): number => {
      const x: [number, number] = [0, 0];
      let integ = 0;
      const line = [0];
      let early = 0, late = 0;
      for (let n = 0; n < 6000; n++) {
        const e = (n === 0 ? 1 : 0) - x[0];
        const v = g * ax.Kp * e + integ;
        integ += g * ax.Ki * ax.T * e;
        line.push(v);
        rk4Period(x, line.shift()!, ax.R, ax.L, 1, 0, ax.T, 10);
        if (n >= 1000 && n < 1100) early = Math.max(early, Math.abs(x[0]));
        if (n >= 5900) late = Math.max(late, Math.abs(x[0]));
      }
      return late / early;
    };
    expect(growth(0.97 * k)).toBeLessThan(1);
    expect(growth(1.03 * k)).toBeGreaterThan(1);
    // the closed-loop peak is at least the gain at any grid point and at least 0 dB (an integrating loop)
    expect(m.peaking_dB!).toBeGreaterThan(0);
  });

  it('phase margin: 90° - 1.5 theta_c for the internal-model loop with one period of delay and a slow winding', () => {
    // derived here: with the PI zero on the winding pole the loop is K z^-1/(z-1), phase -90° - 1.5 theta
    // (the 1/(z-1) of the ZOH-equivalent integrator lags by theta/2), |z - 1| = 2 sin(theta/2)
    const T = 1e-4;
    const ax = { R: 1e-9, L: 1e-3, T };
    const K = 0.2;
    // R -> 0: Kp b = Kp T/L = K
    const open = sampledCurrentOpenLoop((K * ax.L) / T, 0, ax.R, ax.L, T, 1);
    const m = sampledMargins(new UnwrappedResponse(open, 1e-5, -Math.PI / 2), T);
    const thc = 2 * Math.asin(K / 2);
    expect(m.crossover_Hz!).toBeCloseTo(thc / (2 * Math.PI * T), 3);
    expect(m.phaseMargin_deg!).toBeCloseTo(90 - (1.5 * thc * 180) / Math.PI, 4);
    // phase -180° at theta = pi/3; gain there K/(2 sin(pi/6)) = K
    expect(m.gainMargin_dB!).toBeCloseTo(-20 * Math.log10(K), 6);
  });

  it('demos: the sampled margins beside the continuous approximation (measured, within a degree for the current loops)', () => {
    const diffs: Record<string, number> = {};
    for (const f of ['demo-spm-48v', 'demo-ipm-traction', 'demo-servo-axis']) {
      const p = loadProjectText(readFileSync(resolve(__dirname, '..', 'resources', `${f}.json`), 'utf8'));
      const r = tuneFromProject(p);
      for (const [k, l] of Object.entries({ d: r.current, q: r.currentQ, speed: r.speed })) {
        if (!l) continue;
        diffs[`${f} ${k}`] = l.continuous.phaseMargin_deg! - l.phaseMargin_deg!;
      }
    }
    // measured with this code (continuous minus sampled, deg): the servo's current loops are 0.2 to
    // 0.3° optimistic in the continuous approximation, the traction's 0.06 to 0.14°; the 48 V motor's
    // winding pole is fast enough (R T/L large) that its sampled current loop has a slightly lower
    // crossover and 0.1° more margin
    expect(diffs['demo-servo-axis d']!).toBeGreaterThan(0.15);
    expect(diffs['demo-servo-axis d']!).toBeLessThan(0.35);
    expect(diffs['demo-servo-axis q']!).toBeGreaterThan(0.15);
    expect(diffs['demo-servo-axis q']!).toBeLessThan(0.35);
    expect(diffs['demo-ipm-traction d']!).toBeGreaterThan(0);
    expect(diffs['demo-ipm-traction q']!).toBeGreaterThan(0);
    expect(Math.abs(diffs['demo-spm-48v d']!)).toBeLessThan(0.3);
    for (const [k, v] of Object.entries(diffs)) if (!k.endsWith('speed')) expect(Math.abs(v)).toBeLessThan(1);
  });

  it('the grid keeps the response it was built from: the margins read there the numbers a new evaluation gives', () => {
    // common practice (no source): a scan that reads stored samples finds the same crossing as one that evaluates again
    const spec: SampledSpeedLoopSpec = { currentKp: 2.5, currentKi: 500, R: 0.2, L: 1e-3, J: 5e-3, B: 1e-3, T: 1e-4, delaySamples: 1, divider: 2, speedKp: 0.6, speedKi: 30 };
    for (const resp of [sampledCurrentOpenLoop(2.5, 500, 0.2, 1e-3, 1e-4, 1), sampledSpeedOpenLoop(spec)]) {
      const u = new UnwrappedResponse(resp, 1e-5, -Math.PI / 2, 400);
      const o = new Float64Array(2);
      for (let k = 1; k < 400; k++) {
        resp(u.theta[k]!, o);
        expect([u.re[k], u.im[k]]).toEqual([o[0], o[1]]);
        expect(u.mag[k]).toBe(u.at(u.theta[k]!, u.phase[k - 1]!)[0]);
        expect(u.phase[k]).toBe(u.at(u.theta[k]!, u.phase[k - 1]!)[1]);
      }
      // the first down-crossing of the gain, by stored samples and by evaluating at each grid point
      const g = (th: number, k: number): number => Math.log(u.at(th, u.phase[k]!)[0]);
      const stored = u.mag.map((m) => Math.log(m));
      const evaluated = u.theta.map((th, k) => (k === 0 ? 0 : g(th, k - 1)));
      expect(evaluated.slice(1)).toEqual(stored.slice(1));
      expect(u.firstDown(g, stored)).toBe(u.firstDown(g, evaluated));
      expect(u.firstDown(g, stored)).not.toBeNull();
    }
  });
});
