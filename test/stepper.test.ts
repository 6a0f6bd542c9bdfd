import { describe, expect, it } from 'vitest';
import { Plant, STATE_SIZE, loadSchedule } from '../src/core/simulation/plant';
import type { PlantParams } from '../src/core/simulation/plant';
import { CashKarpStepper, Rk4Stepper, errorFloors, makeStepper } from '../src/core/simulation/stepper';
import type { SimulationSetup } from '../src/core/simulation/simulation-setup';
import { DEFAULT_SOLVER_OPTIONS } from '../src/core/simulation/simulation-setup';

const m = { polePairs: 4, Rs: 0.5, Ld: 2e-3, Lq: 2e-3, psiM: 0.05 };
const params = (over: Partial<PlantParams> = {}): PlantParams => ({
  machine: m, inertia: 1e-3, viscousFriction: 0, coulombFriction: 0, load: loadSchedule(),
  mechanics: 'locked', inputFrame: 'dq', coulombWidth_rad_s: 1e-3, ...over,
});
const Ts = 1e-4;

describe('steppers: one control period in place', () => {
  it('RL step: i = V/R (1 - exp(-t R/L)) after 10 periods, Cash-Karp and RK4 (circuit theory, common practice (no source))', () => {
    const tau = m.Ld / m.Rs;
    const exact = (10 / m.Rs) * (1 - Math.exp(-10 * Ts / tau));
    const y1 = new Float64Array(STATE_SIZE);
    const p1 = new Plant(params());
    p1.input[0] = 10;
    const ck = new CashKarpStepper(p1, Ts, y1, 1e-10, new Float64Array([1e-6, 1e-6, 1e-3, 1, Infinity]));
    const y2 = new Float64Array(STATE_SIZE);
    const p2 = new Plant(params());
    p2.input[0] = 10;
    const rk = new Rk4Stepper(p2, Ts, 4);
    for (let k = 0; k < 10; k++) { ck.period(y1, k * Ts, (k + 1) * Ts); rk.period(y2, k * Ts, (k + 1) * Ts); }
    expect(y1[0]).toBeCloseTo(exact, 8);
    expect(y2[0]).toBeCloseTo(exact, 7);
    expect(p2.evaluations).toBe(10 * 4 * 4); // 4 steps of 4 stages per period
  });
  it('a load step inside a period splits it there: the speed ramps with the load only after it (Newton, second law: dw/dt = -T_L/J; common practice (no source))', () => {
    // J dw/dt = -T_L: the speed falls by T_L (t1 - t_step) / J over the period (Newton's second law)
    for (const make of [(p: Plant, y: Float64Array) => new CashKarpStepper(p, Ts, y, 1e-10, new Float64Array([1, 1, 1e-6, 1, Infinity])), (p: Plant) => new Rk4Stepper(p, Ts, 1)]) {
      const p = new Plant(params({ mechanics: 'free', load: loadSchedule([{ t_s: 0.25 * Ts, torque_Nm: 2 }]), machine: { ...m, psiM: 0 } }));
      const y = new Float64Array(STATE_SIZE);
      make(p, y).period(y, 0, Ts);
      expect(y[2]).toBeCloseTo((-2 * 0.75 * Ts) / 1e-3, 12);
    }
  });
  it('error floors from the setup; makeStepper picks the method', () => {
    const setup = { solver: DEFAULT_SOLVER_OPTIONS, Imax: 50, divergenceSpeed_rad_s: 3000, controller: { Ts } } as unknown as SimulationSetup;
    expect(Array.from(errorFloors(setup))).toEqual([0.05, 0.05, 1, 1, Infinity]);
    const p = new Plant(params());
    expect(makeStepper(setup, p, new Float64Array(STATE_SIZE))).toBeInstanceOf(CashKarpStepper);
    expect(makeStepper({ ...setup, solver: { ...DEFAULT_SOLVER_OPTIONS, method: 'rk4' } }, p, new Float64Array(STATE_SIZE))).toBeInstanceOf(Rk4Stepper);
  });
});
