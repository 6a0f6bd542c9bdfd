/**
 * cos and sin of an angle near one whose cos and sin are known: (c0, s0) = (cos, sin)(angle - d).
 * For |d| < 0.5 the rotation by d uses the Taylor polynomials of sin (through d^11) and cos
 * (through d^12) in Horner form with constant coefficients (truncation below 2e-14 at |d| = 0.5;
 * common practice, no source), farther away Math.cos / Math.sin of `angle`. Saves two
 * transcendental calls where a hot loop has the cos and sin of a nearby angle already.
 *
 * `cosSinNear` writes into out[0] (cos) and out[1] (sin): no allocation, no boxed return value.
 * The polynomials themselves (`sinSmall`, `cosSmall`) return a double: a hot loop that calls them
 * where the engine inlines them (the plant's derivative) keeps the values in registers.
 */

/** sin d by its Taylor polynomial through d^11 (|d| < 0.5: truncation below 2e-14). */
export function sinSmall(d: number): number {
  const x = d * d;
  return d * (1 + x * (-1 / 6 + x * (1 / 120 + x * (-1 / 5040 + x * (1 / 362880 + x * (-1 / 39916800))))));
}

/** cos d by its Taylor polynomial through d^12 (|d| < 0.5: truncation below 2e-14). */
export function cosSmall(d: number): number {
  const x = d * d;
  return 1 + x * (-1 / 2 + x * (1 / 24 + x * (-1 / 720 + x * (1 / 40320 + x * (-1 / 3628800 + x * (1 / 479001600))))));
}

/** (cos, sin)(angle) into out[0], out[1], from (c0, s0) = (cos, sin)(angle - d) when |d| < 0.5. */
export function cosSinNear(c0: number, s0: number, d: number, angle: number, out: Float64Array): void {
  if (d > -0.5 && d < 0.5) {
    const sd = sinSmall(d);
    const cd = cosSmall(d);
    out[0] = c0 * cd - s0 * sd;
    out[1] = s0 * cd + c0 * sd;
  } else {
    out[0] = Math.cos(angle);
    out[1] = Math.sin(angle);
  }
}
