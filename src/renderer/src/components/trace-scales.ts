// Pure helpers of the load-step traces: the speed error (reference minus speed), the range its axis
// zooms to so a load step's dip reads on a run of thousands of rpm, and figures rounded to the
// digits that mean something.

/** reference minus speed, rpm, sample by sample */
export function speedError(ref: Float64Array, speed: Float64Array): Float64Array {
  const n = Math.min(ref.length, speed.length);
  const e = new Float64Array(n);
  for (let k = 0; k < n; k++) e[k] = ref[k]! - speed[k]!;
  return e;
}

/**
 * The speed-error axis range: around the load steps' dips (from a little below zero to 1.4 times the
 * largest dip), so the speed step's large error runs off the top and the dips fill the plot. Without
 * a settled load step, null (the axis ranges itself).
 */
export function speedErrorRange(loadSteps: ReadonlyArray<{ dip_rpm: number | null }>): [number, number] | null {
  let dip = 0;
  for (const l of loadSteps) if (l.dip_rpm !== null && Number.isFinite(l.dip_rpm)) dip = Math.max(dip, Math.abs(l.dip_rpm));
  if (!(dip > 0)) return null;
  return [-0.4 * dip, 1.4 * dip];
}

/** A speed in rpm: whole rpm from 100 rpm up, else 0.1 rpm (never 2999.87). */
export const rpmText = (v: number): string => (Math.abs(v) >= 100 ? v.toFixed(0) : Math.abs(v) >= 1 ? v.toFixed(1) : v.toPrecision(2));

/** Three significant digits, no exponent for ordinary sizes (12.3, 0.0456, 1230). */
export function sig3(v: number): string {
  if (!Number.isFinite(v)) return '–';
  if (v === 0) return '0';
  const a = Math.abs(v);
  if (a >= 1000) return v.toFixed(0);
  return String(Number(v.toPrecision(3)));
}
