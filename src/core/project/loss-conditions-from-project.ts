/**
 * The loss solvers' conditions of a project: the bus voltage, the machine's friction and the file's
 * `losses` section (defaults from the schema; an absent part is a zero loss). The switching test's
 * reference point (Vref_V, Iref_A, fsw_Hz) is required by the schema whenever a switching energy is
 * above 0; when both energies are 0 it scales nothing, and is passed as 1 V, 1 A and 0 Hz.
 */
import type { LossConditions } from '../steady-state/point-losses';
import type { ResolvedProject } from './project';

export function lossConditionsFromProject(p: ResolvedProject): LossConditions {
  const l = p.losses;
  const inv = l.inverter;
  return {
    Vdc: p.inverter.Vdc,
    friction: { B: p.mechanics.viscousFriction, Tc: p.mechanics.coulombFriction },
    losses: {
      ...(l.iron ? { iron: { kh: l.iron.kh, beta: l.iron.beta, ke: l.iron.ke } } : {}),
      ...(l.windage ? { windage: { kw: l.windage.kw } } : {}),
      ...(inv
        ? {
            inverter: {
              Vce0: inv.Vce0, rce: inv.rce, Vf0: inv.Vf0, rd: inv.rd, EonEoff_J: inv.EonEoff_J, Err_J: inv.Err_J,
              Vref_V: inv.Vref_V ?? 1, Iref_A: inv.Iref_A ?? 1, fsw_Hz: inv.fsw_Hz ?? 0,
            },
          }
        : {}),
    },
  };
}
