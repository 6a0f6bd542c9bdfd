/**
 * A C1 surface through values on a rectangular, non-uniform grid: bicubic Hermite patches whose node
 * derivatives are estimated from the data. fx and fy by the monotone piecewise-cubic slopes of Fritsch
 * and Carlson along each grid line (the weighted harmonic mean of Fritsch and Butland; zero at a local
 * extremum, the one-sided three-point formula at the ends), fxy by the three-point derivative of fy
 * along x averaged with that of fx along y. Along every grid line the surface is the monotone cubic
 * of that line; everywhere the patches join with continuous first derivatives, and an affine data set
 * is reproduced exactly. Beyond the grid the surface goes on linearly (the Hermite basis continued by
 * its tangent at the end of the edge cell), so value and derivatives stay continuous there.
 * Fritsch and Carlson (1980), Monotone piecewise cubic interpolation, SIAM J. Numer. Anal. 17(2);
 * Fritsch and Butland (1984), A method for constructing local monotone piecewise cubic interpolants,
 * SIAM J. Sci. Stat. Comput. 5(2).
 *
 * Evaluation allocates nothing: a surface keeps the last cell found and its basis scratch (one
 * computation at a time uses a surface).
 */

/** Node values and derivative estimates of one surface, row-major: k = i * ny + j at (x[i], y[j]). */
export interface HermiteNodes {
  f: Float64Array;
  fx: Float64Array;
  fy: Float64Array;
  fxy: Float64Array;
}

/** Fritsch–Butland slopes of the values v[off + k * stride], k = 0..n-1, at abscissae g, into d (same layout). */
function monotoneSlopes(g: Float64Array, v: Float64Array, off: number, stride: number, d: Float64Array): void {
  const n = g.length;
  const at = (k: number): number => v[off + k * stride]!;
  if (n === 2) {
    const s = (at(1) - at(0)) / (g[1]! - g[0]!);
    d[off] = s; d[off + stride] = s;
    return;
  }
  for (let k = 1; k < n - 1; k++) {
    const h0 = g[k]! - g[k - 1]!, h1 = g[k + 1]! - g[k]!;
    const s0 = (at(k) - at(k - 1)) / h0, s1 = (at(k + 1) - at(k)) / h1;
    if (s0 * s1 <= 0) { d[off + k * stride] = 0; continue; }
    const w0 = 2 * h1 + h0, w1 = h1 + 2 * h0;
    d[off + k * stride] = (w0 + w1) / (w0 / s0 + w1 / s1);
  }
  // ends: the three-point one-sided formula, kept of the sign of the end secant and within 3x it
  for (const [k, k1, k2] of [[0, 1, 2], [n - 1, n - 2, n - 3]] as const) {
    const h0 = g[k1]! - g[k]!, h1 = g[k2]! - g[k1]!;
    const s0 = (at(k1) - at(k)) / h0, s1 = (at(k2) - at(k1)) / h1;
    let e = ((2 * h0 + h1) * s0 - h0 * s1) / (h0 + h1);
    if (e * s0 <= 0) e = 0;
    else if (s0 * s1 <= 0 && Math.abs(e) > Math.abs(3 * s0)) e = 3 * s0;
    d[off + k * stride] = e;
  }
}

/** Three-point derivative (non-uniform) of v[off + k * stride] along g, at every k, into d. */
function threePointSlopes(g: Float64Array, v: Float64Array, off: number, stride: number, d: Float64Array): void {
  const n = g.length;
  const at = (k: number): number => v[off + k * stride]!;
  if (n === 2) {
    const s = (at(1) - at(0)) / (g[1]! - g[0]!);
    d[off] = s; d[off + stride] = s;
    return;
  }
  for (let k = 0; k < n; k++) {
    const c = k === 0 ? 1 : k === n - 1 ? n - 2 : k; // centre of the three points used
    const xa = g[c - 1]!, xb = g[c]!, xc = g[c + 1]!, x = g[k]!;
    // derivative of the parabola through the three points, at x
    const la = (2 * x - xb - xc) / ((xa - xb) * (xa - xc));
    const lb = (2 * x - xa - xc) / ((xb - xa) * (xb - xc));
    const lc = (2 * x - xa - xb) / ((xc - xa) * (xc - xb));
    d[off + k * stride] = la * at(c - 1) + lb * at(c) + lc * at(c + 1);
  }
}

