/**
 * The voltage error of the bridge (dead time and device drop) from the switching model's probe:
 * per carrier period each leg's actual mean voltage less its commanded mean (d Vdc); the phase
 * voltage's error is the leg's less the mean of the three (the common mode reaches no phase), and its
 * fundamental over whole fundamental periods is the voltage the drive loses. Murai, Watanabe and
 * Iwasaki (1987) give its amplitude for the dead time alone, (4/pi) Vdc td fsw, against the current.
 */
import { harmonicCoefficients } from '../mathematics/harmonics';

export interface VoltageError {
  /** peak amplitude of the fundamental of phase a's voltage error, V */
  fundamental_V: number;
  /** its cosine and sine coefficients, V (the error is a cos(wt) + b sin(wt) on the samples' time base) */
  a: number;
  b: number;
}

/**
 * The fundamental of phase a's voltage error from the legs' per-period mean voltage errors ea, eb, ec
 * (actual less commanded, V), n periods holding `cycles` whole fundamental periods.
 */
export function deadTimeVoltageError(ea: ArrayLike<number>, eb: ArrayLike<number>, ec: ArrayLike<number>, n: number, cycles: number): VoltageError {
  const e = new Float64Array(n);
  for (let j = 0; j < n; j++) e[j] = ea[j]! - (ea[j]! + eb[j]! + ec[j]!) / 3;
  const c = new Float64Array(2);
  harmonicCoefficients(e, n, cycles, 1, c);
  return { fundamental_V: Math.hypot(c[0]!, c[1]!), a: c[0]!, b: c[1]! };
}
