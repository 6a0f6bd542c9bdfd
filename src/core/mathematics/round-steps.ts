/**
 * Round steps of the 1-2-5 series (…, 0.5, 1, 2, 5, 10, 20, …) for plot ticks and table rows:
 * the smallest such step that divides a span into at most `maxCount` intervals.
 */

/** Smallest 1-2-5 step s with span / s <= maxCount (span > 0, finite; maxCount >= 1). */
export function roundStep(span: number, maxCount: number): number {
  if (!(Number.isFinite(span) && span > 0) || !(maxCount >= 1)) return 1;
  const raw = span / maxCount;
  const decade = Math.pow(10, Math.floor(Math.log10(raw)));
  for (const m of [1, 2, 5, 10]) {
    const s = m * decade;
    // a hair of tolerance: 1000/10 must give 100, not 200
    if (s >= raw * (1 - 1e-12)) return s;
  }
  return 10 * decade;
}

/** The multiples of `step` within [lo, hi] (lo <= hi), each rounded to the step's own decimals. */
export function stepsWithin(lo: number, hi: number, step: number): number[] {
  if (!(step > 0) || !Number.isFinite(lo) || !Number.isFinite(hi) || hi < lo) return [];
  const decimals = Math.max(0, -Math.floor(Math.log10(step)) + 1);
  const out: number[] = [];
  const first = Math.ceil(lo / step - 1e-9);
  const last = Math.floor(hi / step + 1e-9);
  for (let k = first; k <= last && out.length < 10_000; k++) out.push(Number((k * step).toFixed(decimals)));
  return out;
}

/** Round axis ticks covering [lo, hi] with at most about `maxCount` intervals: the ticks and the padded range they span. */
export function roundTicks(lo: number, hi: number, maxCount = 6): { ticks: number[]; min: number; max: number; step: number } {
  let a = Math.min(lo, hi);
  let b = Math.max(lo, hi);
  if (!Number.isFinite(a) || !Number.isFinite(b)) { a = 0; b = 1; }
  if (b - a === 0) { const d = Math.abs(a) || 1; a -= d / 2; b += d / 2; }
  const step = roundStep(b - a, maxCount);
  const min = Math.floor(a / step + 1e-9) * step;
  const max = Math.ceil(b / step - 1e-9) * step;
  return { ticks: stepsWithin(min, max, step), min, max, step };
}
