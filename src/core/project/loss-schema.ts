/**
 * The `losses` section of a project file: the coefficients of the motor's iron loss
 * (P_fe = kh f psi^beta + ke f^2 psi^2), of windage (kw w^3) and of the inverter's switches and
 * diodes (on-state drops and resistances, switching energies at a reference voltage and current,
 * switching frequency). Every coefficient may be left out, and a loss whose coefficient is absent
 * is zero: each absent coefficient is 0 by the schema's default, beta is 2 when absent. The
 * reference voltage, current and switching frequency have no default and are required only when a
 * switching energy is above zero. Each problem names its path (e.g. `losses.iron.kh must be >= 0`).
 */
import { z } from 'zod';
import { keyDoc as doc } from './schema-keys';

/** A finite number in [min, max] (or (min, max] with gtMin), documented from KEYS. */
function num(path: string, min: number, max: number, opts: { gtMin?: boolean } = {}) {
  const s = opts.gtMin ? z.number().gt(min) : z.number().gte(min);
  return s.lte(max).describe(doc(path));
}

/** The Steinmetz exponent of the flux linkage when the file gives none. */
export const DEFAULT_IRON_BETA = 2;

const ironSchema = z
  .strictObject({
    kh: num('losses.iron.kh', 0, 1e9).default(0),
    beta: num('losses.iron.beta', 1, 3).default(DEFAULT_IRON_BETA),
    ke: num('losses.iron.ke', 0, 1e6).default(0),
  })
  .describe(doc('losses.iron'));

const windageSchema = z
  .strictObject({
    kw: num('losses.windage.kw', 0, 1).default(0),
  })
  .describe(doc('losses.windage'));

const inverterLossSchema = z
  .strictObject({
    Vce0: num('losses.inverter.Vce0', 0, 10).default(0),
    rce: num('losses.inverter.rce', 0, 100).default(0),
    Vf0: num('losses.inverter.Vf0', 0, 10).default(0),
    rd: num('losses.inverter.rd', 0, 100).default(0),
    EonEoff_J: num('losses.inverter.EonEoff_J', 0, 100).default(0),
    Err_J: num('losses.inverter.Err_J', 0, 100).default(0),
    Vref_V: num('losses.inverter.Vref_V', 0, 1e5, { gtMin: true }).optional(),
    Iref_A: num('losses.inverter.Iref_A', 0, 1e6, { gtMin: true }).optional(),
    fsw_Hz: num('losses.inverter.fsw_Hz', 0, 1e6, { gtMin: true }).optional(),
  })
  .superRefine((s, ctx) => {
    // a switching energy is scaled from its reference voltage and current at the switching frequency
    if (!(s.EonEoff_J > 0 || s.Err_J > 0)) return;
    const given = s.EonEoff_J > 0 ? 'losses.inverter.EonEoff_J' : 'losses.inverter.Err_J';
    const need: readonly [keyof typeof s, string][] = [
      ['Vref_V', 'the DC voltage the switching energies were measured at, in V'],
      ['Iref_A', 'the current the switching energies were measured at, in A peak'],
      ['fsw_Hz', 'the switching frequency, in Hz'],
    ];
    for (const [key, what] of need) {
      if (s[key] === undefined) ctx.addIssue({ code: 'custom', path: [key], message: `is required when ${given} is above 0 (${what})` });
    }
  })
  .describe(doc('losses.inverter'));

export const lossesSchema = z
  .strictObject({
    iron: ironSchema.optional(),
    windage: windageSchema.optional(),
    inverter: inverterLossSchema.optional(),
  })
  .describe(doc('losses'));

/** The `losses` section with the schema's defaults filled in (an absent part: that loss is zero). */
export type LossesSection = z.output<typeof lossesSchema>;
export type IronLossSection = z.output<typeof ironSchema>;
export type WindageSection = z.output<typeof windageSchema>;
export type InverterLossSection = z.output<typeof inverterLossSchema>;
