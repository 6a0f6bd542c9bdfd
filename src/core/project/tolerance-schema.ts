/**
 * The `tolerances` section of a project file: a band per parameter, keyed by the parameter's path,
 * and the Monte Carlo settings.
 *
 *   "tolerances": {
 *     "motor.psiM": { "minus_pct": 5, "plus_pct": 5 },   // a band in percent of the nominal value
 *     "inverter.Vdc": { "min": 300, "max": 400 },         // or absolute ends, in the parameter's unit
 *     "monteCarlo": { "samples": 1000, "seed": 1, "distribution": "uniform", "sigmaOfBand": 0.33 }
 *   }
 *
 * The parameters a band may name (TOLERANCE_PATHS), each only where the file has it:
 * - a motor section with constant terms: motor.Rs, motor.psiM, motor.Ld, motor.Lq;
 * - a motor section with a flux map: motor.Rs, motor.fluxMap.magnetFlux (psi_d at zero current of the
 *   map as given, Wb: the whole psi_d table is shifted by the change, as a magnet temperature shifts
 *   it) and motor.fluxMap.scale (1 nominal: the current-dependent part of the flux linkages,
 *   psi_d - psi_d(0, 0) and psi_q, is multiplied by it, i.e. every inductance of the map scaled);
 * - a nameplate section: nameplate.R, nameplate.Ke, nameplate.Kt, nameplate.L, nameplate.Ld,
 *   nameplate.Lq (the band applies to the term's value, in its stated unit and basis);
 * - always: inverter.Vdc, inverter.Imax; with a thermal section: thermal.coolantTemp_C.
 * Any other key is refused, naming it and listing the keys allowed for this file.
 */
import { z } from 'zod';
import { keyDoc as doc } from './schema-keys';

/** Every parameter path a band may name (which of them a file may use depends on its motor form). */
export const TOLERANCE_PATHS = [
  'motor.Rs', 'motor.psiM', 'motor.Ld', 'motor.Lq', 'motor.fluxMap.magnetFlux', 'motor.fluxMap.scale',
  'nameplate.R', 'nameplate.Ke', 'nameplate.Kt', 'nameplate.L', 'nameplate.Ld', 'nameplate.Lq',
  'inverter.Vdc', 'inverter.Imax', 'thermal.coolantTemp_C',
] as const;
export type TolerancePath = (typeof TOLERANCE_PATHS)[number];

/** Most samples of one Monte Carlo run. */
export const MAX_MONTE_CARLO_SAMPLES = 1_000_000;

const pct = (max: number, what: string) => z.number().gte(0).lte(max).describe(`${what}, % of the nominal value, 0 to ${max}`);
const bandSchema = (path: string) =>
  z.union([
    z.strictObject({ minus_pct: pct(99.9, 'below'), plus_pct: pct(1000, 'above') }),
    z.strictObject({ min: z.number().describe('lower end, in the parameter\'s unit'), max: z.number().describe('upper end, in the parameter\'s unit') })
      .refine((b) => !(b.min > b.max), { message: 'min must be <= max', path: ['max'] }),
  ]).describe(doc(path));

const monteCarloSchema = z
  .strictObject({
    samples: z.number().int().gte(1).lte(MAX_MONTE_CARLO_SAMPLES).default(1000).describe(doc('tolerances.monteCarlo.samples')),
    seed: z.number().int().gte(0).lte(0xffffffff).default(1).describe(doc('tolerances.monteCarlo.seed')),
    distribution: z.enum(['uniform', 'normal']).default('uniform').describe(doc('tolerances.monteCarlo.distribution')),
    sigmaOfBand: z.number().gt(0).lte(10).default(0.33).describe(doc('tolerances.monteCarlo.sigmaOfBand')),
  })
  .describe(doc('tolerances.monteCarlo'));

const shape: Record<string, z.ZodType> = {};
for (const p of TOLERANCE_PATHS) shape[p] = bandSchema(`tolerances.${p}`).optional();
shape['monteCarlo'] = monteCarloSchema.default({ samples: 1000, seed: 1, distribution: 'uniform', sigmaOfBand: 0.33 });

export const tolerancesSchema = z
  .looseObject(shape)
  .superRefine((t, ctx) => {
    const known = new Set<string>([...TOLERANCE_PATHS, 'monteCarlo']);
    for (const k of Object.keys(t)) {
      if (known.has(k)) continue;
      const shown = k.length > 60 ? `${k.slice(0, 40)}… (${k.length} characters)` : k;
      ctx.addIssue({ code: 'custom', path: [shown], message: `is not a parameter a tolerance may name (allowed: ${TOLERANCE_PATHS.join(', ')}; and monteCarlo)` });
    }
  })
  .describe(doc('tolerances'));

/** A band: percent of the nominal value, or absolute ends in the parameter's unit. */
export type ToleranceBand = { minus_pct: number; plus_pct: number } | { min: number; max: number };
export interface MonteCarloSettings {
  samples: number;
  seed: number;
  distribution: 'uniform' | 'normal';
  sigmaOfBand: number;
}
/** The section as the schema gives it: bands by path (in the file's order) and the Monte Carlo settings. */
export type TolerancesSection = { [K in TolerancePath]?: ToleranceBand } & { monteCarlo: MonteCarloSettings };

/** The keys a file of this form may give a band (the form of its motor, whether it has a thermal section). */
export function allowedTolerancePaths(file: { motor?: { fluxMap?: unknown }; nameplate?: { Ke?: unknown; Kt?: unknown; L?: unknown; Ld?: unknown; Lq?: unknown }; thermal?: unknown }): TolerancePath[] {
  const out: TolerancePath[] = [];
  if (file.motor !== undefined) {
    out.push('motor.Rs');
    if (file.motor.fluxMap !== undefined) out.push('motor.fluxMap.magnetFlux', 'motor.fluxMap.scale');
    else out.push('motor.psiM', 'motor.Ld', 'motor.Lq');
  } else if (file.nameplate !== undefined) {
    const np = file.nameplate;
    out.push('nameplate.R');
    for (const k of ['Ke', 'Kt', 'L', 'Ld', 'Lq'] as const) if (np[k] !== undefined) out.push(`nameplate.${k}`);
  }
  out.push('inverter.Vdc', 'inverter.Imax');
  if (file.thermal !== undefined) out.push('thermal.coolantTemp_C');
  return out;
}

/**
 * The bands a file gives that its form does not allow, each naming the key and the allowed ones: a
 * warning at resolution (project.ts), not a refusal, so that switching the motor between datasheet and
 * model terms or switching the thermal section off keeps the file usable; such a band is left out of
 * corners and samples (tolerance-apply.ts) until the file has the parameter again.
 */
export function toleranceChoiceProblems(file: Parameters<typeof allowedTolerancePaths>[0] & { tolerances?: Record<string, unknown> }): Array<{ key: string; message: string }> {
  const t = file.tolerances;
  if (t === undefined) return [];
  const allowed = allowedTolerancePaths(file);
  const out: Array<{ key: string; message: string }> = [];
  for (const k of Object.keys(t)) {
    if (k === 'monteCarlo' || t[k] === undefined || !(TOLERANCE_PATHS as readonly string[]).includes(k)) continue;
    if (!(allowed as string[]).includes(k)) out.push({ key: k, message: `names a parameter this file does not have, so corners and samples leave it out (allowed for this file: ${allowed.join(', ')})` });
  }
  return out;
}
