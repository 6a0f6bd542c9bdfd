import { describe, expect, it } from 'vitest';
import { CascadeController, limitVoltageDq, stepSchedule, scheduleValue, voltageLimitAt, DEFAULT_CONTROLLER_OPTIONS } from '../src/core/control/controller';
import type { ControllerConfig, VoltageLimitSpec } from '../src/core/control/controller';
import { hexagonVertex } from '../src/core/drive/inverter';

const machine = { polePairs: 3, Rs: 0.1, Ld: 1e-3, Lq: 1e-3, psiM: 0.05 };
const circle: VoltageLimitSpec = { shape: 'circle', radius: 100, Vdc: 173.2 };
const hex: VoltageLimitSpec = { shape: 'hexagon', radius: 300 / Math.sqrt(3), Vdc: 300 };

function cfg(over: Partial<ControllerConfig> = {}): ControllerConfig {
  return {
    ...DEFAULT_CONTROLLER_OPTIONS,
    mode: 'current-step', Ts: 1e-4, delaySamples: 1, machine,
    currentD: { Kp: 2, Ki: 200 }, currentQ: { Kp: 2, Ki: 200 }, speed: { Kp: 0, Ki: 0 },
    antiWindup: 'clamping', decoupling: false, backEmfFeedForward: false, delayAngleCompensation: false,
    Imax: 50, voltage: circle, table: null,
    speedRef: stepSchedule(0, []), torqueRef: stepSchedule(0, []),
    idRef: stepSchedule(0, []), iqRef: stepSchedule(0, [{ t: 0, v: 10 }]), initialTorque: 0,
    ...over,
  };
}

describe('voltage limit with d-axis priority', () => {
  const out = new Float64Array(2);
  it('circle: inside untouched, d kept and q shortened, d alone clipped to the radius', () => {
    expect(limitVoltageDq(circle, 30, 40, 0, out)).toBe(false);
    expect(Array.from(out)).toEqual([30, 40]);
    expect(limitVoltageDq(circle, 60, 100, 0, out)).toBe(true);
    expect(out[0]).toBe(60);
    expect(out[1]).toBeCloseTo(80, 12);
    limitVoltageDq(circle, -150, 20, 0, out);
    expect(Array.from(out)).toEqual([-100, 0]);
  });

  it('hexagon: reaches the vertex 2 Vdc/3 along a vertex, the inscribed radius Vdc/sqrt(3) along an edge middle', () => {
    // hexagon geometry of the two-level bridge (Holmes and Lipo, 2003, Pulse width modulation for power converters)
    limitVoltageDq(hex, 1000, 0, 0, out); // d axis on phase a = a vertex
    expect(out[0]).toBeCloseTo(hexagonVertex(300), 9);
    expect(out[1]).toBeCloseTo(0, 9);
    limitVoltageDq(hex, 1000, 0, Math.PI / 6, out); // d axis on an edge middle
    expect(out[0]).toBeCloseTo(300 / Math.sqrt(3), 9);
    expect(voltageLimitAt(hex, Math.PI / 6)).toBeCloseTo(300 / Math.sqrt(3), 9);
  });

  it('hexagon: every limited vector lies on or inside the hexagon and keeps vd where it can', () => {
    const h = 300 / Math.sqrt(3);
    for (let k = 0; k < 200; k++) {
      const th = (k * 0.173) % (2 * Math.PI);
      const vd = -250 + ((k * 37) % 500);
      const vq = -400 + ((k * 91) % 800);
      limitVoltageDq(hex, vd, vq, th, out);
      const a = out[0]! * Math.cos(th) - out[1]! * Math.sin(th);
      const b = out[0]! * Math.sin(th) + out[1]! * Math.cos(th);
      for (let e = 0; e < 3; e++) {
        const phi = Math.PI / 6 + (e * Math.PI) / 3;
        expect(Math.abs(a * Math.cos(phi) + b * Math.sin(phi))).toBeLessThanOrEqual(h * (1 + 1e-9));
      }
      if (Math.abs(vd) <= voltageLimitAt(hex, th)) expect(out[0]).toBe(vd);
    }
  });
});

