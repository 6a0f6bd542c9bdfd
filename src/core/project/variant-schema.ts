/**
 * The `variants` section of a project file: named design variants of the file, each the file with
 * some parameters overridden, `[{ "name": "...", "overrides": { "<parameter path>": value } }]`.
 * A path is a key of the project file as KEYS documents it (e.g. `motor.psiM`, `inverter.Vdc`,
 * `requirements[1].torque_Nm`); an unknown path, or one naming the file's header or the variants
 * themselves, is refused naming it. What a value may be is the schema's business: the variant is
 * validated as a whole file once its overrides are applied (variant-overrides.ts).
 */
import { z } from 'zod';
import { KEYS, keyDoc as doc } from './schema-keys';

/** Most variants one file names (a comparison is read side by side: a handful). */
export const MAX_VARIANTS = 20;
/** Most overrides one variant gives. */
export const MAX_OVERRIDES = 200;

/** Keys no variant may override: the header, the name (the variant's own name is its name), the variants. */
const FIXED = new Set(['format', 'version', 'name', 'variants']);

/** "requirements[1].torque_Nm" or "requirements.1.torque_Nm" -> its KEYS pattern "requirements[].torque_Nm". */
export function overridePattern(path: string): string {
  return path.replace(/\[\d+\]/g, '[]').replace(/\.(\d+)(?=\.|$)/g, '[]');
}

/** Why a parameter path cannot be overridden, or null when it can. */
export function overridePathProblem(path: string): string | null {
  if (!/^[A-Za-z][A-Za-z0-9_]*((\.[A-Za-z][A-Za-z0-9_]*)|(\[\d+\])|(\.\d+))*$/.test(path)) return 'is not a parameter path (dotted keys, list entries as [n], e.g. motor.psiM or requirements[0].torque_Nm)';
  const pattern = overridePattern(path);
  const top = pattern.split(/[.[]/)[0]!;
  if (FIXED.has(top)) return `cannot be overridden by a variant (${[...FIXED].join(', ')} are fixed)`;
  if (KEYS[pattern] === undefined) return 'is not a parameter of the project file (see the file format: e.g. motor.psiM, inverter.Vdc, conditions.magnetTemp_C)';
  return null;
}

const variantSchema = z
  .strictObject({
    name: z.string().min(1).max(200).describe(doc('variants[].name')),
    overrides: z.record(z.string(), z.unknown()).describe(doc('variants[].overrides')),
  })
  .superRefine((v, ctx) => {
    const keys = Object.keys(v.overrides);
    if (keys.length > MAX_OVERRIDES) {
      ctx.addIssue({ code: 'custom', path: ['overrides'], message: `must have at most ${MAX_OVERRIDES} entries (it has ${keys.length})` });
      return;
    }
    for (const k of keys) {
      const why = overridePathProblem(k);
      if (why !== null) ctx.addIssue({ code: 'custom', path: ['overrides', k], message: why });
      else if (v.overrides[k] === undefined || v.overrides[k] === null) ctx.addIssue({ code: 'custom', path: ['overrides', k], message: 'needs a value' });
    }
  });

export const variantsSchema = z
  .array(variantSchema)
  .max(MAX_VARIANTS)
  .superRefine((vs, ctx) => {
    const seen = new Set<string>();
    vs.forEach((v, i) => {
      if (typeof v?.name !== 'string') return;
      if (seen.has(v.name)) ctx.addIssue({ code: 'custom', path: [i, 'name'], message: `'${v.name}' is the name of an earlier variant; give each variant its own name` });
      seen.add(v.name);
    });
  })
  .describe(doc('variants'));

export type VariantsSection = z.output<typeof variantsSchema>;
