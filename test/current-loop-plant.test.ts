import { describe, expect, it } from 'vitest';
import { currentLoopPlant } from '../src/core/control/current-loop-plant';
import type { MachineModel } from '../src/core/machine/machine-model';

// Harnefors and Nee (1998), "Model-based current control of AC machines using the internal model
// control method": the per-axis plant 1/(R + sL), L the incremental inductance at the operating point.
describe('current loop plant from the machine model', () => {
  it('the constant dq terms give Rs, Ld, Lq exactly', () => {
    expect(currentLoopPlant({ polePairs: 4, Rs: 0.05, Ld: 0.3e-3, Lq: 0.9e-3, psiM: 0.06 })).toEqual({ Rs: 0.05, Ld: 0.3e-3, Lq: 0.9e-3 });
  });
  it('a saturating model gives its incremental inductance at the asked current', () => {
    // psi_d = psiM + L0 id / (1 + |id|/I0): dpsi_d/did = L0 / (1 + |id|/I0)^2 (from memory: derivative of a rational function)
    const L0 = 1e-3, I0 = 100;
    const sat: MachineModel = {
      polePairs: 2, Rs: 0.1, linear: null,
      flux: (id, iq, o) => { o[0] = 0.05 + (L0 * id) / (1 + Math.abs(id) / I0); o[1] = 2e-3 * iq; },
      torque: () => 0,
      steadyVoltage: () => {},
      incrementalInductance: (id, _iq, o) => { o[0] = L0 / (1 + Math.abs(id) / I0) ** 2; o[1] = 0; o[2] = 0; o[3] = 2e-3; },
      current: () => {},
    };
    expect(currentLoopPlant(sat)).toEqual({ Rs: 0.1, Ld: 1e-3, Lq: 2e-3 });
    expect(currentLoopPlant(sat, 100, 0).Ld).toBeCloseTo(0.25e-3, 15);
  });
});
