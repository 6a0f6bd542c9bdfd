/**
 * A refusal of one of several project files names the file: every problem's path is prefixed with
 * the file's name as given (`b.json: motor.psiM must be >= 0 Wb`), so a command that reads several
 * files (compare) says which one is wrong.
 */
import { InputError, isInputError } from '../core/base/errors';
import { visible } from './terminal';

/** The InputError `e` with every problem's path prefixed by `file`. */
export function fileRefusal(e: InputError, file: string): InputError {
  const problems = e.problems.map((p) => ({ path: `${visible(file)}: ${p.path}`, message: p.message }));
  return new InputError(problems[0]!.path, problems[0]!.message, problems, e.moreProblems);
}

/** Runs `f`, naming `file` in any InputError it throws. */
export function inFile<T>(file: string, f: () => T): T {
  try {
    return f();
  } catch (e) {
    if (isInputError(e)) throw fileRefusal(e, file);
    throw e;
  }
}
