/**
 * A flux-map motor resolved: the map's models at 20 °C, at the hot corner and at the cold corner
 * (winding resistance from the thermal scaling, psi_d shifted for the magnet temperature), the
 * apparent constant terms at zero current the displays show (psiM = psi_d(0, 0), Ld and Lq the
 * incremental inductances there), and the map's findings: the temperature shift, a map that is not
 * reciprocal, the apparent terms.
 */
import type { Conditions, DqMachine } from '../machine/dq-machine';
import type { Finding } from '../base/finding';
import type { MachineModel } from '../machine/machine-model';
import { fluxMapAt, type FluxMapData, type FluxMapModel } from '../machine/flux-map';
import { machineAt } from '../machine/thermal';
import { DEFAULT_TEMP_C } from './schema';
import { InputError } from '../base/errors';

/**
 * Largest |dpsid/diq - dpsiq/did| over the map, relative to the geometric mean of the incremental
 * inductances there, above which the map is said not to be reciprocal. A lossless magnetic field
 * has a co-energy whose mixed derivatives agree (dpsid/diq = dpsiq/did); 5 % leaves room for the
 * noise of a measured or meshed map. Common practice (no source).
 */
export const RECIPROCITY_TOLERANCE = 0.05;

/** The apparent constant terms of a model at zero current: psiM = psi_d(0, 0), Ld and Lq incremental there. */
export function apparentMachine(m: MachineModel): DqMachine {
  const f = new Float64Array(2), L = new Float64Array(4);
  m.flux(0, 0, f);
  m.incrementalInductance(0, 0, L);
  return { polePairs: m.polePairs, Rs: m.Rs, Ld: L[0]!, Lq: L[3]!, psiM: f[0]! };
}

/** The largest relative mismatch of the cross inductances, at the centre of every cell of the map as given, and where. */
export function reciprocityMismatch(m: FluxMapModel): { worst: number; id_A: number; iq_A: number } {
  const d = m.data;
  const L = new Float64Array(4);
  let worst = 0, wid = 0, wiq = 0;
  for (let i = 0; i + 1 < d.id_A.length; i++) {
    for (let j = 0; j + 1 < d.iq_A.length; j++) {
      const id = 0.5 * (d.id_A[i]! + d.id_A[i + 1]!), iq = 0.5 * (d.iq_A[j]! + d.iq_A[j + 1]!);
      m.incrementalInductance(id, iq, L);
      const scale = Math.sqrt(Math.abs(L[0]! * L[3]!));
      const r = scale > 0 ? Math.abs(L[1]! - L[2]!) / scale : 0;
      if (r > worst) { worst = r; wid = id; wiq = iq; }
    }
  }
  return { worst, id_A: wid, iq_A: wiq };
}

/** A map's model with its apparent terms at zero current attached (read for display, never by a solver: the model's `linear` stays null). */
export function withApparentTerms(m: FluxMapModel, a: DqMachine): MachineModel & DqMachine {
  return Object.assign(m, { Ld: a.Ld, Lq: a.Lq, psiM: a.psiM });
}

export interface FluxMapResolution {
  models: { at20: MachineModel & DqMachine; hot: MachineModel & DqMachine; cold: MachineModel & DqMachine };
  machine20: DqMachine;
  hot: DqMachine;
  cold: DqMachine;
  findings: Finding[];
}

const mWb = (x: number): string => `${Number((x * 1e3).toPrecision(4))} mWb`;
const mH = (x: number): string => `${Number((x * 1e3).toPrecision(4))} mH`;

