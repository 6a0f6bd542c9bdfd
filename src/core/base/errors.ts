/**
 * Bad input: carries the project path of the field and what is allowed.
 * Everything that faces a user (CLI, app) shows `message` alone, never a stack.
 * A file with several problems carries them all in `problems` (the first is `field` and `message`).
 */
export class InputError extends Error {
  readonly field: string;
  /** every problem found, in file order, each naming its field (at least the first) */
  readonly problems: ReadonlyArray<{ path: string; message: string }>;
  /** problems found beyond those listed (the list is bounded) */
  readonly moreProblems: number;
  constructor(field: string, message: string, problems?: ReadonlyArray<{ path: string; message: string }>, moreProblems = 0) {
    super(`${field} ${message}`);
    this.name = 'InputError';
    this.field = field;
    this.problems = problems && problems.length > 0 ? problems : [{ path: field, message }];
    this.moreProblems = moreProblems;
  }
}

export function isInputError(e: unknown): e is InputError {
  return e instanceof InputError;
}

/** Every problem of an InputError as lines "path message", with a last line for any beyond the bound. */
export function problemLines(e: InputError): string[] {
  const lines = e.problems.map((p) => `${p.path} ${p.message}`);
  if (e.moreProblems > 0) lines.push(`... and ${e.moreProblems} more problem${e.moreProblems > 1 ? 's' : ''} (fix these first)`);
  return lines;
}
