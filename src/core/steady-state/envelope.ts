/**
 * The torque-speed envelope motoring or generating: the largest torque under both limits at each
 * speed (the per-speed search is max-torque.ts), the base speed and the maximum speed. Every function
 * accepts a MachineInput and goes through the machine model; a run owns its scratch.
 */
import type { DriveLimits } from '../drive/inverter-spec';
import type { MachineInput, MachineModel } from '../machine/machine-model';
import type { OperatingPoint, Region, LimitedBy } from './operating-point-types';
import { InputError } from '../base/errors';
import { machineModel } from '../machine/linear-dq';
import { bisectPredicate } from '../mathematics/root-finding';
import { assertFinite, assertLimits, assertMachine, mtpaId } from './mtpa';
import { point } from './point-of-current';
import { ENVELOPE_ACCURACY, type MaxTorqueScratch, maxTorqueCore, newScratch } from './max-torque';
import { zeroCurrentTerms } from '../machine/model-numeric';

export { ENVELOPE_ACCURACY } from './max-torque';

const REGIONS: readonly Region[] = ['mtpa', 'field-weakening', 'mtpv'];
const LIMITS: readonly LimitedBy[] = ['current', 'current-and-voltage', 'voltage'];

export type Direction = 'motoring' | 'generating';

/** Objective sign: motoring means T·omega > 0 (T > 0 at standstill), generating the opposite. */
export function directionSign(speed: number, direction: Direction): 1 | -1 {
  const s = speed < 0 ? -1 : 1;
  return (direction === 'motoring' ? s : -s) as 1 | -1;
}

/** The operating point at zero current (open circuit), used when no torque of the wanted sign exists. */
export function openCircuitPoint(m: MachineInput, speed: number): OperatingPoint {
  const p = point(machineModel(m), speed, 0, 0, 'mtpa');
  p.feasible = false; p.region = 'mtpv'; p.limitedBy = 'voltage';
  return p;
}

/**
 * Largest torque in the given direction at a mechanical speed (rad/s) under both limits.
 * Infeasible (feasible=false, torque 0, open-circuit voltage) when no point within both limits gives
 * torque of that direction: the speed is beyond the maximum speed.
 */
export function maxTorquePoint(input: MachineInput, lim: DriveLimits, speed_rad_s: number, direction: Direction): OperatingPoint {
  assertMachine(input);
  assertLimits(lim);
  assertFinite('speed', speed_rad_s, 'rad/s');
  const m = machineModel(input);
  const sc = newScratch();
  const s = directionSign(speed_rad_s, direction);
  maxTorqueCore(m, lim.Vmax, lim.Imax, m.polePairs * speed_rad_s, s, sc);
  if (!sc.ok || !(sc.J > 0)) return openCircuitPoint(m, speed_rad_s);
  const p = point(m, speed_rad_s, sc.id, sc.iq, 'mtpa');
  p.region = REGIONS[sc.region]!;
  p.limitedBy = LIMITS[sc.region]!;
  return p;
}

export interface EnvelopeOptions {
  /** number of speed points from 0 to speedMax, >= 2 */
  points: number;
  /** highest speed, rad/s mechanical; undefined: 1.05 x maximum speed, or 4 x base speed when unbounded */
  speedMax: number | undefined;
  direction: Direction;
}

export const DEFAULT_ENVELOPE_OPTIONS: Readonly<EnvelopeOptions> = { points: 200, speedMax: undefined, direction: 'motoring' };

export interface Envelope {
  /** mechanical speed, rad/s (>= 0) */
  speed: Float64Array;
  /** signed torque, N·m (negative when generating); 0 beyond the maximum speed */
  torque: Float64Array;
  /** mechanical power T·omega, W (negative when generating) */
  power: Float64Array;
  id: Float64Array;
  iq: Float64Array;
  /** |i_dq|, A peak */
  current: Float64Array;
  /** |v_dq|, V peak phase */
  voltage: Float64Array;
  region: Region[];
  /** 1 where the limits allow torque in the direction, 0 beyond the maximum speed */
  feasible: Uint8Array;
  direction: Direction;
  /** highest speed at which the MTPA torque at Imax is available, rad/s */
  baseSpeed: number;
  /** speed where the largest torque reaches zero, rad/s; null when unbounded (torque still there at 2^20 x the first bracket guess, about max(base speed, Vmax / (p max(psiM, Ld Imax)))) */
  maxSpeed: number | null;
  /** psiM / Ld, A peak */
  characteristicCurrent: number;
  /** relative torque tolerance achieved */
  accuracy: number;
}

/**
 * Base speed in closed form: the speed where the MTPA point at Imax reaches |v| = Vmax. At a fixed
 * current the steady voltage is affine in speed, v = Rs i + we (-psi_q, psi_d), so |v|² = Vmax² is
 * the quadratic we²(a² + b²) + 2 we Rs (iq b - id a) + Rs² I² - Vmax² = 0 with a = psi_q, b = psi_d
 * (the model's flux; Lq iq and Ld id + psiM for a linear model); its positive root. 0 when even
 * standstill exceeds Vmax (Rs Imax > Vmax).
 */
export function baseSpeed(input: MachineInput, lim: DriveLimits, direction: Direction = 'motoring'): number {
  assertMachine(input);
  assertLimits(lim);
  const I = lim.Imax;
  if (!Number.isFinite(I)) return 0;
  const m = machineModel(input);
  const id = mtpaId(m, I);
  const iq = (direction === 'motoring' ? 1 : -1) * Math.sqrt(Math.max(0, I * I - id * id));
  const f = new Float64Array(2);
  m.flux(id, iq, f);
  const a = f[1]!;
  const b = f[0]!;
  const A = a * a + b * b;
  const B = 2 * m.Rs * (iq * b - id * a);
  const C = m.Rs * m.Rs * I * I - lim.Vmax * lim.Vmax;
  if (C >= 0) return 0;
  // C < 0 < A: one positive root, computed without cancellation
  const we = (2 * -C) / (B + Math.sqrt(B * B - 4 * A * C));
  return we / m.polePairs;
}

