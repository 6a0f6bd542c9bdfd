/**
 * A flux map sampled from any machine model on a given grid (the table a finite-element run or a
 * test bench would give): psid_Wb[i][j] = psi_d(id_A[i], iq_A[j]), likewise psi_q.
 */
import type { FluxMapData } from './flux-map';
import type { MachineModel } from './machine-model';

export function sampleFluxMap(model: MachineModel, id_A: readonly number[], iq_A: readonly number[], magnetTemp_C: number): FluxMapData {
  const f = new Float64Array(2);
  const psid_Wb: number[][] = [], psiq_Wb: number[][] = [];
  for (const id of id_A) {
    const rd: number[] = [], rq: number[] = [];
    for (const iq of iq_A) {
      model.flux(id, iq, f);
      rd.push(f[0]!);
      rq.push(f[1]!);
    }
    psid_Wb.push(rd);
    psiq_Wb.push(rq);
  }
  return { magnetTemp_C, id_A: [...id_A], iq_A: [...iq_A], psid_Wb, psiq_Wb };
}

/** n points from a to b, evenly spaced (a grid for sampleFluxMap). */
export function evenGrid(a: number, b: number, n: number): number[] {
  return Array.from({ length: n }, (_, k) => a + ((b - a) * k) / (n - 1));
}
