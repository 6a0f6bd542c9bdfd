import { describe, expect, it } from 'vitest';
import { TraceRecorder, channel, scheduleBefore } from '../src/core/simulation/recorder';
import { Plant, STATE_SIZE, loadSchedule } from '../src/core/simulation/plant';
import { CascadeController, stepSchedule, DEFAULT_CONTROLLER_OPTIONS } from '../src/core/control/controller';
import type { ControllerConfig } from '../src/core/control/controller';
import { DEFAULT_SOLVER_OPTIONS } from '../src/core/simulation/simulation-setup';
import type { SimulationSetup } from '../src/core/simulation/simulation-setup';
import { TRACE_NAMES } from '../src/core/simulation/simulation-result';

const machine = { polePairs: 2, Rs: 0.1, Ld: 1e-3, Lq: 2e-3, psiM: 0.05 };
const Ts = 1e-4;

function setup(): SimulationSetup {
  const controller: ControllerConfig = {
    ...DEFAULT_CONTROLLER_OPTIONS, mode: 'current-step', Ts, delaySamples: 1, machine,
    currentD: { Kp: 1, Ki: 10 }, currentQ: { Kp: 1, Ki: 10 }, speed: { Kp: 0, Ki: 0 },
    Imax: 50, voltage: { shape: 'circle', radius: 100, Vdc: 173.2 }, table: null,
    speedRef: stepSchedule(0, []), torqueRef: stepSchedule(0, []), idRef: stepSchedule(0, []), iqRef: stepSchedule(0, []), initialTorque: 0,
  };
  return {
    plant: { machine, inertia: 1e-3, viscousFriction: 0, coulombFriction: 0, load: loadSchedule([{ t_s: 0, torque_Nm: 3 }]), mechanics: 'free', inputFrame: 'alpha-beta', coulombWidth_rad_s: 1e-3 },
    controller, duration_s: 10 * Ts, initialSpeed_rad_s: 0, initialTheta_rad: 0, solver: DEFAULT_SOLVER_OPTIONS,
    Imax: 50, tripCurrent_A: 150, divergenceSpeed_rad_s: Infinity, overspeed_rad_s: Infinity, marks: { speedSteps: [], loadEvents: [] }, tuning: null,
  };
}

describe('trace recorder', () => {
  it('row layout follows TRACE_NAMES (the time axis apart)', () => {
    expect(channel('speedRef_rpm')).toBe(0);
    expect(channel('ia_A')).toBe(TRACE_NAMES.indexOf('ia_A') - 1);
    expect(channel('pDc_W')).toBe(TRACE_NAMES.length - 2);
  });
  it('a sample: torque 1.5 p iq (psiM + (Ld - Lq) id), phase currents by the inverse Clarke transform, power 1.5 v·i', () => {
    // Krause, Wasynczuk and Sudhoff (2002), Analysis of Electric Machinery and Drive Systems, ch. 5
    // (torque, amplitude-invariant power); the inverse Clarke transform of a vector on the a axis
    const s = setup();
    const plant = new Plant(s.plant);
    const ctrl = new CascadeController(s.controller);
    const rec = new TraceRecorder(s, plant.model, plant, ctrl, 1, 100);
    const y = new Float64Array(STATE_SIZE);
    y[0] = 0; y[1] = 10; y[2] = 0; y[3] = -Math.PI / 2; // q axis on the a axis
    plant.setAngleOrigin(y[3]!);
    plant.input[0] = 20; plant.input[1] = 0;
    rec.record(0, y);
    rec.record(1, y);
    const tr = rec.traces();
    expect(Array.from(tr.t_s)).toEqual([0, Ts]);
    expect(tr.torque_Nm[0]).toBeCloseTo(1.5 * 2 * 10 * 0.05, 12);
    expect(tr.loadTorque_Nm[0]).toBe(3);
    expect(tr.ia_A[0]).toBeCloseTo(10, 12);
    expect(tr.ib_A[0]).toBeCloseTo(-5, 12);
    expect(tr.ic_A[0]).toBeCloseTo(-5, 12);
    expect(tr.pDc_W[0]).toBeCloseTo(1.5 * 20 * 10, 10);
    expect(tr.vq_V[0]).toBeCloseTo(20, 12); // the voltage on the a axis is the q axis at zero speed
    expect(tr.vNorm[0]).toBeCloseTo(0.2, 12);
    expect(Array.from(rec.last)).toEqual([Ts, 0, 0, 10]);
    expect(rec.count).toBe(2);
  });
  it('the speed before a step: the last step strictly before it, else the initial value', () => {
    expect(scheduleBefore([{ t: 0.1, v: 5 }, { t: 0.2, v: 7 }], 0.2, 1)).toBe(5);
    expect(scheduleBefore([{ t: 0.1, v: 5 }], 0.1, 1)).toBe(1);
  });
});

