import { describe, expect, it } from 'vitest';
import { findDuplicateKey } from '../src/core/project/json-duplicates';
import { loadProjectText, parseProjectJson } from '../src/core/project/project';
import { DEMOS } from '../trust/fuzz-cases';
import { refusal } from './helpers';

describe('findDuplicateKey', () => {
  it('finds none where every object has distinct keys (the same key in two objects, a key repeated as a value)', () => {
    for (const t of ['{}', '[]', '1', '"a"', '{"a":1,"b":{"a":2},"c":[{"a":1},{"a":2}]}', '{"a":"a","b":"a"}', '{"x":"}\\"{,","y":"\\\\"}']) {
      expect(findDuplicateKey(t)).toBeNull();
    }
    for (const d of Object.values(DEMOS)) expect(findDuplicateKey(JSON.stringify(d, null, 2))).toBeNull();
  });

  const cases: Array<[string, string, string, string]> = [
    ['top level', '{"name":"a","name":"b"}', 'name', 'name'],
    ['nested', '{"motor":{"Ld":1,"Lq":2,"Ld":3}}', 'motor.Ld', 'Ld'],
    ['in a list entry', '{"requirements":[{"label":"a"},{"label":"b","speed_rpm":1,"label":"c"}]}', 'requirements[1].label', 'label'],
    ['written with an escape', '{"motor":{"Ld":1,"\\u004cd":2}}', 'motor.Ld', 'Ld'],
    ['with whitespace and strings holding braces', '{ "a" : "{\\"a\\":1}" ,\n "b" : [ "}" ] , "a" : 2 }', 'a', 'a'],
    ['an odd key, quoted in the path', '{"x":{"a b":1,"a b":2}}', 'x."a b"', 'a b'],
  ];
  for (const [what, text, path, key] of cases) {
    it(`${what}: ${path}`, () => {
      expect(JSON.parse(text)).toBeTruthy(); // valid JSON: JSON.parse alone would keep the last value
      expect(findDuplicateKey(text)).toEqual({ path, key });
    });
  }

  it('50 000 levels of nesting: no stack overflow, the repeated key at the bottom found with its path', () => {
    const depth = 50_000;
    const text = '['.repeat(depth) + '{"a":1,"a":2}' + ']'.repeat(depth);
    const r = findDuplicateKey(text);
    expect(r?.key).toBe('a');
    expect(r?.path).toBe('[0]'.repeat(depth) + '.a');
    const objects = '{"k":'.repeat(depth) + '1' + '}'.repeat(depth);
    expect(findDuplicateKey(objects)).toBeNull();
  });

  it('a 50 000-character key is shortened in the path', () => {
    const k = 'k'.repeat(50_000);
    const r = findDuplicateKey(`{"m":{"${k}":1,"${k}":2}}`);
    expect(r?.key).toBe(k);
    expect(r?.path).toBe(`m."${'k'.repeat(40)}… (50000 characters)"`);
  });
});

describe('the project parse refuses a repeated key (app, worker and CLI share it)', () => {
  it('names the path and the key; JSON.parse would have kept the last value silently', () => {
    const text = JSON.stringify(DEMOS['demo-spm-48v'], null, 2).replace('"inverter": {', '"inverter": {\n    "Vdc": 1000,');
    expect((JSON.parse(text) as { inverter: { Vdc: number } }).inverter.Vdc).not.toBe(1000); // the last one won
    const e = refusal(() => loadProjectText(text));
    expect(e.field).toBe('inverter.Vdc');
    expect(e.message).toBe('inverter.Vdc is given twice in one object; give each key once (which of the values was meant is a guess)');
    expect(refusal(() => parseProjectJson('{"format":"torquewise-project","format":"x"}')).field).toBe('format');
  });
});
