import type { DriveLimits, InverterSpec, Modulation } from './inverter-spec';
import { InputError } from '../base/errors';

/**
 * Largest peak phase voltage (length of v_dq) per volt of effective bus, by modulation:
 * sinusoidal PWM 1/2; SVPWM or min-max injection, linear range 1/sqrt(3) (inscribed circle of
 * the hexagon); six-step fundamental 2/pi. Hexagon vertices reach 2/3 (see `hexagonVertex`).
 */
export const MODULATION_GAIN: Readonly<Record<Modulation, number>> = {
  sinusoidal: 0.5,
  svpwm: 1 / Math.sqrt(3),
  'six-step': 2 / Math.PI,
};

/** Hexagon vertex = 2 Vdc / 3 (the largest instantaneous v_alpha-beta length). */
export const hexagonVertex = (Vdc: number): number => (2 * Vdc) / 3;

/** Effective bus after the drop of the two conducting devices in series. */
export function effectiveBus(spec: Pick<InverterSpec, 'Vdc' | 'deviceDrop'>): number {
  return Math.max(0, spec.Vdc - 2 * spec.deviceDrop);
}

/** Peak phase voltage available to the steady state, V. */
export function voltageLimit(spec: Pick<InverterSpec, 'Vdc' | 'deviceDrop' | 'modulation' | 'voltageUtilization'>): number {
  return MODULATION_GAIN[spec.modulation] * spec.voltageUtilization * effectiveBus(spec);
}

/** The DC-bus voltage that gives `Vmax` peak phase with this modulation, utilisation and drop. */
export function busForVoltageLimit(Vmax: number, spec: Pick<InverterSpec, 'deviceDrop' | 'modulation' | 'voltageUtilization'>): number {
  return Vmax / (MODULATION_GAIN[spec.modulation] * spec.voltageUtilization) + 2 * spec.deviceDrop;
}

/** Limits for the steady-state solvers: peak or continuous current. */
export function driveLimits(spec: InverterSpec, current: 'peak' | 'continuous' = 'peak'): DriveLimits {
  if (!(spec.voltageUtilization > 0 && spec.voltageUtilization <= 1)) {
    throw new InputError('inverter.voltageUtilization', 'must be in (0, 1]');
  }
  return { Vmax: voltageLimit(spec), Imax: current === 'peak' ? spec.Imax : spec.Icont };
}

/**
 * Hexagon limit in the alpha-beta plane: the largest length of a voltage vector at angle `angle`
 * (rad, from the alpha axis) that the bridge can produce on average over a period.
 * Inscribed circle Vdc/sqrt(3) at the edge midpoints, 2 Vdc/3 at the vertices.
 */
export function hexagonRadius(Vdc: number, angle: number): number {
  const sector = Math.PI / 3;
  let a = angle % sector;
  if (a < 0) a += sector;
  return inscribedRadius(Vdc) / Math.cos(a - sector / 2);
}

/**
 * The vector (va, vb) as a fraction of the hexagon limit in its own direction, |v| / hexagonRadius:
 * the largest of its projections on the faces' normals (30°, 90°, 150°), max((√3/2)|va| + |vb|/2,
 * |vb|), over the inscribed radius `inscribed` (Vdc/√3). No angle and no cosine: equal to the ratio
 * to rounding. Math.max keeps a NaN.
 */
export function hexagonFraction(va: number, vb: number, inscribed: number): number {
  return Math.max(HALF_SQRT3 * Math.abs(va) + 0.5 * Math.abs(vb), Math.abs(vb)) / inscribed;
}
const HALF_SQRT3 = Math.sqrt(3) / 2;

/** Radius of the circle inscribed in the hexagon, Vdc/sqrt(3) (the SVPWM linear range). */
export const inscribedRadius = (Vdc: number): number => Vdc / Math.sqrt(3);

/** The voltage limit a controller holds its command to: a circle, or the bridge's hexagon for the bus `Vdc`. */
export interface ModulationLimit {
  /** 'circle': |v| <= radius; 'hexagon': the bridge's hexagon for the bus `Vdc` */
  shape: 'circle' | 'hexagon';
  /** circle radius (peak phase V); for the hexagon the inscribed radius Vdc/sqrt(3) */
  radius: number;
  /** effective bus voltage (hexagon only), V */
  Vdc: number;
}

/**
 * The whole modulation range of the effective bus (the utilisation headroom is the controller's):
 * sinusoidal PWM a circle of MODULATION_GAIN.sinusoidal·Vdc, SVPWM the inscribed circle, six-step
 * the hexagon itself.
 */
export function modulationLimit(inv: Pick<InverterSpec, 'Vdc' | 'deviceDrop' | 'modulation'>): ModulationLimit {
  const Vdc = effectiveBus(inv);
  if (inv.modulation === 'six-step') return { shape: 'hexagon', radius: inscribedRadius(Vdc), Vdc };
  return { shape: 'circle', radius: inv.modulation === 'svpwm' ? inscribedRadius(Vdc) : MODULATION_GAIN.sinusoidal * Vdc, Vdc };
}
