// Invented projects for the tolerance tests (not a test file itself).
import { parseProject, type ProjectFile } from '../src/core/project/schema';

/**
 * A surface-magnet motor (Ld = Lq) at 20 °C everywhere, with a generous bus and one point at low
 * speed: its torque within the current limit is 3/2 p psiM Imax, linear in psiM and in Imax.
 */
export function linearSpm(tolerances?: Record<string, unknown>, torque_Nm = 10): Record<string, any> {
  return {
    format: 'torquewise-project',
    version: 1,
    name: 'linear SPM (invented)',
    motor: { polePairs: 4, Rs: 0.05, Ld: 1e-4, Lq: 1e-4, psiM: 0.02, inertia: 1e-3 },
    inverter: { Vdc: 400, Imax: 100, Icont: 50, modulation: 'svpwm' },
    requirements: [{ label: 'low-speed thrust', speed_rpm: 100, torque_Nm }],
    ...(tolerances !== undefined ? { tolerances } : {}),
  };
}

export const parsed = (j: Record<string, any>): ProjectFile => parseProject(j);
