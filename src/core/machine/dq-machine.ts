/**
 * The constant-parameter dq machine's terms and the motor's mechanics and temperatures. SI units
 * (see ../shared/conventions.md): A peak, V peak phase, Wb peak, H, ohm per phase (star equivalent).
 */
/** dq model of a PMSM at one stated temperature. */
export interface DqMachine {
  /** pole pairs p (integer >= 1) */
  polePairs: number;
  /** stator resistance per phase, ohm */
  Rs: number;
  /** d-axis inductance, H */
  Ld: number;
  /** q-axis inductance, H */
  Lq: number;
  /** peak permanent-magnet flux linkage per phase, Wb */
  psiM: number;
}

/** Mechanical terms of the motor (the load's inertia is added by the scenario). */
export interface Mechanics {
  /** rotor inertia, kg·m² */
  inertia: number;
  /** viscous friction B, N·m·s/rad */
  viscousFriction: number;
  /** Coulomb friction, N·m */
  coulombFriction: number;
}

/** Operating temperatures. */
export interface Conditions {
  /** winding temperature of the hot corner, °C */
  windingTemp_C: number;
  /** magnet temperature of the hot corner, °C */
  magnetTemp_C: number;
  /** temperature of the cold corner (winding and magnet), °C */
  coldTemp_C: number;
  /** relative change of remanence (and psiM) per kelvin, 1/K, e.g. -0.0012 for sintered NdFeB */
  magnetTempCoeff: number;
}
