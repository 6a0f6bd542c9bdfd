// Project text -> JSON value (src/core/project/project-json.ts): the syntax error placed by line and
// column, a byte-order mark dropped, a key given twice refused. JSON grammar: Bray (2017), RFC 8259,
// "The JavaScript Object Notation (JSON) Data Interchange Format" (names within an object SHOULD be
// unique; a parser may keep the last, which is why a duplicate is refused here).
import { describe, expect, it } from 'vitest';
import { parseProjectJson } from '../src/core/project/project-json';
import { refusal } from './helpers';

describe('parseProjectJson', () => {
  it('returns the value, a leading byte-order mark dropped', () => {
    expect(parseProjectJson('\ufeff{"a": [1, 2.5], "b": {"c": null}}')).toEqual({ a: [1, 2.5], b: { c: null } });
  });

  it('a syntax error is InputError("file") placed at its line and column', () => {
    const e = refusal(() => parseProjectJson('{\n  "a": 1,\n  "b": }'));
    expect(e.field).toBe('file');
    expect(e.message).toMatch(/^file is not valid JSON: .* at line 3 column 8$/);
    expect(refusal(() => parseProjectJson('')).message).toBe('file is not valid JSON: Unexpected end of JSON input at line 1 column 1');
  });

  it('a key given twice is refused by its path, in a nested object and in a list', () => {
    expect(refusal(() => parseProjectJson('{"motor": {"Rs": 1, "Rs": 2}}')).field).toBe('motor.Rs');
    expect(refusal(() => parseProjectJson('{"requirements": [{"label": "a"}, {"label": "b", "label": "c"}]}')).field).toBe('requirements[1].label');
  });
});
