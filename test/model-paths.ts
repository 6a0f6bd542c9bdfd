// Shared by the tests of the steady-state numeric paths (not a test file itself): the three demos'
// hot machines, an invented surface-magnet machine (Ld = Lq), and the same linear machine seen as a
// model that does not say it is linear (linear: null), so every solver takes its generic numeric path.
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { expect } from 'vitest';
import type { DqMachine } from '../src/core/machine/dq-machine';
import type { DriveLimits } from '../src/core/drive/inverter-spec';
import type { MachineModel } from '../src/core/machine/machine-model';
import { LinearDqModel } from '../src/core/machine/linear-dq';
import { loadProjectText } from '../src/core/project/project';

export interface Case { name: string; m: DqMachine; lim: DriveLimits }

/** The hot machine and peak limits of each demo file in resources/. */
export function demoCases(): Case[] {
  return ['demo-spm-48v', 'demo-servo-axis', 'demo-ipm-traction'].map((n) => {
    const p = loadProjectText(readFileSync(fileURLToPath(new URL(`../resources/${n}.json`, import.meta.url)), 'utf8'));
    return { name: n, m: p.hot, lim: p.peak };
  });
}

/** An invented surface-magnet machine (Ld = Lq), not a product's data. */
export const SPM_CASE: Case = { name: 'invented SPM', m: { polePairs: 5, Rs: 0.08, Ld: 0.35e-3, Lq: 0.35e-3, psiM: 0.03 }, lim: { Vmax: 48 / Math.sqrt(3), Imax: 60 } };

/** The same machine as a model that hides its constant terms: the solvers take the numeric paths. */
export function numericOnly(m: DqMachine): MachineModel {
  const lin = new LinearDqModel(m);
  return {
    polePairs: m.polePairs, Rs: m.Rs, linear: null,
    flux: (id, iq, out) => lin.flux(id, iq, out),
    torque: (id, iq) => lin.torque(id, iq),
    steadyVoltage: (id, iq, we, out) => lin.steadyVoltage(id, iq, we, out),
    incrementalInductance: (id, iq, out) => lin.incrementalInductance(id, iq, out),
    current: (psid, psiq, out) => lin.current(psid, psiq, out),
  };
}

/** |a - b| <= tol · max(|b|, scale): agreement relative to the value or to the problem's scale. */
export function expectClose(a: number, b: number, scale: number, tol = 1e-9): void {
  const err = Math.abs(a - b) / Math.max(Math.abs(b), scale);
  if (!(err <= tol)) expect.fail(`${a} vs ${b}: relative difference ${err} > ${tol} (scale ${scale})`);
}
