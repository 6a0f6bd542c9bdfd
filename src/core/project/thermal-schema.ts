/**
 * The `thermal` section of a project file: the motor's and the inverter's lumped thermal network,
 * resolved to ThermalNetworkSpec (machine/thermal-network-spec.ts).
 *
 *   winding node --windingToStator_K_per_W-- stator node --statorToCoolant_K_per_W-- coolant
 *   junction of one switch position --junctionToCoolant_K_per_W-- coolant
 *
 * A node is one lumped body at one temperature, with a heat capacity (J/K): the winding node is the
 * copper and its insulation, heated by the copper loss; the stator node is the lamination stack and
 * the housing, heated by the iron loss; the coolant (water jacket, or the ambient air of a
 * self-ventilated motor) is held at `coolantTemp_C`. The junction of one switch position has no heat
 * capacity here (steady at every instant) and is heated by one sixth of the inverter loss. The magnet
 * sits `magnetAboveStator_K` above the stator node. Limits: the winding's maximum (its insulation
 * class), the magnet's maximum (its grade), the junction's maximum; each above the coolant.
 * Each problem names its path, e.g. `thermal.windingCapacity_J_per_K must be > 0 J/K`.
 */
import { z } from 'zod';
import { keyDoc as doc, MAX_LIST_ENTRIES } from './schema-keys';

/** A finite number in [min, max] (or (min, max] with gtMin), documented from KEYS. */
function num(path: string, min: number, max: number, opts: { gtMin?: boolean } = {}) {
  const s = opts.gtMin ? z.number().gt(min) : z.number().gte(min);
  return s.lte(max).describe(doc(path));
}

/** Coolant temperatures, °C: as the conditions' temperatures. */
const COOLANT_MIN = -60;
const COOLANT_MAX = 250;
/** Highest temperature limit, °C (class 240 insulation, SmCo grades near 350 °C; common practice, no source). */
const LIMIT_MAX = 400;
/** Largest heat capacity, J/K, and thermal resistance, K/W: far beyond any drive, finite. */
const CAPACITY_MAX = 1e9;
const RESISTANCE_MAX = 1e3;

const bySpeedSchema = z
  .strictObject({
    speed_rpm: z.array(num('thermal.statorToCoolantBySpeed.speed_rpm[]', 0, 1e6)).min(2).max(MAX_LIST_ENTRIES).describe(doc('thermal.statorToCoolantBySpeed.speed_rpm')),
    K_per_W: z.array(num('thermal.statorToCoolantBySpeed.K_per_W[]', 0, RESISTANCE_MAX, { gtMin: true })).min(2).max(MAX_LIST_ENTRIES).describe(doc('thermal.statorToCoolantBySpeed.K_per_W')),
  })
  .superRefine((t, ctx) => {
    for (let k = 1; k < t.speed_rpm.length; k++) {
      if (!(t.speed_rpm[k]! > t.speed_rpm[k - 1]!)) {
        ctx.addIssue({ code: 'custom', path: ['speed_rpm', k], message: `must be > speed_rpm[${k - 1}] (${t.speed_rpm[k - 1]} rpm): the speeds must be strictly ascending` });
        break;
      }
    }
    if (t.K_per_W.length !== t.speed_rpm.length) {
      ctx.addIssue({ code: 'custom', path: ['K_per_W'], message: `has ${t.K_per_W.length} entries; it must have one per speed_rpm entry (${t.speed_rpm.length})` });
    }
  })
  .describe(doc('thermal.statorToCoolantBySpeed'));

export const thermalSchema = z
  .strictObject({
    coolantTemp_C: num('thermal.coolantTemp_C', COOLANT_MIN, COOLANT_MAX),
    windingCapacity_J_per_K: num('thermal.windingCapacity_J_per_K', 0, CAPACITY_MAX, { gtMin: true }),
    windingToStator_K_per_W: num('thermal.windingToStator_K_per_W', 0, RESISTANCE_MAX, { gtMin: true }),
    statorCapacity_J_per_K: num('thermal.statorCapacity_J_per_K', 0, CAPACITY_MAX, { gtMin: true }),
    statorToCoolant_K_per_W: num('thermal.statorToCoolant_K_per_W', 0, RESISTANCE_MAX, { gtMin: true }),
    statorToCoolantBySpeed: bySpeedSchema.optional(),
    magnetAboveStator_K: num('thermal.magnetAboveStator_K', -100, 200).default(0),
    windingMax_C: num('thermal.windingMax_C', COOLANT_MIN, LIMIT_MAX),
    magnetMax_C: num('thermal.magnetMax_C', COOLANT_MIN, LIMIT_MAX),
    junctionToCoolant_K_per_W: num('thermal.junctionToCoolant_K_per_W', 0, RESISTANCE_MAX, { gtMin: true }).optional(),
    junctionMax_C: num('thermal.junctionMax_C', COOLANT_MIN, LIMIT_MAX).optional(),
  })
  .superRefine((t, ctx) => {
    const bad = (path: string, message: string): void => ctx.addIssue({ code: 'custom', path: [path], message });
    if (typeof t.coolantTemp_C === 'number') {
      const c = t.coolantTemp_C;
      const above = (key: 'windingMax_C' | 'magnetMax_C' | 'junctionMax_C', what: string): void => {
        const v = t[key];
        if (typeof v === 'number' && !(v > c)) bad(key, `must be > thermal.coolantTemp_C (${c} °C): ${what} at or below the coolant can never be kept`);
      };
      above('windingMax_C', "the winding's limit");
      above('magnetMax_C', "the magnet's limit");
      above('junctionMax_C', "the junction's limit");
    }
    // the inverter is rated with both its resistance and its limit, or not at all
    if (t.junctionToCoolant_K_per_W !== undefined && t.junctionMax_C === undefined) {
      bad('junctionMax_C', 'is required when thermal.junctionToCoolant_K_per_W is given (the junction temperature limit of the switches, °C); or leave both out');
    }
    if (t.junctionMax_C !== undefined && t.junctionToCoolant_K_per_W === undefined) {
      bad('junctionToCoolant_K_per_W', 'is required when thermal.junctionMax_C is given (junction-to-coolant resistance of one switch position, K/W); or leave both out');
    }
  })
  .describe(doc('thermal'));

/** The `thermal` section with the schema's defaults filled in. */
export type ThermalSection = z.output<typeof thermalSchema>;

/**
 * A speed table of the thermal section longer than MAX_LIST_ENTRIES, found by its lengths alone,
 * before any entry is read.
 */
export function thermalCapProblem(json: unknown): { path: string; message: string } | null {
  const o = (x: unknown, k: string): unknown => (x !== null && typeof x === 'object' && !Array.isArray(x) ? (x as Record<string, unknown>)[k] : undefined);
  const t = o(o(json, 'thermal'), 'statorToCoolantBySpeed');
  for (const key of ['speed_rpm', 'K_per_W']) {
    const x = o(t, key);
    if (Array.isArray(x) && x.length > MAX_LIST_ENTRIES) return { path: `thermal.statorToCoolantBySpeed.${key}`, message: `must have at most ${MAX_LIST_ENTRIES} entries (it has ${x.length})` };
  }
  return null;
}
