/**
 * Iso-lines of a function sampled on a rectangular grid, by marching squares: the two-dimensional
 * form of marching cubes (Lorensen and Cline 1987, "Marching cubes: a high resolution 3D surface
 * construction algorithm", SIGGRAPH 87). Each grid cell whose four corners are finite is classed by
 * which corners lie at or above the level; the line crosses an edge whose ends lie on the two sides,
 * at the point found by linear interpolation along that edge. A saddle cell (opposite corners on the
 * same side) is resolved by the mean of its four corners, the cell's centre value (common practice).
 * Where a value is missing (not finite, e.g. outside a map's envelope) a cell with three finite
 * corners is contoured on the triangle they span, linear over it (marching triangles, common
 * practice), and a cell with fewer is left out, so a line stops within half a cell of the gap. The
 * segments are joined into polylines through the edges they share.
 */
import { InputError } from '../base/errors';

/** One iso-line: points in order; a closed line repeats its first point at the end. */
export interface ContourPolyline {
  x: number[];
  y: number[];
  closed: boolean;
}

// the edges of cell (i, j), as pairs of the cell's sides: B (bottom, y_j), R (right, x_i+1),
// T (top, y_j+1), L (left, x_i); corners a (i, j), b (i+1, j), c (i+1, j+1), d (i, j+1)
const B = 0, R = 1, T = 2, L = 3;
/** Segments of each case (bit 1: a, 2: b, 4: c, 8: d at or above the level); saddles 5 and 10 handled apart. */
const CASES: ReadonlyArray<ReadonlyArray<readonly [number, number]>> = [
  [], [[L, B]], [[B, R]], [[L, R]], [[R, T]], [], [[B, T]], [[L, T]],
  [[L, T]], [[B, T]], [], [[R, T]], [[L, R]], [[B, R]], [[L, B]], [],
];

/**
 * The iso-lines z = level over the grid xs x ys, with z[i * ys.length + j] the value at (xs[i], ys[j]).
 * xs and ys strictly increasing, at least 2 each; z may hold NaN (no value there).
 */
