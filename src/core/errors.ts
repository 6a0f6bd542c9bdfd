/**
 * Bad input: carries the project path of the field and what is allowed.
 * Everything that faces a user (CLI, app) shows `message` alone, never a stack.
 */
export class InputError extends Error {
  readonly field: string;
  constructor(field: string, message: string) {
    super(`${field} ${message}`);
    this.name = 'InputError';
    this.field = field;
  }
}

export function isInputError(e: unknown): e is InputError {
  return e instanceof InputError;
}
