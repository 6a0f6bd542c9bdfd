import { describe, expect, it } from 'vitest';
import { InputError, problemLines } from '../src/core/base/errors';
import { fileRefusal, inFile } from '../src/cli/file-refusal';

describe('a refusal of one of several files names the file', () => {
  it('prefixes every problem path with the file and keeps the messages and the count beyond the list (common practice (no source))', () => {
    const e = new InputError('motor.psiM', 'must be >= 0 Wb', [{ path: 'motor.psiM', message: 'must be >= 0 Wb' }, { path: 'inverter.Vdc', message: 'must be > 0 V' }], 3);
    const f = fileRefusal(e, 'dir/b.json');
    expect(f.field).toBe('dir/b.json: motor.psiM');
    expect(problemLines(f)).toEqual(['dir/b.json: motor.psiM must be >= 0 Wb', 'dir/b.json: inverter.Vdc must be > 0 V', '... and 3 more problems (fix these first)']);
  });

  it('inFile passes results and other errors through unchanged', () => {
    expect(inFile('a.json', () => 7)).toBe(7);
    expect(() => inFile('a.json', () => { throw new RangeError('x'); })).toThrow(RangeError);
    expect(() => inFile('a.json', () => { throw new InputError('name', 'is too long'); })).toThrow('a.json: name is too long');
  });
});
