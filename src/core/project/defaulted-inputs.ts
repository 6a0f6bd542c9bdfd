/**
 * Inputs the file leaves out that the results still depend on, said as findings: the magnet
 * temperature of the hot corner and the magnet's remanence coefficient take the schema's defaults
 * (20 °C, -0.0012 /K) when absent, and both move the torque and the back-EMF. Read from the file
 * as written (before the schema fills the defaults).
 */
import type { Finding } from '../base/finding';
import { defaultConditions } from './schema';

const isObject = (x: unknown): x is Record<string, unknown> => typeof x === 'object' && x !== null && !Array.isArray(x);

export function defaultedInputFindings(json: unknown): Finding[] {
  if (!isObject(json)) return [];
  const c = json['conditions'];
  // no conditions at all: one finding of the resolution says every temperature is 20 °C (and the
  // remanence coefficient then changes nothing)
  if (!isObject(c)) return [];
  const cond = c;
  const out: Finding[] = [];
  const d = defaultConditions();
  if (cond['magnetTemp_C'] === undefined) {
    out.push({
      code: 'magnet-temp-assumed',
      severity: 'info',
      field: 'conditions.magnetTemp_C',
      message: `No hot magnet temperature given: the hot corner takes the magnet at ${d.magnetTemp_C} °C, the strongest magnet of a warm machine, so torque per ampere is overstated. Give the magnet temperature at the duty you check.`,
    });
  }
  if (cond['magnetTempCoeff'] === undefined) {
    out.push({
      code: 'magnet-coeff-assumed',
      severity: 'info',
      field: 'conditions.magnetTempCoeff',
      message: `No remanence coefficient given: ${d.magnetTempCoeff} /K (sintered NdFeB) is assumed; a bonded or SmCo magnet differs (SmCo about -0.0004 /K). Take it from the magnet grade.`,
    });
  }
  return out;
}
