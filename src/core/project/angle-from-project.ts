/**
 * The angle source of a project (../control/angle-spec.ts) for the simulator, from its control
 * section (schema defaults; `control.angle` absent = the true angle and speed, "ideal") and the
 * motor's pole pairs: a resolver's pole pairs must divide the motor's (its angle then gives the
 * motor's electrical angle without ambiguity).
 */
import { InputError } from '../base/errors';
import type { AngleSpec } from '../control/angle-spec';
import { angleSchema } from './angle-schema';
import { problemsOf } from './schema-problems';
import { PARSE_OPTIONS } from './schema';

export function angleFromProject(control: { angle?: AngleSpec | undefined } | undefined, motorPolePairs: number): AngleSpec {
  const a = control?.angle;
  if (a === undefined) return { source: 'ideal' };
  const r = angleSchema.safeParse(a, PARSE_OPTIONS); // a section changed after parsing (overrides) is checked as the file is
  if (!r.success) {
    const issues = r.error.issues.map((iss) => ({ ...iss, path: ['control', 'angle', ...iss.path] }));
    const first = problemsOf(issues, { control: { angle: a } })[0]!;
    throw new InputError(first.path, first.message);
  }
  const spec = r.data;
  if (spec.source === 'resolver') {
    const pr = spec.polePairs ?? 1;
    if (motorPolePairs % pr !== 0) throw new InputError('control.angle.polePairs', `must divide the motor's pole pairs (${motorPolePairs}): the resolver's angle must give the motor's electrical angle`);
  }
  return spec;
}
