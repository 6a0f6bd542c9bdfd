import { describe, expect, it } from 'vitest';
import ode45 from 'ode45-cash-karp';
import { createRequire } from 'node:module';
import { Plant, STATE_SIZE, loadSchedule, loadLevel, nextLoadBreak, coulombWidth } from '../src/core/simulation/plant';
import type { PlantParams } from '../src/core/simulation/plant';
import type { DqMachine } from '../src/core/machine/dq-machine';
import { solveOperatingPoint } from '../src/core/steady-state/operating-point';
import { InputError } from '../src/core/base/errors';

// odex ships its TypeScript source, which the project's strict type-check would then compile;
// load it at run time with a local type instead
interface OdexSolver {
  absoluteTolerance: number;
  relativeTolerance: number;
  maxSteps: number;
  solve(f: (x: number, y: number[]) => number[], x0: number, y0: number[], x1: number): { y: number[] };
}
const { Solver } = createRequire(import.meta.url)('odex') as { Solver: new (n: number) => OdexSolver };

const spm: DqMachine = { polePairs: 4, Rs: 0.5, Ld: 2e-3, Lq: 2e-3, psiM: 0.05 };
const ipm: DqMachine = { polePairs: 4, Rs: 0.05, Ld: 0.3e-3, Lq: 0.9e-3, psiM: 0.06 };

function params(m: DqMachine, over: Partial<PlantParams> = {}): PlantParams {
  return {
    machine: m, inertia: 1e-3, viscousFriction: 0, coulombFriction: 0, load: loadSchedule(),
    mechanics: 'free', inputFrame: 'dq', coulombWidth_rad_s: 1e-3, ...over,
  };
}

/** integrate the plant from y over [0, T] with ode45-cash-karp at a tight tolerance */
function integrate(plant: Plant, y: Float64Array, T: number, tol = 1e-10): Float64Array {
  const integ = ode45(y, plant.deriv as never, 0, T / 1000, { tol, dtMaxMag: T / 200, verbose: false });
  for (let g = 0; g < 1e6 && integ.step(T); g++);
  return y;
}

