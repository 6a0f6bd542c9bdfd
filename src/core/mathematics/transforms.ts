/**
 * Clarke, Park and abc <-> dq0 transforms (see ../shared/conventions.md).
 *
 * Phase axes a, b, c at 0°, 120°, 240°; alpha on a, beta leads by 90°. theta is the electrical
 * angle of the d axis (magnet north) from the a axis.
 *
 * Default scaling is amplitude-invariant (the 2/3 scaling): a balanced set of peak A maps to a
 * vector of length A, and p = 1.5 (v_d i_d + v_q i_q) + 3 v_0 i_0.
 * Power-invariant scaling (factor sqrt(2/3), zero row 1/sqrt(2)) keeps p = v·i in every frame;
 * every function using it says so in its name.
 *
 * Allocating forms return small tuples; the `...Into` forms write into a caller's Float64Array
 * at `offset` and allocate nothing (for hot loops).
 */

const SQRT3 = Math.sqrt(3);
const INV_SQRT3 = 1 / SQRT3;
const SQRT2_3 = Math.sqrt(2 / 3);
const INV_SQRT2 = 1 / Math.SQRT2;
const SQRT3_2 = SQRT3 / 2;

export type Vec2 = [number, number];
export type Vec3 = [number, number, number];

// ---------------------------------------------------------------- Clarke, amplitude-invariant

/** abc -> (alpha, beta, zero), amplitude-invariant. Writes 3 values at out[offset..]. */
export function clarkeAmplitudeInvariantInto(a: number, b: number, c: number, out: Float64Array, offset = 0): void {
  out[offset] = (2 / 3) * (a - 0.5 * b - 0.5 * c);
  out[offset + 1] = (b - c) * INV_SQRT3;
  out[offset + 2] = (a + b + c) / 3;
}

/** (alpha, beta, zero) -> abc, amplitude-invariant. Writes 3 values at out[offset..]. */
export function inverseClarkeAmplitudeInvariantInto(alpha: number, beta: number, zero: number, out: Float64Array, offset = 0): void {
  out[offset] = alpha + zero;
  out[offset + 1] = -0.5 * alpha + SQRT3_2 * beta + zero;
  out[offset + 2] = -0.5 * alpha - SQRT3_2 * beta + zero;
}

export function clarkeAmplitudeInvariant(a: number, b: number, c: number): Vec3 {
  return [(2 / 3) * (a - 0.5 * b - 0.5 * c), (b - c) * INV_SQRT3, (a + b + c) / 3];
}

export function inverseClarkeAmplitudeInvariant(alpha: number, beta: number, zero = 0): Vec3 {
  return [alpha + zero, -0.5 * alpha + SQRT3_2 * beta + zero, -0.5 * alpha - SQRT3_2 * beta + zero];
}

// ---------------------------------------------------------------- Clarke, power-invariant

/** abc -> (alpha, beta, zero), power-invariant: sqrt(2/3)·[1 -1/2 -1/2; 0 √3/2 -√3/2; 1/√2 1/√2 1/√2]. */
export function clarkePowerInvariantInto(a: number, b: number, c: number, out: Float64Array, offset = 0): void {
  out[offset] = SQRT2_3 * (a - 0.5 * b - 0.5 * c);
  out[offset + 1] = SQRT2_3 * SQRT3_2 * (b - c);
  out[offset + 2] = SQRT2_3 * INV_SQRT2 * (a + b + c);
}

/** Inverse of `clarkePowerInvariantInto` (the matrix is orthogonal: inverse = transpose). */
export function inverseClarkePowerInvariantInto(alpha: number, beta: number, zero: number, out: Float64Array, offset = 0): void {
  const z = INV_SQRT2 * zero;
  out[offset] = SQRT2_3 * (alpha + z);
  out[offset + 1] = SQRT2_3 * (-0.5 * alpha + SQRT3_2 * beta + z);
  out[offset + 2] = SQRT2_3 * (-0.5 * alpha - SQRT3_2 * beta + z);
}

export function clarkePowerInvariant(a: number, b: number, c: number): Vec3 {
  const out = new Float64Array(3);
  clarkePowerInvariantInto(a, b, c, out);
  return [out[0], out[1], out[2]];
}

export function inverseClarkePowerInvariant(alpha: number, beta: number, zero = 0): Vec3 {
  const out = new Float64Array(3);
  inverseClarkePowerInvariantInto(alpha, beta, zero, out);
  return [out[0], out[1], out[2]];
}

// ---------------------------------------------------------------- Park (a rotation; same for both scalings)

/** (alpha, beta) -> (d, q) at electrical angle theta. Writes 2 values at out[offset..]. */
export function parkInto(alpha: number, beta: number, theta: number, out: Float64Array, offset = 0): void {
  const c = Math.cos(theta);
  const s = Math.sin(theta);
  out[offset] = alpha * c + beta * s;
  out[offset + 1] = -alpha * s + beta * c;
}

/** (d, q) -> (alpha, beta) at electrical angle theta. Writes 2 values at out[offset..]. */
export function inverseParkInto(d: number, q: number, theta: number, out: Float64Array, offset = 0): void {
  const c = Math.cos(theta);
  const s = Math.sin(theta);
  out[offset] = d * c - q * s;
  out[offset + 1] = d * s + q * c;
}

export function park(alpha: number, beta: number, theta: number): Vec2 {
  const c = Math.cos(theta);
  const s = Math.sin(theta);
  return [alpha * c + beta * s, -alpha * s + beta * c];
}

