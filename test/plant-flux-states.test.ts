// The plant with flux linkages as states (src/core/simulation/plant.ts, `states: 'flux'`): the
// rotor-frame voltage equation d psi/dt = v - Rs i - we J psi of Krause, Wasynczuk and Sudhoff
// (2002), Analysis of Electric Machinery and Drive Systems, ch. 5, against the constant-parameter
// closed form (the current-state fast path) that writes the same equation with psi = L i + psiM.
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { Plant, STATE_SIZE, loadSchedule, plantStates } from '../src/core/simulation/plant';
import type { PlantParams } from '../src/core/simulation/plant';
import type { DqMachine } from '../src/core/machine/dq-machine';
import type { MachineModel } from '../src/core/machine/machine-model';
import { LinearDqModel } from '../src/core/machine/linear-dq';
import { FluxMapModel, type FluxMapData } from '../src/core/machine/flux-map';
import { runSimulation } from '../src/core/simulation/simulate';
import { errorFloors, CashKarpStepper } from '../src/core/simulation/stepper';
import { simulationFromProject } from '../src/core/project/simulation-from-project';
import { loadProjectText } from '../src/core/project/project';
import type { SimulationSetup } from '../src/core/simulation/simulation-setup';

const ipm: DqMachine = { polePairs: 4, Rs: 0.05, Ld: 0.3e-3, Lq: 0.9e-3, psiM: 0.06 };

/** The constant machine tabulated on an n x n grid over |id|, |iq| <= span (A peak): a flux map. */
function tabulated(m: DqMachine, span: number, n = 41): FluxMapData {
  const g = Array.from({ length: n }, (_, k) => -span + (2 * span * k) / (n - 1));
  return {
    magnetTemp_C: 20, id_A: g, iq_A: g,
    psid_Wb: g.map((id) => g.map(() => m.Ld * id + m.psiM)),
    psiq_Wb: g.map(() => g.map((iq) => m.Lq * iq)),
  };
}

const params = (machine: PlantParams['machine'], states?: 'current' | 'flux'): PlantParams => ({
  machine, inertia: 2e-3, viscousFriction: 1e-4, coulombFriction: 0.02, load: loadSchedule([{ t_s: 0, torque_Nm: 1 }]),
  mechanics: 'free', inputFrame: 'alpha-beta', coulombWidth_rad_s: 1e-2, ...(states ? { states } : {}),
});

describe('flux-state plant', () => {
  it('a model without a closed form gets flux states; the linear model keeps its current states', () => {
    const map = new FluxMapModel(tabulated(ipm, 200), ipm.polePairs, ipm.Rs);
    expect(plantStates(params(ipm))).toBe('current');
    expect(plantStates(params(map))).toBe('flux');
    expect(new Plant(params(map)).fluxStates).toBe(true);
    expect(new Plant(params(ipm)).fluxStates).toBe(false);
  });

  it('d psi/dt equals L di/dt of the closed form, the other derivatives equal, to 1e-9', () => {
    // psi_d = Ld id + psiM, psi_q = Lq iq (Krause et al. 2002, ch. 5): d psi/dt = diag(Ld, Lq) di/dt
    const fast = new Plant(params(ipm));
    const flux = new Plant(params(new LinearDqModel(ipm), 'flux'));
    const a = new Float64Array(STATE_SIZE), b = new Float64Array(STATE_SIZE);
    for (const [id, iq, w, th] of [[0, 0, 0, 0], [-40, 80, 300, 1.2], [12, -25, -150, 4], [-100, 5, 600, 6.1]] as const) {
      for (const p of [fast, flux]) { p.input[0] = 20; p.input[1] = -7; p.setAngleOrigin(th - 0.1); }
      const yi = Float64Array.from([id, iq, w, th, 0]);
      const yp = Float64Array.from(yi);
      flux.setCurrents(yp, id, iq);
      expect(yp[0]).toBeCloseTo(ipm.Ld * id + ipm.psiM, 14);
      fast.derivInto(a, yi, 0.01);
      flux.derivInto(b, yp, 0.01);
      const close = (x: number, y: number): void => expect(Math.abs(x - y)).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(x)));
      close(b[0]!, ipm.Ld * a[0]!);
      close(b[1]!, ipm.Lq * a[1]!);
      for (let i = 2; i < STATE_SIZE; i++) close(b[i]!, a[i]!);
      // the state as the simulator reads it: the currents back
      const back = new Float64Array(STATE_SIZE);
      flux.currentState(yp, back);
      close(back[0]!, id); close(back[1]!, iq);
      close(flux.torque(yp), fast.torque(yi));
    }
  });

  it('flux floors are the current floor through the flux swing over ±Imax (Ld·Imax, Lq·Imax for a linear model)', () => {
    // common practice (no source): an absolute floor in the units of the state
    const setup = { solver: { currentFloor: 1e-3, speedFloor: 1e-3, angleFloor: 1 }, Imax: 50, divergenceSpeed_rad_s: 3000 } as unknown as SimulationSetup;
    const f = errorFloors(setup, new LinearDqModel(ipm));
    expect(f[0]).toBeCloseTo(1e-3 * ipm.Ld * 50, 15);
    expect(f[1]).toBeCloseTo(1e-3 * ipm.Lq * 50, 15);
    expect(Array.from(f.slice(2))).toEqual([1, 1, Infinity]);
  });
});

