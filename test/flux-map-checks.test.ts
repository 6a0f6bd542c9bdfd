import { describe, expect, it } from 'vitest';
import { FluxMapModel, type FluxMapData } from '../src/core/machine/flux-map';
import { apparentInductances, reciprocityError } from '../src/core/machine/flux-map-checks';
import { LinearDqModel } from '../src/core/machine/linear-dq';
import { INVENTED_IPM_SATURATION, SaturationModel } from '../src/core/machine/saturation-model';
import { evenGrid, sampleFluxMap } from '../src/core/machine/sample-flux-map';

// Vas (1993), Electrical Machines and Drives: A Space-Vector Theory Approach, ch. 6: a lossless magnetic
// field has psi = grad W'(i), so d psi_d/d i_q = d psi_q/d i_d; apparent and incremental inductances.
const sat = new SaturationModel(INVENTED_IPM_SATURATION, 4, 0.02);
const ids = evenGrid(-540, 540, 41), iqs = evenGrid(0, 540, 41);
const good = sampleFluxMap(sat, ids, iqs, 20);
const probe = evenGrid(-450, 300, 16), probeQ = evenGrid(-450, 450, 17);

describe('reciprocity of a flux map', () => {
  it('is about zero for a map of a reciprocal model (saturation model of Hinkkanen et al. (2017), IEEE Trans. Ind. Appl. 53(3))', () => {
    const e = reciprocityError(new FluxMapModel(good, 4, 0.02), probe, probeQ);
    expect(e).toBeLessThan(0.01);
    expect(reciprocityError(sat, probe, probeQ)).toBeLessThan(1e-12);
  });

  it('is clearly non-zero for a map that cannot come from a lossless field (psi_q given an extra term in id)', () => {
    // psi_q + k id iq / I: d psi_q/d i_d gains k iq / I, d psi_d/d i_q does not
    const bad: FluxMapData = { ...good, psiq_Wb: good.psiq_Wb.map((row, i) => row.map((v, j) => v + 0.1e-3 * ids[i]! * iqs[j]! / 450)) };
    const e = reciprocityError(new FluxMapModel(bad, 4, 0.02), probe, probeQ);
    expect(e).toBeGreaterThan(0.1);
  });
});

describe('apparent and incremental inductances', () => {
  it('equal Ld, Lq, psiM at any current for a constant-parameter map (common practice (no source))', () => {
    const lin = new LinearDqModel({ polePairs: 4, Rs: 0.02, Ld: 0.3e-3, Lq: 0.75e-3, psiM: 0.0645 });
    const fm = new FluxMapModel(sampleFluxMap(lin, ids, iqs, 20), 4, 0.02);
    for (const [id, iq] of [[0, 0], [-300, 336]] as const) {
      const a = apparentInductances(fm, id, iq);
      expect(a.psiM).toBeCloseTo(0.0645, 12);
      expect(a.Ld).toBeCloseTo(0.3e-3, 12);
      expect(a.Lq).toBeCloseTo(0.75e-3, 12);
      expect(a.incremental[0]).toBeCloseTo(0.3e-3, 12);
      expect(a.incremental[3]).toBeCloseTo(0.75e-3, 12);
    }
  });

  it('fall at the peak current on the saturating map: apparent Lq 30-50 % below its zero-current value, incremental below apparent', () => {
    const fm = new FluxMapModel(good, 4, 0.02);
    const z = apparentInductances(fm, 0, 0);
    const pk = apparentInductances(fm, 0, 450);
    expect(z.psiM).toBeCloseTo(0.0658, 4);
    const drop = 1 - pk.Lq / z.Lq;
    expect(drop).toBeGreaterThan(0.3);
    expect(drop).toBeLessThan(0.5);
    expect(pk.incremental[3]).toBeLessThan(pk.Lq);
    // the map's values against the model it was sampled from, at the peak current (interpolation error)
    const iq = Math.sqrt(450 ** 2 - 250 ** 2);
    const mp = apparentInductances(fm, -250, iq), ex = apparentInductances(sat, -250, iq);
    expect(Math.abs(mp.Lq - ex.Lq) / ex.Lq).toBeLessThan(1e-3);
    expect(Math.abs(mp.Ld - ex.Ld) / ex.Ld).toBeLessThan(1e-2);
  });
});