export function inversePark(d: number, q: number, theta: number): Vec2 {
  const c = Math.cos(theta);
  const s = Math.sin(theta);
  return [d * c - q * s, d * s + q * c];
}

// ---------------------------------------------------------------- abc <-> dq0, amplitude-invariant

/** abc -> (d, q, 0), amplitude-invariant. Writes 3 values at out[offset..]. */
export function abcToDq0AmplitudeInvariantInto(a: number, b: number, c: number, theta: number, out: Float64Array, offset = 0): void {
  const alpha = (2 / 3) * (a - 0.5 * b - 0.5 * c);
  const beta = (b - c) * INV_SQRT3;
  const ct = Math.cos(theta);
  const st = Math.sin(theta);
  out[offset] = alpha * ct + beta * st;
  out[offset + 1] = -alpha * st + beta * ct;
  out[offset + 2] = (a + b + c) / 3;
}

/** (d, q, 0) -> abc, amplitude-invariant. Writes 3 values at out[offset..]. */
export function dq0ToAbcAmplitudeInvariantInto(d: number, q: number, zero: number, theta: number, out: Float64Array, offset = 0): void {
  const ct = Math.cos(theta);
  const st = Math.sin(theta);
  const alpha = d * ct - q * st;
  const beta = d * st + q * ct;
  out[offset] = alpha + zero;
  out[offset + 1] = -0.5 * alpha + SQRT3_2 * beta + zero;
  out[offset + 2] = -0.5 * alpha - SQRT3_2 * beta + zero;
}

/**
 * (d, q) -> abc with zero sequence 0, amplitude-invariant (the default scaling), for the
 * simulator's hot loop. Writes 3 values at out[offset..]; allocates nothing.
 */
export function dqToAbc(d: number, q: number, theta: number, out: Float64Array, offset = 0): void {
  dq0ToAbcAmplitudeInvariantInto(d, q, 0, theta, out, offset);
}

/** abc -> (d, q), amplitude-invariant (zero sequence dropped). Writes 2 values at out[offset..]. */
export function abcToDq(a: number, b: number, c: number, theta: number, out: Float64Array, offset = 0): void {
  const alpha = (2 / 3) * (a - 0.5 * b - 0.5 * c);
  const beta = (b - c) * INV_SQRT3;
  const ct = Math.cos(theta);
  const st = Math.sin(theta);
  out[offset] = alpha * ct + beta * st;
  out[offset + 1] = -alpha * st + beta * ct;
}

export function abcToDq0AmplitudeInvariant(a: number, b: number, c: number, theta: number): Vec3 {
  const out = new Float64Array(3);
  abcToDq0AmplitudeInvariantInto(a, b, c, theta, out);
  return [out[0], out[1], out[2]];
}

export function dq0ToAbcAmplitudeInvariant(d: number, q: number, zero: number, theta: number): Vec3 {
  const out = new Float64Array(3);
  dq0ToAbcAmplitudeInvariantInto(d, q, zero, theta, out);
  return [out[0], out[1], out[2]];
}

// ---------------------------------------------------------------- abc <-> dq0, power-invariant

/** abc -> (d, q, 0), power-invariant. Writes 3 values at out[offset..]. */
export function abcToDq0PowerInvariantInto(a: number, b: number, c: number, theta: number, out: Float64Array, offset = 0): void {
  const alpha = SQRT2_3 * (a - 0.5 * b - 0.5 * c);
  const beta = SQRT2_3 * SQRT3_2 * (b - c);
  const ct = Math.cos(theta);
  const st = Math.sin(theta);
  out[offset] = alpha * ct + beta * st;
  out[offset + 1] = -alpha * st + beta * ct;
  out[offset + 2] = SQRT2_3 * INV_SQRT2 * (a + b + c);
}

/** (d, q, 0) -> abc, power-invariant. Writes 3 values at out[offset..]. */
export function dq0ToAbcPowerInvariantInto(d: number, q: number, zero: number, theta: number, out: Float64Array, offset = 0): void {
  const ct = Math.cos(theta);
  const st = Math.sin(theta);
  inverseClarkePowerInvariantInto(d * ct - q * st, d * st + q * ct, zero, out, offset);
}

export function abcToDq0PowerInvariant(a: number, b: number, c: number, theta: number): Vec3 {
  const out = new Float64Array(3);
  abcToDq0PowerInvariantInto(a, b, c, theta, out);
  return [out[0], out[1], out[2]];
}

export function dq0ToAbcPowerInvariant(d: number, q: number, zero: number, theta: number): Vec3 {
  const out = new Float64Array(3);
  dq0ToAbcPowerInvariantInto(d, q, zero, theta, out);
  return [out[0], out[1], out[2]];
}

// ---------------------------------------------------------------- power

/** Instantaneous power from amplitude-invariant dq0 quantities: 1.5 (vd id + vq iq) + 3 v0 i0. */
export const powerDq0AmplitudeInvariant = (vd: number, vq: number, v0: number, id: number, iq: number, i0: number): number =>
  1.5 * (vd * id + vq * iq) + 3 * v0 * i0;

/** Instantaneous power from power-invariant dq0 quantities: vd id + vq iq + v0 i0. */
export const powerDq0PowerInvariant = (vd: number, vq: number, v0: number, id: number, iq: number, i0: number): number =>
  vd * id + vq * iq + v0 * i0;
