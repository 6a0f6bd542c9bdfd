// Bad input carries the field's path and what is allowed; everything facing a user shows the message alone.
import { describe, expect, it } from 'vitest';
import { InputError, isInputError } from '../src/core/base/errors';

describe('InputError', () => {
  it('reads as "<field> <what is allowed>" and keeps the field apart', () => {
    const e = new InputError('motor.Ld', 'must be >= 1e-9 H');
    expect(e.message).toBe('motor.Ld must be >= 1e-9 H');
    expect(e.field).toBe('motor.Ld');
    expect(e.name).toBe('InputError');
    expect(e).toBeInstanceOf(Error);
  });

  it('is told apart from other errors', () => {
    expect(isInputError(new InputError('x', 'y'))).toBe(true);
    expect(isInputError(new Error('x y'))).toBe(false);
    expect(isInputError({ field: 'x', message: 'x y' })).toBe(false);
    expect(isInputError(null)).toBe(false);
  });
});
