import { describe, expect, it } from 'vitest';
import { LinearDqModel } from '../src/core/machine/linear-dq';
import { evenGrid, sampleFluxMap } from '../src/core/machine/sample-flux-map';

describe('sampling a machine model into a flux map', () => {
  it('tabulates psi_d = Ld id + psiM and psi_q = Lq iq of a constant-parameter model (Krause, Wasynczuk and Sudhoff (2002), ch. 5)', () => {
    const lin = new LinearDqModel({ polePairs: 4, Rs: 0.02, Ld: 0.3e-3, Lq: 0.75e-3, psiM: 0.0645 });
    const d = sampleFluxMap(lin, evenGrid(-500, 500, 5), evenGrid(0, 400, 3), 20);
    expect(d.id_A).toEqual([-500, -250, 0, 250, 500]);
    expect(d.iq_A).toEqual([0, 200, 400]);
    expect(d.magnetTemp_C).toBe(20);
    expect(d.psid_Wb[1]![2]).toBeCloseTo(0.3e-3 * -250 + 0.0645, 15);
    expect(d.psiq_Wb[4]![1]).toBeCloseTo(0.75e-3 * 200, 15);
    expect(d.psid_Wb.length).toBe(5);
    expect(d.psiq_Wb[0]!.length).toBe(3);
  });
});
