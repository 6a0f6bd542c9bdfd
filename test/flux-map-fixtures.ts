// Invented projects for the flux-map tests (not a test file itself): a constant-parameter
// interior-magnet motor and the same motor as a flux map tabulated from its constant terms.

export const CONST_MOTOR = { polePairs: 4, Rs: 0.015, Ld: 0.0003, Lq: 0.00075, psiM: 0.08, inertia: 0.045, viscousFriction: 0.002, coulombFriction: 0.3, maxSpeed_rpm: 12000 };

/** A grid from lo to hi, denser near zero (not uniform, as maps from a bench often are). */
export function grid(lo: number, hi: number, n: number): number[] {
  const out: number[] = [];
  for (let k = 0; k < n; k++) {
    const u = -1 + (2 * k) / (n - 1);
    const s = Math.sign(u) * Math.pow(Math.abs(u), 1.3);
    out.push(lo + ((s + 1) / 2) * (hi - lo));
  }
  return out;
}

/** The map psi_d = Ld id + psiM, psi_q = Lq iq on a grid, as the project file writes it. */
export function tabulate(m: { Ld: number; Lq: number; psiM: number }, id_A: number[], iq_A: number[], magnetTemp_C = 20) {
  return {
    magnetTemp_C,
    id_A,
    iq_A,
    psid_Wb: id_A.map((id) => iq_A.map(() => m.Ld * id + m.psiM)),
    psiq_Wb: id_A.map(() => iq_A.map((iq) => m.Lq * iq)),
  };
}

export function constProject(): Record<string, any> {
  return {
    format: 'torquewise-project', version: 1, name: 'invented IPM, constant terms',
    motor: { ...CONST_MOTOR },
    inverter: { Vdc: 350, Imax: 450, Icont: 226, modulation: 'svpwm', voltageUtilization: 0.95, deviceDrop: 1 },
    conditions: { windingTemp_C: 140, magnetTemp_C: 120, coldTemp_C: -20, magnetTempCoeff: -0.0012 },
    requirements: [
      { label: 'launch', speed_rpm: 1000, torque_Nm: 150 },
      { label: 'cruise', speed_rpm: 6000, torque_Nm: 40 },
      { label: 'top', speed_rpm: 11000, torque_Nm: 15, duty: 'continuous' },
    ],
  };
}

/** The same project with the motor as a map (iq >= 0 mirrored, or the full plane). */
export function mapProject(full = false): Record<string, any> {
  const p = constProject();
  const { Ld, Lq, psiM, ...rest } = p.motor;
  const iq = full ? grid(-500, 500, 41) : grid(-500, 500, 41).filter((x) => x >= 0);
  p.motor = { ...rest, fluxMap: tabulate({ Ld, Lq, psiM }, grid(-500, 500, 41), iq) };
  p.name = 'invented IPM, flux map';
  return p;
}