describe('dq plant', () => {
  it('locked-rotor RL step follows i = V/R (1 - exp(-t R / L))', () => {
    // circuit theory: first-order RL circuit driven by a voltage step
    const plant = new Plant(params(spm, { mechanics: 'locked' }));
    plant.input[0] = 10; // v_d, V
    const tau = spm.Ld / spm.Rs;
    for (const t of [0.2 * tau, tau, 3 * tau]) {
      const y = integrate(plant, new Float64Array(STATE_SIZE), t);
      const expected = (10 / spm.Rs) * (1 - Math.exp(-t / tau));
      expect(y[0]).toBeCloseTo(expected, 6);
      expect(y[1]).toBeCloseTo(0, 9);
      expect(y[2]).toBe(0);
    }
  });

  it('constant dq voltages at a held speed settle on the operating-point solver\'s currents', () => {
    // the engine's steady-state solution (operating-point.ts) is the fixed point of the same dq equations
    for (const m of [spm, ipm]) {
      const w = 200; // rad/s mechanical
      const op = solveOperatingPoint(m, { Vmax: 1e4, Imax: 1e4 }, w, 3);
      const plant = new Plant(params(m, { mechanics: 'locked' }));
      plant.input[0] = op.vd;
      plant.input[1] = op.vq;
      const y = new Float64Array(STATE_SIZE);
      y[2] = w;
      integrate(plant, y, 40 * Math.max(m.Ld, m.Lq) / m.Rs);
      expect(y[0]).toBeCloseTo(op.id, 4);
      expect(y[1]).toBeCloseTo(op.iq, 4);
      expect(plant.torque(y)).toBeCloseTo(3, 4);
    }
  });

  it('matches an independent solver (odex, Gragg-Bulirsch-Stoer) on an open-loop run-up', () => {
    // independent reference: Hairer and Wanner's ODEX extrapolation method, as ported to the npm package odex
    const pp = params(ipm, { viscousFriction: 1e-3, coulombFriction: 0.05, coulombWidth_rad_s: 0.5, load: loadSchedule([], [], 1e-5) });
    const plant = new Plant(pp);
    plant.input[0] = -2;
    plant.input[1] = 12;
    const T = 0.05;
    const y = integrate(plant, new Float64Array(STATE_SIZE), T, 1e-12);
    const s = new Solver(STATE_SIZE);
    s.absoluteTolerance = 1e-12;
    s.relativeTolerance = 1e-12;
    s.maxSteps = 1e6;
    const d = new Float64Array(STATE_SIZE);
    const f = (t: number, yy: number[]): number[] => {
      plant.deriv(d, Float64Array.from(yy), t);
      return Array.from(d);
    };
    const ref = s.solve(f, 0, new Array(STATE_SIZE).fill(0), T).y;
    for (let i = 0; i < 4; i++) expect(Math.abs(y[i]! - ref[i]!)).toBeLessThan(1e-7 * Math.max(1, Math.abs(ref[i]!)));
    expect(ref[2]).toBeGreaterThan(10); // it did run up
  });

  it('with Rs = 0 and no friction the bus energy equals kinetic plus magnetic energy', () => {
    // energy conservation of the lossless dq model: E = J w^2/2 + 1.5 (Ld id^2 + Lq iq^2)/2 (from memory)
    const m = { ...ipm, Rs: 0 };
    const plant = new Plant(params(m, { inertia: 2e-3 }));
    plant.input[0] = -3;
    plant.input[1] = 8;
    const y = integrate(plant, new Float64Array(STATE_SIZE), 0.02, 1e-12);
    const E = 0.5 * 2e-3 * y[2]! ** 2 + 0.75 * (m.Ld * y[0]! ** 2 + m.Lq * y[1]! ** 2);
    expect(y[4]).toBeCloseTo(E, 6);
  });

  it('rotates an alpha-beta input into dq with the rotor angle', () => {
    const plant = new Plant(params(spm, { inputFrame: 'alpha-beta', mechanics: 'locked' }));
    plant.input[0] = 0;
    plant.input[1] = 5; // along beta
    const y = new Float64Array(STATE_SIZE);
    y[3] = Math.PI / 2; // d axis on beta
    const d = new Float64Array(STATE_SIZE);
    plant.deriv(d, y, 0);
    expect(d[0]).toBeCloseTo(5 / spm.Ld, 9); // all of it on d
    expect(d[1]).toBeCloseTo(0, 6);
  });

  it('the rotation from an angle origin and a series equals Math.cos/Math.sin', () => {
    const a = new Plant(params(ipm, { inputFrame: 'alpha-beta' }));
    const b = new Plant(params(ipm, { inputFrame: 'alpha-beta' }));
    for (const p of [a, b]) { p.input[0] = 40; p.input[1] = -25; }
    const y = Float64Array.from([3, -7, 150, 0, 0]);
    const da = new Float64Array(STATE_SIZE);
    const db = new Float64Array(STATE_SIZE);
    for (const th0 of [0.1, 2, 5.9]) {
      for (const off of [-0.49, -0.2, 0, 0.3, 0.49]) {
        y[3] = th0 + off;
        a.setAngleOrigin(th0); // series path
        b.setAngleOrigin(th0 + 10); // far away: Math.cos / Math.sin path
        a.deriv(da, y, 0);
        b.deriv(db, y, 0);
        for (let i = 0; i < STATE_SIZE; i++) expect(Math.abs(da[i]! - db[i]!)).toBeLessThanOrEqual(1e-12 * Math.max(1, Math.abs(db[i]!)));
      }
    }
  });

  it('load schedule: steps jump, ramps are linear, a later event overrides', () => {
    const s = loadSchedule([{ t_s: 0.1, torque_Nm: 5 }, { t_s: 0.5, torque_Nm: 0 }], [{ t_s: 0.2, duration_s: 0.2, torque_Nm: 9 }]);
    expect(loadLevel(s, 0.05)).toBe(0);
    expect(loadLevel(s, 0.1)).toBe(5);
    expect(loadLevel(s, 0.3)).toBeCloseTo(7, 12);
    expect(loadLevel(s, 0.45)).toBe(9);
    expect(loadLevel(s, 0.6)).toBe(0);
    expect(nextLoadBreak(s, 0.15)).toBeCloseTo(0.2, 12);
    const plant = new Plant(params(spm, { load: loadSchedule([], [], 2e-4) }));
    expect(plant.loadTorque(0, -100)).toBeCloseTo(-2, 12); // fan load opposes the motion
    expect(() => loadSchedule([], [{ t_s: 0, duration_s: 0, torque_Nm: 1 }])).toThrow(InputError);
  });

  it('Coulomb width keeps the friction slope non-stiff at the period', () => {
    const w = coulombWidth(0.3, 1e-3, 1e-4);
    expect((0.3 / (1e-3 * w)) * 1e-4).toBeLessThanOrEqual(0.5 + 1e-12);
    expect(coulombWidth(0, 1, 1e-4)).toBe(1e-3);
  });

  it('rejects a non-physical machine with the field named', () => {
    expect(() => new Plant(params({ ...spm, Ld: 0 }))).toThrow(/motor.Ld must be > 0 H/);
    expect(() => new Plant(params(spm, { inertia: 0 }))).toThrow(/inertia/);
  });
});
