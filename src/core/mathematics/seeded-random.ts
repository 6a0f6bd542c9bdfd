/**
 * Seeded random numbers for reproducible sampling: a small 32-bit generator (mulberry32) whose state
 * for draw set n is mixed from (seed, n) alone, so that a sample's numbers do not depend on how the
 * samples are split between threads or in what order they are drawn. Uniform numbers in [0, 1) and
 * normal numbers truncated to an interval (by rejection). The generator's state lives in the object a
 * run creates: nothing at module level.
 */

/** The finaliser of the 32-bit MurmurHash3: a bijection on 32-bit words that spreads every input bit. */
export function mix32(x: number): number {
  x ^= x >>> 16;
  x = Math.imul(x, 0x85ebca6b);
  x ^= x >>> 13;
  x = Math.imul(x, 0xc2b2ae35);
  x ^= x >>> 16;
  return x >>> 0;
}

export interface SeededRandom {
  /** the next uniform number in [0, 1) */
  next(): number;
}

/** A mulberry32 generator from a 32-bit state. */
export function mulberry32(state: number): SeededRandom {
  let a = state | 0;
  return {
    next(): number {
      a = (a + 0x6d2b79f5) | 0;
      let t = Math.imul(a ^ (a >>> 15), 1 | a);
      t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
      return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
    },
  };
}

/** The generator of draw set `index` (a sample) under `seed`: its state depends on the pair alone. */
export function randomFor(seed: number, index: number): SeededRandom {
  return mulberry32(mix32((seed >>> 0) ^ mix32((index + 0x9e3779b9) >>> 0)) ^ mix32(Math.floor(index / 4294967296) + 0x7f4a7c15));
}

/** A standard normal number (Box–Muller, one of the pair). */
export function standardNormal(r: SeededRandom): number {
  let u = r.next();
  while (u <= 0) u = r.next();
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * r.next());
}

/**
 * A normal number of mean `mean` and standard deviation `sigma` truncated to [lo, hi] by rejection
 * (redrawn until inside; after 10000 rejections, a uniform number in the interval). lo = hi gives lo.
 */
export function truncatedNormal(r: SeededRandom, mean: number, sigma: number, lo: number, hi: number): number {
  if (!(hi > lo)) return lo;
  if (!(sigma > 0)) return Math.min(hi, Math.max(lo, mean));
  for (let k = 0; k < 10000; k++) {
    const x = mean + sigma * standardNormal(r);
    if (x >= lo && x <= hi) return x;
  }
  return lo + (hi - lo) * r.next();
}
