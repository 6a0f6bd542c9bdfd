/** The inverter's ratings and the two limits (voltage, current) the steady-state solvers use. */
export type Modulation = 'sinusoidal' | 'svpwm' | 'six-step';

export interface InverterSpec {
  /** DC-bus voltage, V */
  Vdc: number;
  /** peak phase current limit, A */
  Imax: number;
  /** continuous phase current limit, A peak */
  Icont: number;
  modulation: Modulation;
  /** fraction (0..1] of the modulation's voltage limit that the steady state may use */
  voltageUtilization: number;
  /** on-state drop of the conducting devices, V (subtracted from the bus, two devices in series) */
  deviceDrop: number;
}

/** The two limits of the steady-state solvers. */
export interface DriveLimits {
  /** peak phase voltage available = largest length of v_dq, V */
  Vmax: number;
  /** peak phase current = largest length of i_dq, A */
  Imax: number;
}