describe('flux-state run on a map tabulated from the constant machine against the fast path', () => {
  const j = JSON.parse(readFileSync(resolve(__dirname, '..', 'resources', 'demo-ipm-traction.json'), 'utf8'));
  const base = simulationFromProject(loadProjectText(JSON.stringify(j)), { scenario: { duration_s: 0.02, speedSteps: [{ t_s: 0.001, speed_rpm: 3000 }] } });
  const m = base.plant.machine;
  const mapped = (): SimulationSetup<MachineModel> => {
    const map = new FluxMapModel(tabulated(m, 1.5 * base.Imax), m.polePairs, m.Rs);
    return { ...base, plant: { ...base.plant, machine: map }, controller: { ...base.controller, machine: map } };
  };
  const compare = (a: ReturnType<typeof runSimulation>, b: ReturnType<typeof runSimulation>, tol: number): number => {
    let worst = 0;
    for (const n of ['speed_rpm', 'id_A', 'iq_A', 'torque_Nm', 'vd_V', 'vq_V'] as const) {
      const x = a.traces[n], y = b.traces[n];
      expect(y.length).toBe(x.length);
      let scale = 1;
      for (let i = 0; i < x.length; i++) scale = Math.max(scale, Math.abs(x[i]!));
      for (let i = 0; i < x.length; i++) worst = Math.max(worst, Math.abs(x[i]! - y[i]!) / scale);
    }
    expect(worst).toBeLessThanOrEqual(tol);
    return worst;
  };

  it('Cash-Karp: traces and energy agree to 1e-9 (measured: round-off, 4e-15)', () => {
    // Why this close and no closer: a map of an affine flux is interpolated exactly up to round-off
    // (bilinear here; a C1 piecewise cubic reproduces affine data too), the inverse converges to
    // 1e-13, and at this tolerance the adaptive integrator takes one step per period on both state
    // sets, so only round-off separates them. For a map of a real machine the interpolation error
    // (not this check) sets the difference; 1e-9 leaves room for an interpolant that is exact on
    // affine data only to its own round-off, and for another step choice of the error control.
    const a = runSimulation(base, { maxPoints: 1000 });
    const b = runSimulation(mapped(), { maxPoints: 1000 });
    expect(a.stats.controlSteps).toBe(200);
    expect(a.metrics.peakCurrent_A!).toBeGreaterThan(50);
    compare(a, b, 1e-9);
    expect(Math.abs(a.metrics.energyFromBus_J! - b.metrics.energyFromBus_J!)).toBeLessThanOrEqual(1e-9 * Math.abs(a.metrics.energyFromBus_J!));
  });

  it('RK4: classical Runge-Kutta is invariant under the affine change of variables psi = L i + psiM, so both agree to 1e-9', () => {
    // Butcher (2016), Numerical Methods for Ordinary Differential Equations: Runge-Kutta methods
    // commute with affine transformations of the state.
    const rk4 = { ...base.solver, method: 'rk4' as const, rk4Substeps: 4 };
    const a = runSimulation({ ...base, solver: rk4 }, { maxPoints: 1000 });
    const b = runSimulation({ ...mapped(), solver: rk4 }, { maxPoints: 1000 });
    compare(a, b, 1e-9);
  });
});