export function contourLines(xs: ArrayLike<number>, ys: ArrayLike<number>, z: ArrayLike<number>, level: number): ContourPolyline[] {
  const nx = xs.length, ny = ys.length;
  if (nx < 2 || ny < 2) throw new InputError('xs, ys', `need at least 2 grid values each (got ${nx} and ${ny})`);
  if (z.length !== nx * ny) throw new InputError('z', `must hold xs.length x ys.length = ${nx * ny} values (got ${z.length})`);
  if (!Number.isFinite(level)) throw new InputError('level', `must be a finite number (got ${level})`);
  for (const [name, a] of [['xs', xs], ['ys', ys]] as const) {
    for (let k = 0; k < a.length; k++) {
      if (!Number.isFinite(a[k]!) || (k > 0 && !(a[k]! > a[k - 1]!))) throw new InputError(name, 'must be finite and strictly increasing');
    }
  }
  const at = (i: number, j: number): number => z[i * ny + j]!;
  // an edge's key: 4 (i ny + j) + s, s = 0 for (i, j)-(i+1, j), 1 for (i, j)-(i, j+1), and the
  // diagonals of cell (i, j): 2 for (i+1, j)-(i, j+1), 3 for (i, j)-(i+1, j+1)
  const points = new Map<number, [number, number]>();
  const cross = (key: number): void => {
    if (points.has(key)) return;
    const n = key >> 2, s = key & 3, i = Math.floor(n / ny), j = n % ny;
    const [i0, j0, i1, j1] = s === 0 ? [i, j, i + 1, j] : s === 1 ? [i, j, i, j + 1] : s === 2 ? [i + 1, j, i, j + 1] : [i, j, i + 1, j + 1];
    const z0 = at(i0, j0), z1 = at(i1, j1);
    const t = (level - z0) / (z1 - z0); // the ends lie on two sides of the level: z1 != z0
    points.set(key, [xs[i0]! + t * (xs[i1]! - xs[i0]!), ys[j0]! + t * (ys[j1]! - ys[j0]!)]);
  };
  const segs: number[] = []; // pairs of edge keys
  const add = (k0: number, k1: number): void => {
    cross(k0);
    cross(k1);
    segs.push(k0, k1);
  };
  for (let i = 0; i < nx - 1; i++) {
    for (let j = 0; j < ny - 1; j++) {
      const a = at(i, j), b = at(i + 1, j), c = at(i + 1, j + 1), d = at(i, j + 1);
      const base = 4 * (i * ny + j);
      const side = [base, 4 * ((i + 1) * ny + j) + 1, 4 * (i * ny + j + 1), base + 1];
      const ok = [Number.isFinite(a), Number.isFinite(b), Number.isFinite(c), Number.isFinite(d)];
      const missing = ok.filter((q) => !q).length;
      if (missing === 1) {
        // three corners: the triangle they span, cut off along the diagonal between the missing corner's neighbours
        const miss = ok.indexOf(false);
        // vertices in order round the triangle, and its edges v0-v1, v1-v2, v2-v0
        const tri: [number, number, number, number, number, number] =
          miss === 0 ? [b, c, d, side[R]!, side[T]!, base + 2] : miss === 1 ? [a, c, d, base + 3, side[T]!, side[L]!]
            : miss === 2 ? [a, b, d, side[B]!, base + 2, side[L]!] : [a, b, c, side[B]!, side[R]!, base + 3];
        const up = [tri[0] >= level, tri[1] >= level, tri[2] >= level];
        if (up[0] === up[1] && up[1] === up[2]) continue;
        // the corner alone on its side: the line cuts its two edges
        if (up[1] === up[2]) add(tri[3], tri[5]);
        else if (up[0] === up[2]) add(tri[3], tri[4]);
        else add(tri[4], tri[5]);
        continue;
      }
      if (missing > 1) continue;
      const cs = (a >= level ? 1 : 0) | (b >= level ? 2 : 0) | (c >= level ? 4 : 0) | (d >= level ? 8 : 0);
      if (cs === 0 || cs === 15) continue;
      let pairs = CASES[cs]!;
      if (cs === 5 || cs === 10) {
        // the centre joins the two corners on its own side; the other two are cut off
        const centreAbove = (a + b + c + d) / 4 >= level;
        const acAbove = cs === 5;
        pairs = centreAbove === acAbove ? [[B, R], [L, T]] : [[L, B], [R, T]];
      }
      for (const [e0, e1] of pairs) add(side[e0]!, side[e1]!);
    }
  }
  // join: every edge carries at most two segment ends (the two cells beside it)
  const ends = new Map<number, number[]>();
  for (let s = 0; s < segs.length; s++) {
    const list = ends.get(segs[s]!);
    if (list) list.push(s);
    else ends.set(segs[s]!, [s]);
  }
  const used = new Uint8Array(segs.length / 2);
  const out: ContourPolyline[] = [];
  const walk = (startEnd: number): void => {
    // startEnd: index into segs of the end the line starts from
    const keys: number[] = [segs[startEnd]!];
    let end = startEnd;
    for (;;) {
      const seg = end >> 1;
      used[seg] = 1;
      const other = end ^ 1;
      const key = segs[other]!;
      keys.push(key);
      const next = (ends.get(key) ?? []).find((e) => e !== other && !used[e >> 1]);
      if (next === undefined) break;
      end = next;
    }
    const closed = keys.length > 2 && keys[0] === keys[keys.length - 1];
    out.push({ x: keys.map((k) => points.get(k)![0]), y: keys.map((k) => points.get(k)![1]), closed });
  };
  // open lines from their free ends first, then the closed loops
  for (const [, list] of ends) if (list.length === 1 && !used[list[0]! >> 1]) walk(list[0]!);
  for (let s = 0; s < used.length; s++) if (!used[s]) walk(2 * s);
  return out;
}
