/**
 * Interpolation on uniform grids: the cell holding a coordinate, linear and bilinear interpolation
 * on it. Used by the reference table (speed x torque) and by any tabulated characteristic.
 * Common practice (no source).
 */

/** The position of x (clamped to [0, xMax]) on a uniform grid of n nodes over [0, xMax], in node units (0..n-1). */
export const gridPosition = (x: number, xMax: number, n: number): number => (Math.min(x, xMax) / xMax) * (n - 1);

/** The first node index of the cell holding grid position s, 0..n-2 (the last cell holds the last node). */
export const cellOf = (s: number, n: number): number => Math.min(Math.floor(s), n - 2);

/** a + f (b - a): linear interpolation between a (f = 0) and b (f = 1). */
export const lerp = (a: number, b: number, f: number): number => a + f * (b - a);

/**
 * Bilinear interpolation of a row-major table v (rows r, columns c, nCols per row) in the cell with
 * corner (r, c) at fractions f along the rows and g along the columns.
 */
export function bilinear(v: Float64Array, nCols: number, r: number, f: number, c: number, g: number): number {
  const i00 = r * nCols + c;
  const i10 = i00 + nCols;
  return (1 - f) * (1 - g) * v[i00]! + f * (1 - g) * v[i10]! + (1 - f) * g * v[i00 + 1]! + f * g * v[i10 + 1]!;
}
