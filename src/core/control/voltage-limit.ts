/**
 * The controller's voltage limit: hold a dq voltage command to the modulation's limit (a circle, or
 * the bridge's hexagon; see drive/inverter.ts modulationLimit) with d-axis priority.
 */
import { hexagonRadius } from '../drive/inverter';
import type { ModulationLimit } from '../drive/inverter';

/** The limit a controller holds its voltage to (drive/inverter.ts `modulationLimit`). */
export type VoltageLimitSpec = ModulationLimit;

/**
 * Limit (vd, vq) to the modulation limit with d-axis priority. `theta` is the electrical angle at
 * which the vector will be applied (its d axis direction in the alpha-beta plane). Writes out[0..1];
 * returns true when the vector was changed.
 */
export function limitVoltageDq(spec: VoltageLimitSpec, vd: number, vq: number, theta: number, out: Float64Array): boolean {
  if (spec.shape === 'circle') {
    const R = spec.radius;
    if (vd * vd + vq * vq <= R * R) {
      out[0] = vd; out[1] = vq;
      return false;
    }
    const d = vd > R ? R : vd < -R ? -R : vd;
    const qm = Math.sqrt(Math.max(0, R * R - d * d));
    out[0] = d;
    out[1] = vq > qm ? qm : vq < -qm ? -qm : vq;
    return true;
  }
  // hexagon: |n_k · v| <= h for the edge normals n_k at 30°, 90°, 150° (alpha-beta), h = Vdc/sqrt(3)
  const h = spec.radius;
  const rd = hexagonRadius(spec.Vdc, theta);
  const d = vd > rd ? rd : vd < -rd ? -rd : vd;
  let qLo = -Infinity;
  let qHi = Infinity;
  for (let k = 0; k < 3; k++) {
    const phi = Math.PI / 6 + (k * Math.PI) / 3 - theta;
    const c = Math.cos(phi);
    const s = Math.sin(phi);
    // h >= |d c + q s|
    if (Math.abs(s) < 1e-12) continue;
    const a = (-h - d * c) / s;
    const b = (h - d * c) / s;
    const lo = a < b ? a : b;
    const hi = a < b ? b : a;
    if (lo > qLo) qLo = lo;
    if (hi < qHi) qHi = hi;
  }
  if (qLo > qHi) qLo = qHi = 0.5 * (qLo + qHi);
  const q = vq > qHi ? qHi : vq < qLo ? qLo : vq;
  out[0] = d;
  out[1] = q;
  return d !== vd || q !== vq;
}

/** Largest length of an alpha-beta vector at this angle, V. */
export function voltageLimitAt(spec: VoltageLimitSpec, angle: number): number {
  return spec.shape === 'circle' ? spec.radius : hexagonRadius(spec.Vdc, angle);
}