/** The node derivatives of values f (row-major, nx x ny) on the grid x, y. */
export function hermiteNodes(x: Float64Array, y: Float64Array, f: Float64Array): HermiteNodes {
  const nx = x.length, ny = y.length;
  const fx = new Float64Array(nx * ny), fy = new Float64Array(nx * ny);
  const a = new Float64Array(nx * ny), b = new Float64Array(nx * ny);
  for (let j = 0; j < ny; j++) monotoneSlopes(x, f, j, ny, fx);
  for (let i = 0; i < nx; i++) monotoneSlopes(y, f, i * ny, 1, fy);
  for (let j = 0; j < ny; j++) threePointSlopes(x, fy, j, ny, a);
  for (let i = 0; i < nx; i++) threePointSlopes(y, fx, i * ny, 1, b);
  const fxy = new Float64Array(nx * ny);
  for (let k = 0; k < nx * ny; k++) fxy[k] = 0.5 * (a[k]! + b[k]!);
  return { f: Float64Array.from(f), fx, fy, fxy };
}

/** Cell k of x on ascending g (g[k] <= x <= g[k+1], clamped to the end cells), trying `last` first. */
export function findCell(g: Float64Array, x: number, last: number): number {
  const n = g.length;
  if (last >= 0 && last < n - 1 && g[last]! <= x && x <= g[last + 1]!) return last;
  if (!(x > g[0]!)) return 0;
  if (x >= g[n - 1]!) return n - 2;
  let lo = 0, hi = n - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (g[mid]! <= x) lo = mid; else hi = mid;
  }
  return lo;
}

/**
 * Two surfaces on one grid, evaluated together (the same cell and basis). Node data interleaved per
 * node, [f, fx, fy, fxy] of surface 0 then of surface 1, for locality.
 */
export class HermiteSurfacePair {
  /** per node: 8 numbers (see the class comment) */
  private readonly c: Float64Array;
  private ci = 0;
  private cj = 0;

  constructor(readonly x: Float64Array, readonly y: Float64Array, s0: HermiteNodes, s1: HermiteNodes) {
    const n = x.length * y.length;
    const c = (this.c = new Float64Array(8 * n));
    for (let k = 0; k < n; k++) {
      c[8 * k] = s0.f[k]!; c[8 * k + 1] = s0.fx[k]!; c[8 * k + 2] = s0.fy[k]!; c[8 * k + 3] = s0.fxy[k]!;
      c[8 * k + 4] = s1.f[k]!; c[8 * k + 5] = s1.fx[k]!; c[8 * k + 6] = s1.fy[k]!; c[8 * k + 7] = s1.fxy[k]!;
    }
  }

  /** the point of `evaluate` (scratch of this surface) */
  private readonly pt = new Float64Array(2);

  /**
   * Values of both surfaces at (x, y) into out[0], out[1]; when d is given, [df/dx, df/dy] of surface
   * s into d[2s], d[2s + 1] (the exact derivatives of the interpolant).
   */
  evaluate(x: number, y: number, out: Float64Array, d: Float64Array | null): void {
    const p = this.pt;
    p[0] = x;
    p[1] = y;
    this.evaluateAt(p, out, d);
  }