describe('digital current controller', () => {
  it('applies the command delaySamples periods late, rotated at the sampled angle', () => {
    const c = new CascadeController(cfg({ delaySamples: 2 }));
    c.reset(0, 0);
    const out = new Float64Array(2);
    const cmd: number[] = [];
    const applied: number[] = [];
    for (let k = 0; k < 5; k++) {
      c.step(k * 1e-4, 0, k, 0, 0, out); // iq error shrinks each period
      cmd.push(c.vqCmd);
      applied.push(out[1]!);
    }
    expect(applied[0]).toBe(0);
    expect(applied[1]).toBe(0);
    expect(applied[2]).toBeCloseTo(cmd[0]!, 12);
    expect(applied[4]).toBeCloseTo(cmd[2]!, 12);
    // angle pi/2: q axis lies on -alpha
    const d = new CascadeController(cfg({ delaySamples: 0 }));
    d.reset(0, Math.PI / 2);
    d.step(0, 0, 0, 0, Math.PI / 2, out);
    expect(out[0]).toBeCloseTo(-d.vqCmd, 12);
    expect(out[1]).toBeCloseTo(0, 12);
  });

  it('advances the inverse-Park angle by (delaySamples + 0.5) omega_e Ts when compensating', () => {
    const w = 100; // rad/s mechanical, omega_e = 300
    const c = new CascadeController(cfg({ delaySamples: 0, delayAngleCompensation: true }));
    c.reset(w, 0);
    const out = new Float64Array(2);
    c.step(0, 0, 0, w, 0, out);
    const th = 0.5 * 300 * 1e-4;
    expect(Math.atan2(out[1]!, out[0]!)).toBeCloseTo(Math.atan2(c.vqCmd, c.vdCmd) + th, 12);
  });

  it('current reference is limited to Imax with d priority', () => {
    const c = new CascadeController(cfg({ idRef: stepSchedule(0, [{ t: 0, v: -40 }]), iqRef: stepSchedule(0, [{ t: 0, v: 40 }]) }));
    c.reset(0, 0);
    c.step(0, 0, 0, 0, 0, new Float64Array(2));
    expect(c.idRef).toBe(-40);
    expect(c.iqRef).toBeCloseTo(30, 12);
    expect(c.currentLimited).toBe(true);
  });

  it('clamping stops the integrator while saturated; back-calculation holds it near the limit', () => {
    // a 100 V limit against a reference that would need far more (R i = 0.1·2000 > 100 V) on a locked rotor
    const big = { iqRef: stepSchedule(0, [{ t: 0, v: 2000 }]), Imax: 5000 };
    const out = new Float64Array(2);
    const cl = new CascadeController(cfg({ ...big, antiWindup: 'clamping' }));
    const bc = new CascadeController(cfg({ ...big, antiWindup: 'back-calculation' }));
    cl.reset(0, 0);
    bc.reset(0, 0);
    for (let k = 0; k < 2000; k++) {
      cl.step(k * 1e-4, 0, 0, 0, 0, out);
      bc.step(k * 1e-4, 0, 0, 0, 0, out);
    }
    expect(cl.voltageSaturated).toBe(true);
    expect(cl.xq).toBe(0); // never integrated: the first command already saturates
    // back-calculation: x -> x + Ts Ki e + kb (v - u), u = Kp e + x, kb = Ts Ki / Kp; fixed point
    // x = Ts Ki e / kb + v - Kp e (bounded, where plain integration would grow without end)
    const e = 2000;
    const kb = (1e-4 * 200) / 2;
    const xInf = (1e-4 * 200 * e + kb * (100 - 2 * e)) / kb; // fixed point of the update with u = Kp e + x
    expect(bc.xq).toBeCloseTo(xInf, 6);
  });

  it('decoupling and back-EMF feed-forward give the steady-state voltage with zero error', () => {
    const w = 200; // omega_e = 600
    // zero current error: v = [-we Lq iq, we (Ld id + psiM)] (the conventions page's dq equations without Rs i)
    const c2 = new CascadeController(cfg({ decoupling: true, backEmfFeedForward: true, delaySamples: 0, voltage: { ...circle, radius: 1e4 }, idRef: stepSchedule(3, []), iqRef: stepSchedule(10, []) }));
    c2.reset(0, 0);
    c2.step(0, 3, 10, w, 0, new Float64Array(2));
    expect(c2.vdCmd).toBeCloseTo(-600 * 1e-3 * 10, 12);
    expect(c2.vqCmd).toBeCloseTo(600 * (1e-3 * 3 + 0.05), 12);
  });

  it('schedules hold the last step', () => {
    const s = stepSchedule(1, [{ t: 0.2, v: 3 }, { t: 0.1, v: 2 }]);
    expect(scheduleValue(s, 0.05)).toBe(1);
    expect(scheduleValue(s, 0.1)).toBe(2);
    expect(scheduleValue(s, 5)).toBe(3);
  });
});