describe('a step into saturation: flux states against the current-state generic path', () => {
  // An invented saturating q axis in closed form: psi_q = Lq0 I0 asinh(iq/I0) (L_qq = Lq0/sqrt(1 + (iq/I0)²)),
  // psi_d = Ld id + psiM; its inverse iq = I0 sinh(psi_q/(Lq0 I0)) exactly. Both plant formulations
  // integrate the same voltage equation (Krause et al. 2002, ch. 5), one through L_inc di/dt, one
  // through d psi/dt; at a tight tolerance they agree to the integrator's accuracy.
  const LQ0 = 0.9e-3, I0 = 60;
  const sat: MachineModel = {
    polePairs: 4, Rs: 0.05, linear: null,
    flux: (id, iq, o) => { o[0] = ipm.Ld * id + ipm.psiM; o[1] = LQ0 * I0 * Math.asinh(iq / I0); },
    torque: (id, iq) => 1.5 * 4 * ((ipm.Ld * id + ipm.psiM) * iq - LQ0 * I0 * Math.asinh(iq / I0) * id),
    steadyVoltage: () => { throw new Error('not used'); },
    incrementalInductance: (_id, iq, o) => { o[0] = ipm.Ld; o[1] = 0; o[2] = 0; o[3] = LQ0 / Math.sqrt(1 + (iq / I0) ** 2); },
    current: (pd, pq, o) => { o[0] = (pd - ipm.psiM) / ipm.Ld; o[1] = I0 * Math.sinh(pq / (LQ0 * I0)); },
  };
  it('a q voltage step driving iq to 4x the saturation current at speed: currents and energy agree to 1e-9 of their scale (measured 5e-13)', () => {
    const run = (states: 'current' | 'flux'): Float64Array[] => {
      const plant = new Plant({ ...params(sat, states), inputFrame: 'dq', mechanics: 'locked' });
      plant.input[0] = 0; plant.input[1] = 25;
      const y = new Float64Array(STATE_SIZE);
      plant.setCurrents(y, 0, 0);
      y[2] = 5;
      const Ts = 1e-4;
      const st = new CashKarpStepper(plant, Ts, y, 1e-12, Float64Array.from([1e-9, 1e-9, 1e-9, 1, Infinity]));
      const out: Float64Array[] = [];
      for (let k = 0; k < 100; k++) {
        st.period(y, k * Ts, (k + 1) * Ts);
        const yi = new Float64Array(STATE_SIZE);
        plant.currentState(y, yi);
        out.push(yi);
      }
      return out;
    };
    const a = run('current'), b = run('flux');
    let peak = 0, worst = 0;
    for (const r of a) peak = Math.max(peak, Math.hypot(r[0]!, r[1]!));
    for (let k = 0; k < a.length; k++) for (const i of [0, 1, 4]) worst = Math.max(worst, Math.abs(a[k]![i]! - b[k]![i]!) / (i === 4 ? Math.abs(a[a.length - 1]![4]!) : peak));
    expect(a[a.length - 1]![1]!).toBeGreaterThan(4 * I0);
    expect(worst).toBeLessThan(1e-9);
  });
});
