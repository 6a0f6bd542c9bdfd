// The generic (any machine model) paths of the plant, the controller and the tuning, run on the
// constant-parameter model with its closed form hidden (`linear: null`), against the closed-form
// fast paths: both agree to 1e-9. The reference is the rotor-frame voltage equation of Krause,
// Wasynczuk and Sudhoff (2002), Analysis of Electric Machinery and Drive Systems, ch. 5, which both
// paths implement (the fast path with constant Ld, Lq, psiM written out).
import { describe, expect, it } from 'vitest';
import { LinearDqModel } from '../src/core/machine/linear-dq';
import type { MachineModel } from '../src/core/machine/machine-model';
import type { DqMachine } from '../src/core/machine/dq-machine';
import { Plant, STATE_SIZE, loadSchedule } from '../src/core/simulation/plant';
import type { PlantParams } from '../src/core/simulation/plant';
import { CascadeController, stepSchedule, DEFAULT_CONTROLLER_OPTIONS } from '../src/core/control/controller';
import type { ControllerConfig } from '../src/core/control/controller';
import { tuneLoops } from '../src/core/control/tuning';
import { runSimulation } from '../src/core/simulation/simulate';
import { simulationFromProject } from '../src/core/project/simulation-from-project';
import { loadProjectText } from '../src/core/project/project';
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import type { SimulationSetup } from '../src/core/simulation/simulation-setup';

/** The linear model seen as a generic one: the same flux, no closed form. */
function hidden(m: DqMachine): MachineModel {
  const lin = new LinearDqModel(m);
  return {
    polePairs: lin.polePairs,
    Rs: lin.Rs,
    linear: null,
    flux: (id, iq, out) => lin.flux(id, iq, out),
    torque: (id, iq) => lin.torque(id, iq),
    steadyVoltage: (id, iq, we, out) => lin.steadyVoltage(id, iq, we, out),
    incrementalInductance: (id, iq, out) => lin.incrementalInductance(id, iq, out),
    current: (a, b, out) => lin.current(a, b, out),
  };
}

const ipm: DqMachine = { polePairs: 4, Rs: 0.05, Ld: 0.3e-3, Lq: 0.9e-3, psiM: 0.06 };
const close = (a: number, b: number, tol = 1e-9): void => expect(Math.abs(a - b)).toBeLessThanOrEqual(tol * Math.max(1, Math.abs(a), Math.abs(b)));

describe('plant: generic derivative (incremental-inductance Jacobian) against the closed form', () => {
  const params = (machine: PlantParams['machine']): PlantParams => ({
    machine, inertia: 2e-3, viscousFriction: 1e-4, coulombFriction: 0.02, load: loadSchedule([{ t_s: 0, torque_Nm: 1 }]),
    mechanics: 'free', inputFrame: 'alpha-beta', coulombWidth_rad_s: 1e-2,
    // the generic current-state path (a model without a closed form gets flux states by default)
    states: 'current',
  });
  it('single derivative evaluations agree to 1e-9 over states with both currents, speed and angle', () => {
    const fast = new Plant(params(ipm));
    const gen = new Plant(params(hidden(ipm)));
    const a = new Float64Array(STATE_SIZE);
    const b = new Float64Array(STATE_SIZE);
    for (const [id, iq, w, th] of [[0, 0, 0, 0], [-40, 80, 300, 1.2], [12, -25, -150, 4], [-100, 5, 600, 6.1]] as const) {
      for (const p of [fast, gen]) { p.input[0] = 20; p.input[1] = -7; p.setAngleOrigin(th - 0.1); }
      const y = Float64Array.from([id, iq, w, th, 0]);
      fast.derivInto(a, y, 0.01);
      gen.derivInto(b, y, 0.01);
      for (let i = 0; i < STATE_SIZE; i++) close(a[i]!, b[i]!);
    }
  });
  it('the generic path is the one taken without a closed form (torque and di/dt from the flux)', () => {
    const gen = new Plant(params(hidden(ipm)));
    expect(gen.model.linear).toBeNull();
    // T = 1.5 p iq (psiM + (Ld - Lq) id) = 1.5·4·80·(0.06 - 0.6e-3·(-40)) = 40.32 N·m
    expect(gen.torque(Float64Array.from([-40, 80, 0, 0, 0]))).toBeCloseTo(40.32, 9);
  });
});

