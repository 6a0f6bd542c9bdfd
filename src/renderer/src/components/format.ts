// Number formatting for screens: speeds in rpm, currents peak and rms both, labelled.
import { RAD_S_TO_RPM, SQRT2 } from '../../../core/base/units';

/** 4 significant digits, plain notation for ordinary magnitudes. */
export function num(x: number | null | undefined, digits = 4): string {
  if (x === null || x === undefined || !Number.isFinite(x)) return '–';
  if (x === 0) return '0';
  const a = Math.abs(x);
  if (a >= 1e-3 && a < 1e7) return String(Number(x.toPrecision(digits)));
  return x.toExponential(digits - 1);
}

/** Fixed decimals for tables. */
export const fixed = (x: number | null | undefined, d = 1): string =>
  x === null || x === undefined || !Number.isFinite(x) ? '–' : x.toFixed(d);

export const rpm = (w: number | null | undefined): string =>
  w === null || w === undefined || !Number.isFinite(w) ? '–' : `${Math.round(w * RAD_S_TO_RPM)} rpm`;

/** "141.4 A peak (100 A rms)" */
export const amps = (peak: number | null | undefined): string =>
  peak === null || peak === undefined || !Number.isFinite(peak) ? '–' : `${num(peak)} A peak (${num(peak / SQRT2)} A rms)`;

export const ampsRms = (peak: number): string => `${num(peak / SQRT2)} A rms`;
