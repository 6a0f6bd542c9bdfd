/**
 * A project's named variants (the `variants` section, variant-schema.ts) as projects of their own:
 * the file with each variant's overrides set at their parameter paths, then loaded the one way every
 * project is (loadProjectJson). The file itself is never changed: only the containers along an
 * overridden path are copied, so a variant of a file with a long duty cycle costs no copy of it.
 */
import { InputError, isInputError } from '../base/errors';
import { loadProjectJson, type ResolvedProject } from './project';
import { overridePathProblem } from './variant-schema';

/** One variant resolved: its name and its project. */
export interface ResolvedVariant {
  name: string;
  project: ResolvedProject;
}

type Json = Record<string, unknown> | unknown[];
const isContainer = (x: unknown): x is Json => typeof x === 'object' && x !== null;

/** "requirements[1].torque_Nm" -> ["requirements", 1, "torque_Nm"] */
function pathTokens(path: string): Array<string | number> {
  const out: Array<string | number> = [];
  for (const part of path.replace(/\[(\d+)\]/g, '.$1').split('.')) out.push(/^\d+$/.test(part) ? Number(part) : part);
  return out;
}

/**
 * The parsed file `json` with `overrides` (parameter path -> value) set, as a new object (the
 * containers along each path copied, the rest shared). `where` names the overrides in a refusal
 * (e.g. `variants[0].overrides`). Refused, naming the path: a path that is no parameter of the file
 * format, or whose section or list entry the file does not have.
 */
export function applyOverrides(json: Record<string, unknown>, overrides: Record<string, unknown>, where: string): Record<string, unknown> {
  const root: Record<string, unknown> = { ...json };
  for (const [path, value] of Object.entries(overrides)) {
    const why = overridePathProblem(path);
    if (why !== null) throw new InputError(`${where}.${path}`, why);
    const tokens = pathTokens(path);
    let node: Json = root;
    for (let k = 0; k < tokens.length - 1; k++) {
      const t = tokens[k]!;
      const child: unknown = (node as Record<string | number, unknown>)[t];
      if (!isContainer(child) || (typeof t === 'number' && !Array.isArray(node))) {
        const have = tokens.slice(0, k + 1).map((x) => (typeof x === 'number' ? `[${x}]` : x)).join('.').replace(/\.\[/g, '[');
        throw new InputError(`${where}.${path}`, `names ${have}, which the file does not have (give it in the file, then override it)`);
      }
      const copy: Json = Array.isArray(child) ? child.slice() : { ...child };
      (node as Record<string | number, unknown>)[t] = copy;
      node = copy;
    }
    const last = tokens[tokens.length - 1]!;
    if (typeof last === 'number' && (!Array.isArray(node) || last >= node.length)) {
      throw new InputError(`${where}.${path}`, `names entry ${last} of a list of ${Array.isArray(node) ? node.length : 0} (a variant changes entries, it adds none)`);
    }
    (node as Record<string | number, unknown>)[last] = value;
  }
  return root;
}

/** The problem paths of a variant's refusal, named from the variant: its override when the problem is at one, else the variant. */
function variantRefusal(e: InputError, i: number, name: string, overrides: Record<string, unknown>): InputError {
  const problems = e.problems.map((p) => {
    const dotted = p.path.replace(/\[(\d+)\]/g, '.$1');
    const k = Object.keys(overrides).find((o) => o.replace(/\[(\d+)\]/g, '.$1') === dotted);
    return k !== undefined
      ? { path: `variants[${i}].overrides.${k}`, message: `(variant '${name}') ${p.message}` }
      : { path: `variants[${i}]`, message: `(variant '${name}') makes ${p.path} ${p.message}` };
  });
  return new InputError(problems[0]!.path, problems[0]!.message, problems, e.moreProblems);
}

/**
 * Every named variant of a parsed, valid project file (its `variants` section; none without one),
 * each loaded as a project: the file without the section, the variant's overrides set. A variant
 * that makes the file invalid is refused naming the variant and the override (or the field).
 */
export function resolveVariants(json: Record<string, unknown>): ResolvedVariant[] {
  const list = json['variants'];
  if (!Array.isArray(list)) return [];
  const { variants: _omit, ...base } = json;
  void _omit;
  return list.map((v: { name: string; overrides: Record<string, unknown> }, i) => {
    const where = `variants[${i}].overrides`;
    const file = applyOverrides(base, v.overrides, where);
    try {
      return { name: v.name, project: loadProjectJson(file).resolved };
    } catch (e) {
      if (isInputError(e)) throw variantRefusal(e, i, v.name, v.overrides);
      throw e;
    }
  });
}