  /**
   * `evaluate` at the point (p[0], p[1]): for hot loops, so that the coordinates do not cross a call
   * the engine does not inline as arguments (boxed doubles, an allocation each).
   */
  evaluateAt(p: Float64Array, out: Float64Array, d: Float64Array | null): void {
    const x = p[0]!, y = p[1]!;
    const gx = this.x, gy = this.y, ny = gy.length;
    const i = (this.ci = findCell(gx, x, this.ci));
    const j = (this.cj = findCell(gy, y, this.cj));
    const hx = gx[i + 1]! - gx[i]!, hy = gy[j + 1]! - gy[j]!;
    // the Hermite basis in x and y (cell coordinates u, v), continued linearly outside the cell
    const u = (x - gx[i]!) / hx, v = (y - gy[j]!) / hy;
    let bx0: number, bx1: number, gx0: number, gx1: number, ex0: number, ex1: number, ex2: number, ex3: number;
    if (u < 0) { bx0 = 1; bx1 = 0; gx0 = hx * u; gx1 = 0; ex0 = 0; ex1 = 0; ex2 = 1; ex3 = 0; }
    else if (u > 1) { bx0 = 0; bx1 = 1; gx0 = 0; gx1 = hx * (u - 1); ex0 = 0; ex1 = 0; ex2 = 0; ex3 = 1; }
    else {
      const u2 = u * u, u3 = u2 * u;
      bx0 = 2 * u3 - 3 * u2 + 1; bx1 = 3 * u2 - 2 * u3; gx0 = hx * (u3 - 2 * u2 + u); gx1 = hx * (u3 - u2);
      ex0 = (6 * u2 - 6 * u) / hx; ex1 = -ex0; ex2 = 3 * u2 - 4 * u + 1; ex3 = 3 * u2 - 2 * u;
    }
    let by0: number, by1: number, gy0: number, gy1: number, ey0: number, ey1: number, ey2: number, ey3: number;
    if (v < 0) { by0 = 1; by1 = 0; gy0 = hy * v; gy1 = 0; ey0 = 0; ey1 = 0; ey2 = 1; ey3 = 0; }
    else if (v > 1) { by0 = 0; by1 = 1; gy0 = 0; gy1 = hy * (v - 1); ey0 = 0; ey1 = 0; ey2 = 0; ey3 = 1; }
    else {
      const v2 = v * v, v3 = v2 * v;
      by0 = 2 * v3 - 3 * v2 + 1; by1 = 3 * v2 - 2 * v3; gy0 = hy * (v3 - 2 * v2 + v); gy1 = hy * (v3 - v2);
      ey0 = (6 * v2 - 6 * v) / hy; ey1 = -ey0; ey2 = 3 * v2 - 4 * v + 1; ey3 = 3 * v2 - 2 * v;
    }
    const c = this.c;
    const k00 = 8 * (i * ny + j), k01 = k00 + 8, k10 = k00 + 8 * ny, k11 = k10 + 8;
    for (let s = 0; s < 8; s += 4) {
      const f00 = c[k00 + s]!, f10 = c[k10 + s]!, f01 = c[k01 + s]!, f11 = c[k11 + s]!;
      const x00 = c[k00 + s + 1]!, x10 = c[k10 + s + 1]!, x01 = c[k01 + s + 1]!, x11 = c[k11 + s + 1]!;
      const y00 = c[k00 + s + 2]!, y10 = c[k10 + s + 2]!, y01 = c[k01 + s + 2]!, y11 = c[k11 + s + 2]!;
      const z00 = c[k00 + s + 3]!, z10 = c[k10 + s + 3]!, z01 = c[k01 + s + 3]!, z11 = c[k11 + s + 3]!;
      // x-direction Hermite combinations at the two y corners, of f and of fy
      const a0 = bx0 * f00 + bx1 * f10 + gx0 * x00 + gx1 * x10;
      const a1 = bx0 * f01 + bx1 * f11 + gx0 * x01 + gx1 * x11;
      const c0 = bx0 * y00 + bx1 * y10 + gx0 * z00 + gx1 * z10;
      const c1 = bx0 * y01 + bx1 * y11 + gx0 * z01 + gx1 * z11;
      out[s >> 2] = by0 * a0 + by1 * a1 + gy0 * c0 + gy1 * c1;
      if (d) {
        const da0 = ex0 * f00 + ex1 * f10 + ex2 * x00 + ex3 * x10;
        const da1 = ex0 * f01 + ex1 * f11 + ex2 * x01 + ex3 * x11;
        const dc0 = ex0 * y00 + ex1 * y10 + ex2 * z00 + ex3 * z10;
        const dc1 = ex0 * y01 + ex1 * y11 + ex2 * z01 + ex3 * z11;
        d[s >> 1] = by0 * da0 + by1 * da1 + gy0 * dc0 + gy1 * dc1;
        d[(s >> 1) + 1] = ey0 * a0 + ey1 * a1 + ey2 * c0 + ey3 * c1;
      }
    }
  }
}
