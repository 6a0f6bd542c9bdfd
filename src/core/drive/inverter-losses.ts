/**
 * Semiconductor losses of a three-phase two-level voltage-source inverter with sinusoidal PWM and
 * sinusoidal phase currents i = I cos(theta - phi), per switch position (one transistor and its
 * antiparallel diode) and for the bridge (six positions).
 *
 * Conduction, with the duty of the upper switch d = (1 + m cos theta) / 2 averaged over a period
 * (Kolar, Ertl and Zach (1991), "Influence of the modulation method on the conduction and switching
 * losses of a PWM converter system", IEEE Trans. Ind. Appl. 27(6); the same forms in Graovac and
 * Pürschel (2009), "IGBT power losses calculation using the data-sheet parameters", Infineon
 * application note): the transistor carries i d while i > 0, the diode of the same position the
 * other half wave, so with the on-state lines v = Vce0 + rce i and v = Vf0 + rd i
 *
 *   P_T = Vce0 I (1/(2 pi) + m cos(phi)/8) + rce I^2 (1/8 + m cos(phi)/(3 pi))
 *   P_D = Vf0  I (1/(2 pi) - m cos(phi)/8) + rd  I^2 (1/8 - m cos(phi)/(3 pi))
 *
 * (the integrals hold for any phi, so generating, cos(phi) < 0, moves loss from transistor to diode).
 * Switching, energies scaled linearly in current and voltage from the datasheet point (Vref, Iref)
 * and averaged over the half wave in which the position switches current:
 *
 *   P_sw = fsw (Eon + Eoff) / pi (I / Iref)(Vdc / Vref),   P_rr = fsw Err / pi (I / Iref)(Vdc / Vref)
 *
 * A space-vector (third-harmonic) zero sequence changes the rce/rd terms by a few per cent at most
 * (Kolar et al. 1991); it is neglected here: the sinusoidal-PWM forms are used for every modulation.
 *
 * MOSFET (a device with Vce0 = 0, `rce` only): synchronous rectification. The channel conducts in
 * reverse during the diode interval too, so the whole half wave's current flows through rce and the
 * body diode conducts only in the dead time, which is neglected: P_T = rce I^2 / 4 (the sum of the two
 * rce-type terms), P_D = 0. The body diode's reverse recovery (Err) after each dead time is kept.
 */

/** The devices of one switch position (the project file's `losses.inverter`, same keys). */
export interface InverterLossSpec {
  /** transistor threshold (on-state) voltage, V; 0 = a MOSFET (synchronous rectification) */
  Vce0: number;
  /** transistor on-state slope resistance, ohm */
  rce: number;
  /** diode threshold voltage, V */
  Vf0: number;
  /** diode slope resistance, ohm */
  rd: number;
  /** turn-on plus turn-off energy of the transistor at (Vref_V, Iref_A), J */
  EonEoff_J: number;
  /** diode reverse-recovery energy at (Vref_V, Iref_A), J */
  Err_J: number;
  /** DC voltage of the datasheet switching test, V */
  Vref_V: number;
  /** current of the datasheet switching test, A */
  Iref_A: number;
  /** switching frequency, Hz */
  fsw_Hz: number;
}

/** Losses of one switch position, W, and of the six-switch bridge. */
export interface InverterLosses {
  /** transistor conduction (with a MOSFET: the channel, forward and reverse) */
  transistorConduction_W: number;
  /** diode conduction (0 for a MOSFET, dead time neglected) */
  diodeConduction_W: number;
  /** transistor turn-on and turn-off */
  switching_W: number;
  /** diode reverse recovery */
  recovery_W: number;
  /** the sum of the four above: one switch position */
  position_W: number;
  /** six positions: the bridge */
  bridge_W: number;
}

const INV_PI = 1 / Math.PI;

/** Whether the spec describes a MOSFET (no threshold voltage: synchronous rectification). */
export const isMosfet = (s: InverterLossSpec): boolean => s.Vce0 === 0;

/**
 * Losses of one switch position and the bridge for phase current amplitude I (A peak), modulation
 * index m = |v_dq| / (Vdc/2), fundamental power factor cosPhi, and DC-bus voltage Vdc (V).
 */
export function inverterLosses(s: InverterLossSpec, I: number, m: number, cosPhi: number, Vdc: number): InverterLosses {
  const mc = m * cosPhi;
  const I2 = I * I;
  let pT: number, pD: number;
  if (isMosfet(s)) {
    pT = 0.25 * s.rce * I2;
    pD = 0;
  } else {
    pT = s.Vce0 * I * (0.5 * INV_PI + mc / 8) + s.rce * I2 * (0.125 + mc * INV_PI / 3);
    pD = s.Vf0 * I * (0.5 * INV_PI - mc / 8) + s.rd * I2 * (0.125 - mc * INV_PI / 3);
  }
  const scale = s.fsw_Hz * INV_PI * (I / s.Iref_A) * (Vdc / s.Vref_V);
  const pSw = s.EonEoff_J * scale;
  const pRr = s.Err_J * scale;
  const pos = pT + pD + pSw + pRr;
  return { transistorConduction_W: pT, diodeConduction_W: pD, switching_W: pSw, recovery_W: pRr, position_W: pos, bridge_W: 6 * pos };
}

/** The bridge's total loss alone, W (as inverterLosses(...).bridge_W, without allocating). */
export function inverterBridgeLoss(s: InverterLossSpec, I: number, m: number, cosPhi: number, Vdc: number): number {
  const mc = m * cosPhi;
  const I2 = I * I;
  let cond: number;
  if (s.Vce0 === 0) cond = 0.25 * s.rce * I2;
  else {
    cond = s.Vce0 * I * (0.5 * INV_PI + mc / 8) + s.rce * I2 * (0.125 + mc * INV_PI / 3)
      + s.Vf0 * I * (0.5 * INV_PI - mc / 8) + s.rd * I2 * (0.125 - mc * INV_PI / 3);
  }
  const sw = (s.EonEoff_J + s.Err_J) * s.fsw_Hz * INV_PI * (I / s.Iref_A) * (Vdc / s.Vref_V);
  return 6 * (cond + sw);
}