/** The models and apparent terms of a flux-map motor at 20 °C, hot and cold, with its findings. */
export function resolveFluxMap(map: FluxMapData, polePairs: number, Rs20: number, c: Conditions): FluxMapResolution {
  // the winding's resistance follows the thermal scaling of the constant model (the flux terms are unused there)
  const rsOf = (windingTemp_C: number, magnetTemp_C: number): number => machineAt({ polePairs, Rs: Rs20, Ld: 1, Lq: 1, psiM: 1 }, windingTemp_C, magnetTemp_C, c.magnetTempCoeff).Rs;
  const at20 = fluxMapAt(map, polePairs, Rs20, DEFAULT_TEMP_C, c.magnetTempCoeff);
  const hot = fluxMapAt(map, polePairs, rsOf(c.windingTemp_C, c.magnetTemp_C), c.magnetTemp_C, c.magnetTempCoeff);
  const cold = fluxMapAt(map, polePairs, rsOf(c.coldTemp_C, c.coldTemp_C), c.coldTemp_C, c.magnetTempCoeff);
  const machine20 = apparentMachine(at20), hotM = apparentMachine(hot), coldM = apparentMachine(cold);
  if (!(machine20.psiM >= 0)) {
    throw new InputError('motor.fluxMap.psid_Wb', `gives psi_d = ${mWb(machine20.psiM)} at zero current (20 °C): the magnet's flux must point along +d (psi_d(0, 0) >= 0); check the sign of the d axis`);
  }
  const findings: Finding[] = [];
  const base = fluxMapAt(map, polePairs, Rs20, map.magnetTemp_C, c.magnetTempCoeff);
  const psi0 = apparentMachine(base).psiM;
  findings.push({
    code: 'flux-map-temperature', severity: 'info', field: 'motor.fluxMap.magnetTemp_C',
    message: `The flux map is at a magnet temperature of ${map.magnetTemp_C} °C. At other temperatures psi_d is shifted by the remanence coefficient (${c.magnetTempCoeff} /K) times psi_d(0, 0) = ${mWb(psi0)}: ` +
      `${mWb(hotM.psiM - psi0)} at the hot magnet (${c.magnetTemp_C} °C), ${mWb(coldM.psiM - psi0)} at the cold corner (${c.coldTemp_C} °C). ` +
      'An approximation: the rest of the map is kept as measured, though the iron saturates a little differently with a stronger or weaker magnet.',
  });
  const r = reciprocityMismatch(base);
  if (r.worst > RECIPROCITY_TOLERANCE) {
    findings.push({
      code: 'flux-map-not-reciprocal', severity: 'warning', field: 'motor.fluxMap',
      message: `The flux map is not reciprocal: dpsid/diq and dpsiq/did differ by up to ${Number((r.worst * 100).toPrecision(3))} % of the inductances (at id ${Number(r.id_A.toPrecision(4))} A, iq ${Number(r.iq_A.toPrecision(4))} A; tolerance ${RECIPROCITY_TOLERANCE * 100} %). ` +
        'A lossless magnetic field cannot give such a map, so a simulated closed current loop does not conserve energy; check how the map was measured or computed.',
    });
  }
  findings.push({
    code: 'flux-map-apparent-terms', severity: 'info', field: 'motor.fluxMap',
    message: `At zero current the map gives psiM ${mWb(machine20.psiM)} (20 °C), Ld ${mH(machine20.Ld)} and Lq ${mH(machine20.Lq)} (incremental): the constant terms shown for the motor. Every result is computed from the map.`,
  });
  return {
    models: { at20: withApparentTerms(at20, machine20), hot: withApparentTerms(hot, hotM), cold: withApparentTerms(cold, coldM) },
    machine20, hot: hotM, cold: coldM, findings,
  };
}

/** Apparent (psi / i, from the zero-current flux) and incremental (d psi / d i) inductances of one axis at one current, H. */
export interface AxisInductances {
  current_A: number;
  apparent_H: number;
  incremental_H: number;
}

/**
 * The d and q inductances of a model at zero current and at the peak current Ipk (A peak): d at
 * (-Ipk, 0), the field-weakening side, q at (0, Ipk). Apparent L_d = (psi_d(id, 0) - psi_d(0, 0)) / id,
 * L_q = psi_q(0, iq) / iq; at zero current the apparent inductance is the incremental one.
 */
export function mapInductances(m: MachineModel, Ipk: number): { d: AxisInductances[]; q: AxisInductances[] } {
  const f0 = new Float64Array(2), f = new Float64Array(2), L = new Float64Array(4);
  m.flux(0, 0, f0);
  m.incrementalInductance(0, 0, L);
  const d: AxisInductances[] = [{ current_A: 0, apparent_H: L[0]!, incremental_H: L[0]! }];
  const q: AxisInductances[] = [{ current_A: 0, apparent_H: L[3]!, incremental_H: L[3]! }];
  m.flux(-Ipk, 0, f);
  m.incrementalInductance(-Ipk, 0, L);
  d.push({ current_A: -Ipk, apparent_H: (f[0]! - f0[0]!) / -Ipk, incremental_H: L[0]! });
  m.flux(0, Ipk, f);
  m.incrementalInductance(0, Ipk, L);
  q.push({ current_A: Ipk, apparent_H: (f[1]! - f0[1]!) / Ipk, incremental_H: L[3]! });
  return { d, q };
}
