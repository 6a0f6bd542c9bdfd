import { describe, expect, it } from 'vitest';
import { LinearDqModel } from '../src/core/machine/linear-dq';
import { linearTemperatureModel } from '../src/core/machine/temperature-model';
import { machineAt } from '../src/core/machine/thermal';

const m20 = { polePairs: 4, Rs: 0.02, Ld: 2e-4, Lq: 5e-4, psiM: 0.06 };

describe('linearTemperatureModel', () => {
  it('re-tempered in place equals the model built at those temperatures (IEC 60028 copper coefficient; remanence coefficient from memory)', () => {
    const t = linearTemperatureModel(m20, -0.0012);
    const first = t.model;
    t.setTemperatures(120, 95);
    expect(t.model).toBe(first);
    const ref = new LinearDqModel(machineAt(m20, 120, 95, -0.0012));
    expect(t.model.Rs).toBeCloseTo(0.02 * (1 + 0.00393 * 100), 15);
    expect(t.model.linear!.psiM).toBeCloseTo(0.06 * (1 - 0.0012 * 75), 15);
    const a = new Float64Array(2), b = new Float64Array(2);
    t.model.steadyVoltage(-50, 120, 800, a);
    ref.steadyVoltage(-50, 120, 800, b);
    expect(a[0]).toBe(b[0]);
    expect(a[1]).toBe(b[1]);
    expect(t.model.torque(-50, 120)).toBe(ref.torque(-50, 120));
    t.setTemperatures(20, 20);
    expect(t.model.Rs).toBe(0.02);
    expect(t.model.torque(0, 100)).toBeCloseTo(1.5 * 4 * 0.06 * 100, 12);
  });
});