describe('the recorded load torque', () => {
  it('equals the plant\'s load torque at every sample time, across steps, ramps and the speed term', async () => {
    // reference: plant.loadTorque (the bisection over the schedule's breakpoints); common practice (no source)
    const { loadSchedule, Plant } = await import('../src/core/simulation/plant');
    const { TraceRecorder } = await import('../src/core/simulation/recorder');
    const { CascadeController } = await import('../src/core/control/controller');
    const { simulationFromProject } = await import('../src/core/project/simulation-from-project');
    const { loadProjectText } = await import('../src/core/project/project');
    const { readFileSync } = await import('node:fs');
    const { fileURLToPath } = await import('node:url');
    const p = loadProjectText(readFileSync(fileURLToPath(new URL('../resources/demo-ipm-traction.json', import.meta.url)), 'utf8'));
    const base = simulationFromProject(p, { scenario: { duration_s: 0.05 } });
    const load = loadSchedule([{ t_s: 0.01, torque_Nm: 20 }, { t_s: 0.02, torque_Nm: -5 }, { t_s: 0.02, torque_Nm: 7 }], [{ t_s: 0.03, duration_s: 0.008, torque_Nm: 40 }], 2e-4);
    const setup = { ...base, plant: { ...base.plant, load } };
    const plant = new Plant(setup.plant);
    const ctrl = new CascadeController(setup.controller);
    const n = 500;
    const rec = new TraceRecorder(setup, plant.model, plant, ctrl, n, 2 * (n + 1));
    const y = new Float64Array(5);
    const want: number[] = [];
    for (let k = 0; k <= n; k++) {
      y[2] = 100 - 0.7 * k; // the speed through zero: the quadratic term changes sign
      plant.setAngleOrigin(0);
      rec.record(k, y);
      want.push(plant.loadTorque(k * setup.controller.Ts, y[2]));
    }
    const got = Array.from(rec.traces().loadTorque_Nm);
    expect(got.length).toBe(n + 1);
    expect(got).toEqual(want);
  });
});

