/**
 * One-dimensional searches used by the steady-state solvers: golden-section maximum, a Newton polish
 * of a maximum by central differences, bracketed bisection of a monotone predicate, and the zero of a
 * sampled parabola. Each has a fixed iteration bound and allocates nothing (results go into `out`).
 */

/** (sqrt(5) - 1) / 2, the golden-section ratio. */
export const GOLD = (Math.sqrt(5) - 1) / 2;

/**
 * Maximum of f on [lo, hi] by golden section, `steps` steps (the interval shrinks by GOLD each step).
 * Writes out[0] = x of the larger of the two final interior values (the right one on a tie),
 * out[1] = that value. Kiefer (1953), Sequential minimax search for a maximum, Proc. AMS 4(3).
 */
export function goldenSectionMax(f: (x: number) => number, lo: number, hi: number, steps: number, out: Float64Array): void {
  let x1 = hi - GOLD * (hi - lo);
  let x2 = lo + GOLD * (hi - lo);
  let f1 = f(x1);
  let f2 = f(x2);
  for (let it = 0; it < steps; it++) {
    if (f1 < f2) { lo = x1; x1 = x2; f1 = f2; x2 = lo + GOLD * (hi - lo); f2 = f(x2); }
    else { hi = x2; x2 = x1; f2 = f1; x1 = hi - GOLD * (hi - lo); f1 = f(x1); }
  }
  out[0] = f1 > f2 ? x1 : x2;
  out[1] = Math.max(f1, f2);
}

/**
 * Polish a maximum of a smooth f near x within [lo, hi]: Newton on f' with central differences of
 * step h (f' from the five-point stencil, error O(h⁴); f'' from three values), at most `steps` steps,
 * a step kept only while f is concave there and the step stays in the window. Returns the polished x.
 * Abramowitz and Stegun (1964), Handbook of Mathematical Functions, 25.3.6 (five-point derivative).
 */
export function polishMax(f: (x: number) => number, x: number, lo: number, hi: number, h: number, steps = 4): number {
  for (let it = 0; it < steps; it++) {
    const fx = f(x), fp = f(x + h), fm = f(x - h);
    const d1 = (8 * (fp - fm) - (f(x + 2 * h) - f(x - 2 * h))) / (12 * h);
    const d2 = (fp - 2 * fx + fm) / (h * h);
    if (!(d2 < 0)) break;
    const xn = x - d1 / d2;
    if (!(xn > lo && xn < hi)) break;
    const done = Math.abs(xn - x) <= 1e-15 * (1 + Math.abs(x));
    x = xn;
    if (done) break;
  }
  return x;
}

/**
 * Bisection of a predicate that is false at lo and true at hi (monotone in between), to
 * hi - lo <= rel·hi or maxIter halvings. Writes out[0] = lo (last false), out[1] = hi (last true).
 */
export function bisectPredicate(isHigh: (x: number) => boolean, lo: number, hi: number, rel: number, out: Float64Array, maxIter = 200): void {
  for (let it = 0; it < maxIter && hi - lo > rel * hi; it++) {
    const mid = 0.5 * (lo + hi);
    if (isHigh(mid)) hi = mid;
    else lo = mid;
  }
  out[0] = lo;
  out[1] = hi;
}

/**
 * Zero in (-1, 1) of the parabola through (-1, a), (0, b), (1, c), in units of the sample step, nearest
 * to 0; NaN when there is none (a Newton start). Press, Teukolsky, Vetterling, Flannery (2007),
 * Numerical Recipes, 3rd ed., section 5.6 (the quadratic root without cancellation).
 */
export function parabolaZero(a: number, b: number, c: number): number {
  const A = 0.5 * (a + c) - b;
  const B = 0.5 * (c - a);
  if (A === 0) return B === 0 ? Number.NaN : -b / B;
  const disc = B * B - 4 * A * b;
  if (disc < 0) return Number.NaN;
  const q = -0.5 * (B + (B >= 0 ? 1 : -1) * Math.sqrt(disc));
  const r1 = q / A;
  const r2 = q !== 0 ? b / q : r1;
  return Math.abs(r1) < Math.abs(r2) ? r1 : r2;
}