describe('controller: generic feed-forward from the flux against the closed form', () => {
  const cfg = (machine: ControllerConfig['machine'], decoupling: boolean, bemf: boolean): ControllerConfig => ({
    ...DEFAULT_CONTROLLER_OPTIONS,
    mode: 'current-step', Ts: 1e-4, delaySamples: 1, machine,
    currentD: { Kp: 0.5, Ki: 50 }, currentQ: { Kp: 1.5, Ki: 50 }, speed: { Kp: 0, Ki: 0 },
    antiWindup: 'clamping', decoupling, backEmfFeedForward: bemf, delayAngleCompensation: true,
    Imax: 200, voltage: { shape: 'circle', radius: 1000, Vdc: 1732 }, table: null,
    speedRef: stepSchedule(0, []), torqueRef: stepSchedule(0, []),
    idRef: stepSchedule(-20, []), iqRef: stepSchedule(0, [{ t: 0, v: 60 }]), initialTorque: 0,
  });
  for (const [dec, bemf] of [[true, true], [true, false], [false, true]] as const) {
    it(`decoupling ${dec}, back-EMF ${bemf}: the same voltages over 50 periods, to 1e-9`, () => {
      const f = new CascadeController(cfg(ipm, dec, bemf));
      const g = new CascadeController(cfg(hidden(ipm), dec, bemf));
      f.reset(300, 0.4); g.reset(300, 0.4);
      const a = new Float64Array(2);
      const b = new Float64Array(2);
      for (let k = 0; k < 50; k++) {
        const t = k * 1e-4, id = -15 + 0.1 * k, iq = 0.9 * k, w = 300, th = 0.4 + 4 * 300 * t;
        f.step(t, id, iq, w, th, a);
        g.step(t, id, iq, w, th, b);
        close(a[0]!, b[0]!); close(a[1]!, b[1]!);
      }
    });
  }
});

describe('tuning: the current loop plant from the incremental inductance', () => {
  it('gains and margins of the hidden-closed-form model equal those of the constant dq terms', () => {
    const inp = { inertia: 2e-3, viscousFriction: 1e-4, fCtrl_Hz: 10000, delaySamples: 1, speedLoopDivider: 1, current: { bandwidth_Hz: 500 }, speed: { method: 'bandwidth', bandwidth_Hz: 50 } } as const;
    const a = tuneLoops({ ...inp, machine: ipm });
    const b = tuneLoops({ ...inp, machine: hidden(ipm) });
    // Harnefors and Nee (1998): Kp = L omega_c, Ki = R omega_c per axis
    expect(b.current.Kp).toBeCloseTo(0.3e-3 * 2 * Math.PI * 500, 12);
    expect(b.currentQ!.Kp).toBeCloseTo(0.9e-3 * 2 * Math.PI * 500, 12);
    expect(b.current.phaseMargin_deg).toBe(a.current.phaseMargin_deg);
    expect(b.speed.Kp).toBe(a.speed.Kp);
  });
});

describe('simulation: a short run on the generic paths against the fast paths', () => {
  it('speed, currents and energy agree to 1e-9 over 20 ms of the traction demo', () => {
    const j = JSON.parse(readFileSync(resolve(__dirname, '..', 'resources', 'demo-ipm-traction.json'), 'utf8'));
    const setup = simulationFromProject(loadProjectText(JSON.stringify(j)), { scenario: { duration_s: 0.02, speedSteps: [{ t_s: 0.001, speed_rpm: 3000 }] } });
    const m = hidden(setup.plant.machine);
    // the generic current-state path (a model without a closed form gets flux states by default)
    const gen: SimulationSetup<MachineModel> = { ...setup, plant: { ...setup.plant, machine: m, states: 'current' }, controller: { ...setup.controller, machine: m } };
    const a = runSimulation(setup, { maxPoints: 1000 });
    const b = runSimulation(gen, { maxPoints: 1000 });
    expect(a.stats.controlSteps).toBe(200);
    // the speed step asks for torque: the current is well away from zero
    expect(a.metrics.peakCurrent_A!).toBeGreaterThan(50);
    for (const n of ['speed_rpm', 'id_A', 'iq_A', 'torque_Nm', 'vd_V', 'vq_V'] as const) {
      const x = a.traces[n], y = b.traces[n];
      expect(y.length).toBe(x.length);
      for (let i = 0; i < x.length; i++) close(x[i]!, y[i]!, 1e-8);
    }
    close(a.metrics.energyFromBus_J!, b.metrics.energyFromBus_J!);
  });
});