describe('the speed metrics of the recorder', () => {
  it('equal the array forms on the full-rate samples, whether the decimator holds every row or a bucket of them', async () => {
    // reference: stepResponse, loadStepResponse and steadyStateError of metrics.ts on the whole trace; common practice (no source)
    const { stepResponse, loadStepResponse, steadyStateError } = await import('../src/core/simulation/metrics');
    const { simulationFromProject } = await import('../src/core/project/simulation-from-project');
    const { loadProjectText } = await import('../src/core/project/project');
    const { readFileSync } = await import('node:fs');
    const { fileURLToPath } = await import('node:url');
    const p = loadProjectText(readFileSync(fileURLToPath(new URL('../resources/demo-ipm-traction.json', import.meta.url)), 'utf8'));
    const s = simulationFromProject(p, { control: { angle: { source: 'ideal' } }, scenario: { duration_s: 0.2, speedSteps: [{ t_s: 0.01, speed_rpm: 1100 }], loadSteps: [{ t_s: 0.1, torque_Nm: 30 }] } });
    const n = 2000;
    const Ts = s.controller.Ts;
    const make = (maxPoints: number) => {
      const plant = new Plant(s.plant);
      const ctrl = new CascadeController(s.controller);
      return { rec: new TraceRecorder(s, plant.model, plant, ctrl, n, maxPoints), plant, ctrl };
    };
    const runs = [make(2 * (n + 1)), make(300)];
    const y = new Float64Array(STATE_SIZE);
    for (let k = 0; k <= n; k++) {
      const t = k * Ts;
      // a speed that overshoots the step to 1100 rpm, settles, then dips at the load step and recovers
      const rpm = t < 0.01 ? 1000 : 1100 - 100 * Math.exp(-(t - 0.01) / 0.004) * Math.cos(900 * (t - 0.01)) - (t >= 0.1 ? 30 * ((t - 0.1) / 0.005) * Math.exp(1 - (t - 0.1) / 0.005) : 0);
      y[2] = (rpm * Math.PI) / 30;
      for (const r of runs) {
        r.ctrl.speedRefOut = ((t < 0.01 ? 1000 : 1100) * Math.PI) / 30;
        r.plant.setAngleOrigin(0);
        r.rec.record(k, y);
      }
    }
    const full = runs[0]!.rec.traces();
    const tLast = n * Ts;
    const want = {
      step: stepResponse(full.t_s, full.speed_rpm, n + 1, 0.01, 0.1, 1000, 1100),
      load: loadStepResponse(full.t_s, full.speedRef_rpm, full.speed_rpm, n + 1, 0.1, Infinity, undefined, 1),
      sse: steadyStateError(full.t_s, full.speedRef_rpm, full.speed_rpm, n + 1, 0.05 * tLast),
    };
    expect(want.step.overshoot_pct).toBeGreaterThan(10);
    expect(want.load.dip).toBeCloseTo(30, 1);
    for (const { rec } of runs) {
      const m = rec.speedMetrics(tLast);
      expect([m.rise, m.over, m.settle]).toEqual([want.step.riseTime_s, want.step.overshoot_pct, want.step.settlingTime_s]);
      expect([m.dip, m.recov]).toEqual([want.load.dip, want.load.recovery_s]);
      expect(m.sse).toBe(want.sse);
      expect(rec.loadSteps()[0]!.dip_rpm).toBe(want.load.dip);
    }
  });
  it('takes the samples in order', () => {
    const s = setup();
    const plant = new Plant(s.plant);
    const rec = new TraceRecorder(s, plant.model, plant, new CascadeController(s.controller), 3, 100);
    const y = new Float64Array(STATE_SIZE);
    rec.record(0, y);
    expect(() => rec.record(2, y)).toThrow(/in order/);
  });
});

describe('the recorded modulation index on the hexagon', () => {
  it('is |v| over the hexagon radius at the vector angle, 1 at a vertex (2 Vdc/3) and at a face middle (Vdc/√3)', async () => {
    // the six-step hexagon: vertices 2 Vdc/3, inscribed radius Vdc/√3 (Holmes and Lipo, 2003, Pulse Width
    // Modulation for Power Converters, ch. 6); reference: hexagonRadius of drive/inverter.ts
    const { hexagonRadius } = await import('../src/core/drive/inverter');
    const Vdc = 300;
    const s = setup();
    s.controller = { ...s.controller, voltage: { shape: 'hexagon', radius: Vdc / Math.sqrt(3), Vdc } };
    const plant = new Plant(s.plant);
    const n = 720;
    const rec = new TraceRecorder(s, plant.model, plant, new CascadeController(s.controller), n, 2 * (n + 1));
    const y = new Float64Array(STATE_SIZE);
    const want: number[] = [];
    for (let k = 0; k <= n; k++) {
      const ang = k < n ? (k * 2 * Math.PI) / n - 0.3 : Math.PI / 6;
      const mag = k < n ? 50 + 150 * ((k * 7) % 11) / 11 : Vdc / Math.sqrt(3);
      plant.input[0] = k === 0 ? (2 * Vdc) / 3 : mag * Math.cos(ang);
      plant.input[1] = k === 0 ? 0 : mag * Math.sin(ang);
      want.push(Math.hypot(plant.input[0]!, plant.input[1]!) / hexagonRadius(Vdc, Math.atan2(plant.input[1]!, plant.input[0]!)));
      plant.setAngleOrigin(0);
      rec.record(k, y);
    }
    const got = rec.traces().vNorm;
    expect(got[0]).toBeCloseTo(1, 14);
    expect(got[n]).toBeCloseTo(1, 14);
    let worst = 0;
    for (let k = 0; k <= n; k++) worst = Math.max(worst, Math.abs(got[k]! - want[k]!) / want[k]!);
    expect(worst).toBeLessThan(1e-14);
    expect(Math.min(...got)).toBeLessThan(0.3);
  });
});
