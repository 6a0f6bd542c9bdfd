/**
 * Phase-current ripple of the switching model. Within a carrier period the current is its slowly
 * moving mean plus the ripple the switching states drive; the ripple of a period is taken as the
 * current less the straight line through its values at the period's ends, and its peak-to-peak
 * value as the largest less the smallest of that over the period's switching instants (between two
 * instants the current is smooth, nearly linear, so the extremes fall on the instants). The envelope
 * over the fundamental: the largest peak-to-peak value in each bin of the fundamental's angle.
 * Common practice (no source).
 */

/**
 * Peak-to-peak ripple of one carrier period from its boundary samples: times t[0..n) (the first at
 * the period's start, the last at its end) and currents i[offset + stride·j].
 */
export function periodRipple(t: ArrayLike<number>, i: ArrayLike<number>, n: number, stride = 1, offset = 0): number {
  if (n < 2) return 0;
  const ta = t[0]!, tb = t[n - 1]!;
  const ia = i[offset]!, ibb = i[offset + stride * (n - 1)]!;
  const slope = tb > ta ? (ibb - ia) / (tb - ta) : 0;
  let mx = -Infinity, mn = Infinity;
  for (let j = 0; j < n; j++) {
    const r = i[offset + stride * j]! - ia - slope * (t[j]! - ta);
    if (r > mx) mx = r;
    if (r < mn) mn = r;
  }
  return mx - mn;
}

/**
 * The envelope of the ripple over the fundamental: `bins` equal bins of the electrical angle
 * [0, 2 pi); each holds the largest peak-to-peak value of the periods whose angle falls in it (0 for
 * a bin no period fell in).
 */
export function rippleEnvelope(angle: ArrayLike<number>, p2p: ArrayLike<number>, n: number, bins: number): Float64Array {
  const out = new Float64Array(bins);
  const TWO_PI = 2 * Math.PI;
  for (let j = 0; j < n; j++) {
    let a = angle[j]! % TWO_PI;
    if (a < 0) a += TWO_PI;
    const b = Math.min(bins - 1, Math.floor((a / TWO_PI) * bins));
    if (p2p[j]! > out[b]!) out[b] = p2p[j]!;
  }
  return out;
}