const torqueAt = (m: MachineModel, lim: DriveLimits, w: number, sign: 1 | -1, sc: MaxTorqueScratch): number => {
  maxTorqueCore(m, lim.Vmax, lim.Imax, m.polePairs * w, sign, sc);
  return sc.ok ? sc.J : -Infinity;
};

/** Speed (rad/s, > 0) where the largest torque of the direction reaches zero; null when unbounded. */
export function maximumSpeed(input: MachineInput, lim: DriveLimits, direction: Direction = 'motoring'): number | null {
  assertMachine(input);
  assertLimits(lim);
  const m = machineModel(input);
  const sc = newScratch();
  const s: 1 | -1 = direction === 'motoring' ? 1 : -1;
  const z = zeroCurrentTerms(m);
  let lo = 0;
  let hi = Math.max(baseSpeed(m, lim, direction), lim.Vmax / (m.polePairs * Math.max(z.psi0, z.Ld0 * lim.Imax)));
  if (!(hi > 0) || !Number.isFinite(hi)) hi = 1;
  // bracket: up to 2^20 times the first guess; torque still there means unbounded
  let k = 0;
  for (; k <= 20 && torqueAt(m, lim, hi, s, sc) > 0; k++) { lo = hi; hi *= 2; }
  if (k > 20) return null;
  const b = new Float64Array(2);
  bisectPredicate((w) => !(torqueAt(m, lim, w, s, sc) > 0), lo, hi, 1e-13, b);
  return b[0]!;
}

/** Torque-speed envelope from 0 to speedMax. Output arrays are allocated once. */
export function computeEnvelope(input: MachineInput, lim: DriveLimits, opts: Partial<EnvelopeOptions> = {}): Envelope {
  assertMachine(input);
  assertLimits(lim);
  if (!Number.isFinite(lim.Imax)) throw new InputError('inverter.Imax', 'must be finite for an envelope');
  const o: EnvelopeOptions = { ...DEFAULT_ENVELOPE_OPTIONS, ...opts };
  if (!(Number.isInteger(o.points) && o.points >= 2 && o.points <= 1_000_000)) throw new InputError('envelope.points', 'must be an integer in 2..1000000');
  if (o.direction !== 'motoring' && o.direction !== 'generating') throw new InputError('envelope.direction', "must be 'motoring' or 'generating'");
  if (o.speedMax !== undefined && !(Number.isFinite(o.speedMax) && o.speedMax > 0)) throw new InputError('envelope.speedMax', 'must be > 0 rad/s');
  const m = machineModel(input);
  const wb = baseSpeed(m, lim, o.direction);
  const wmax = maximumSpeed(m, lim, o.direction);
  const z = zeroCurrentTerms(m);
  let top = o.speedMax;
  if (top === undefined) {
    if (wmax !== null) top = 1.05 * wmax;
    else if (wb > 0) top = 4 * wb;
    else top = (4 * lim.Vmax) / (m.polePairs * Math.max(z.psi0, z.Ld0 * lim.Imax));
  }
  const n = o.points;
  const env: Envelope = {
    speed: new Float64Array(n), torque: new Float64Array(n), power: new Float64Array(n),
    id: new Float64Array(n), iq: new Float64Array(n), current: new Float64Array(n), voltage: new Float64Array(n),
    region: new Array<Region>(n), feasible: new Uint8Array(n), direction: o.direction,
    baseSpeed: wb, maxSpeed: wmax, characteristicCurrent: z.psi0 / z.Ld0, accuracy: ENVELOPE_ACCURACY,
  };
  const s: 1 | -1 = o.direction === 'motoring' ? 1 : -1;
  const sc = newScratch();
  const v = new Float64Array(2);
  // the linear model's terms, read once (the closed-form fast path below)
  const lin = m.linear;
  const p = m.polePairs, Rs = m.Rs, Ld = lin ? lin.Ld : 0, Lq = lin ? lin.Lq : 0, psi = lin ? lin.psiM : 0;
  for (let k = 0; k < n; k++) {
    const w = (top * k) / (n - 1);
    const we = p * w;
    env.speed[k] = w;
    maxTorqueCore(m, lim.Vmax, lim.Imax, we, s, sc);
    let id = 0, iq = 0, region: Region = 'mtpv';
    if (sc.ok && sc.J > 0) {
      id = sc.id; iq = sc.iq; region = REGIONS[sc.region]!; env.feasible[k] = 1;
    }
    let T: number, vd: number, vq: number;
    if (lin !== null) {
      T = 1.5 * p * iq * (psi + (Ld - Lq) * id);
      vd = Rs * id - we * Lq * iq;
      vq = Rs * iq + we * (Ld * id + psi);
    } else {
      T = m.torque(id, iq);
      m.steadyVoltage(id, iq, we, v);
      vd = v[0]!; vq = v[1]!;
    }
    env.torque[k] = T;
    env.power[k] = T * w;
    env.id[k] = id;
    env.iq[k] = iq;
    env.current[k] = Math.sqrt(id * id + iq * iq);
    env.voltage[k] = Math.sqrt(vd * vd + vq * vq);
    env.region[k] = region;
  }
  return env;
}
