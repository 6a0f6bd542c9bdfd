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
