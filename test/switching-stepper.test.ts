// The switching model as the simulator's stepper (src/core/simulation/switching-stepper.ts): its
// fast path for constant-parameter machines against Cash-Karp segments, and a whole run against the
// averaged model on the traction demo.
import { describe, expect, it } from 'vitest';
import { demoJson } from './helpers';
import { parseProject } from '../src/core/project/schema';
import { resolveProject } from '../src/core/project/project';
import { simulationFromProject } from '../src/core/project/simulation-from-project';
import { runSimulation } from '../src/core/simulation/simulate';
import { Plant, STATE_SIZE } from '../src/core/simulation/plant';
import { CashKarpStepper, Rk4Stepper } from '../src/core/simulation/stepper';
import { SwitchingStepper } from '../src/core/simulation/switching-stepper';
import { FluxMapModel } from '../src/core/machine/flux-map';
import type { DqMachine } from '../src/core/machine/dq-machine';

const traction = () => resolveProject(parseProject(demoJson('demo-ipm-traction')));

describe('switching stepper', () => {
  it('one RK4 step per segment stays within 1e-7 Imax of Cash-Karp segments at tol 1e-10 (open loop, traction machine at 3000 rpm, dead time 2 µs) (common practice, no source)', () => {
    const s = simulationFromProject(traction(), { control: { pwm: { model: 'switching', deadTime_s: 2e-6 } } });
    const Ts = s.controller.Ts;
    const run = (fast: boolean): Float64Array => {
      const plant = new Plant({ ...s.plant, mechanics: 'locked' });
      const y = new Float64Array(STATE_SIZE);
      y[2] = (3000 * Math.PI) / 30;
      const inner = fast ? new Rk4Stepper(plant, Ts, 1) : new CashKarpStepper(plant, Ts, y, 1e-10, new Float64Array([1e-6, 1e-6, 1e-3, 1e-6, Infinity]));
      const st = new SwitchingStepper(plant, Ts, inner, s.pwm!);
      const out = new Float64Array(2 * 1000);
      for (let k = 0; k < 1000; k++) {
        // a constant dq voltage held in alpha-beta
        const th = y[3]!;
        plant.setAngleOrigin(th);
        plant.input[0] = -60 * Math.cos(th) - 120 * Math.sin(th);
        plant.input[1] = -60 * Math.sin(th) + 120 * Math.cos(th);
        st.period(y, k * Ts, (k + 1) * Ts);
        out[2 * k] = y[0]!; out[2 * k + 1] = y[1]!;
      }
      return out;
    };
    const a = run(true), b = run(false);
    let e = 0, big = 0;
    for (let j = 0; j < a.length; j++) { e = Math.max(e, Math.abs(a[j]! - b[j]!)); big = Math.max(big, Math.abs(b[j]!)); }
    expect(big).toBeGreaterThan(50); // a real current flows
    expect(e).toBeLessThan(1e-7 * s.Imax);
  });

  it('the traction demo (speed step and load step, 0.8 s) switched at 10 kHz matches the averaged run: final speed within 0.5 rpm, rms current within 1 % (PWM averaging, Holmes and Lipo 2003, ch. 3); two updates per carrier period too', () => {
    const p = traction();
    const scenario = { duration_s: 0.8 };
    const avg = runSimulation(simulationFromProject(p, { scenario }));
    const sw = runSimulation(simulationFromProject(p, { scenario, control: { pwm: { model: 'switching', deadTime_s: 0 } } }));
    const two = runSimulation(simulationFromProject(p, { scenario, control: { fCtrl_Hz: 20000, pwm: { model: 'switching', fsw_Hz: 10000, deadTime_s: 0 } } }));
    for (const r of [sw, two]) {
      expect(r.diagnostic).toBeUndefined();
      expect(Math.abs(r.metrics.finalSpeed_rpm! - avg.metrics.finalSpeed_rpm!)).toBeLessThan(0.5);
      expect(Math.abs(r.metrics.rmsCurrent_A! / avg.metrics.rmsCurrent_A! - 1)).toBeLessThan(0.01);
    }
  });

  it('the exact segments (the default for a constant-parameter machine) stay within 1e-6 Imax of one RK4 step per segment over a whole run: traction demo, speed step and load step, 0.7 s, dead time 2 µs, every segment boundary compared (common practice, no source)', () => {
    const s = simulationFromProject(traction(), { control: { pwm: { model: 'switching', deadTime_s: 2e-6, window_s: { from: 0, to: 0.7 } } }, scenario: { duration_s: 0.7 } });
    const a = runSimulation(s);
    const b = runSimulation({ ...s, solver: { ...s.solver, switchingSegments: 'rk4' } });
    expect(a.stats.evaluationsPerPeriod).toBeLessThan(b.stats.evaluationsPerPeriod); // two node evaluations per segment against four
    const wa = a.switching!.window, wb = b.switching!.window;
    expect(wa.t_s.length).toBe(wb.t_s.length);
    expect(wa.t_s.length).toBeGreaterThan(7 * 7000 * 0.9); // every boundary of 7000 carrier periods
    let e = 0, big = 0;
    for (let i = 0; i < wa.t_s.length; i++) {
      for (const k of ['ia_A', 'ib_A', 'ic_A'] as const) { e = Math.max(e, Math.abs(wa[k][i]! - wb[k][i]!)); big = Math.max(big, Math.abs(wb[k][i]!)); }
    }
    expect(big).toBeGreaterThan(300);
    expect(e).toBeLessThan(1e-6 * s.Imax);
    expect(Math.abs(a.metrics.finalSpeed_rpm! - b.metrics.finalSpeed_rpm!)).toBeLessThan(1e-4);
    expect(Math.abs(a.metrics.energyFromBus_J! / b.metrics.energyFromBus_J! - 1)).toBeLessThan(1e-6);
  });

  it('puts the controller\'s command back into the plant\'s input after the period', () => {
    const s = simulationFromProject(traction(), { control: { pwm: { model: 'switching', deadTime_s: 1e-6 } } });
    const plant = new Plant(s.plant);
    const y = new Float64Array(STATE_SIZE);
    const st = new SwitchingStepper(plant, s.controller.Ts, new Rk4Stepper(plant, s.controller.Ts, 1), s.pwm!);
    plant.input[0] = 50; plant.input[1] = -20;
    st.period(y, 0, s.controller.Ts);
    expect([...plant.input]).toEqual([50, -20]);
    expect(st.bridge.segments).toBeGreaterThanOrEqual(7);
  });

  it('a flux map (flux states, Cash-Karp segments through the general derivative) tabulated from the constant machine follows the constant machine\'s RK4 segments within 1e-5 Imax (dead time 2 µs, no device drop, open loop at 3000 rpm) (common practice, no source)', () => {
    const s = simulationFromProject(traction(), { control: { pwm: { model: 'switching', deadTime_s: 2e-6 } } });
    const m = s.plant.machine as DqMachine;
    const span = 1.5 * s.Imax, n = 31;
    const g = Array.from({ length: n }, (_, k) => -span + (2 * span * k) / (n - 1));
    const map = new FluxMapModel({ magnetTemp_C: 20, id_A: g, iq_A: g, psid_Wb: g.map((id) => g.map(() => m.Ld * id + m.psiM)), psiq_Wb: g.map(() => g.map((iq) => m.Lq * iq)) }, m.polePairs, m.Rs);
    const Ts = s.controller.Ts;
    const run = (machine: DqMachine | FluxMapModel): Float64Array => {
      const plant = new Plant({ ...s.plant, machine, mechanics: 'locked' });
      expect(plant.fluxStates).toBe(machine === map);
      const y = new Float64Array(STATE_SIZE);
      plant.setCurrents(y, 0, 0);
      y[2] = (3000 * Math.PI) / 30;
      const inner = machine === map ? new CashKarpStepper(plant, Ts, y, 1e-9, new Float64Array([1e-6, 1e-6, 1e-3, 1e-6, Infinity])) : new Rk4Stepper(plant, Ts, 1);
      // no device drop: its sign is taken at each segment's start, and the map's path splits the
      // segments at every commanded edge (the sign of its current is not predicted)
      const st = new SwitchingStepper(plant, Ts, inner, { ...s.pwm!, deviceDrop_V: 0 });
      const yi = new Float64Array(STATE_SIZE);
      const out = new Float64Array(2 * 300);
      for (let k = 0; k < 300; k++) {
        const th = y[3]!;
        plant.setAngleOrigin(th);
        plant.input[0] = -60 * Math.cos(th) - 120 * Math.sin(th);
        plant.input[1] = -60 * Math.sin(th) + 120 * Math.cos(th);
        st.period(y, k * Ts, (k + 1) * Ts);
        plant.currentState(y, yi);
        out[2 * k] = yi[0]!; out[2 * k + 1] = yi[1]!;
      }
      return out;
    };
    const a = run(m), b = run(map);
    let e = 0;
    for (let j = 0; j < a.length; j++) e = Math.max(e, Math.abs(a[j]! - b[j]!));
    expect(Math.max(...b.map(Math.abs))).toBeGreaterThan(50);
    expect(e).toBeLessThan(1e-5 * s.Imax);
  });
});
