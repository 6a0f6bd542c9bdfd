import { describe, expect, it } from 'vitest';
import { firstInvalidUtf8 } from '../src/core/project/utf8';

const bytes = (...x: number[]): Uint8Array => Uint8Array.from(x);

describe('firstInvalidUtf8', () => {
  it('accepts ASCII, two-, three- and four-byte characters and the edges of the ranges', () => {
    for (const s of ['', 'plain {"a":1}', 'N·m ° µs', '€ \ufeff \uffff', '\u{10000} \u{10ffff} \ud7ff \ue000']) {
      expect(firstInvalidUtf8(new TextEncoder().encode(s))).toBe(-1);
    }
  });

  // ill-formed sequences from RFC 3629 (Yergeau, 2003, UTF-8, a transformation format of ISO 10646), section 3 and 4
  const bad: Array<[string, Uint8Array, number]> = [
    ['a lone continuation byte', bytes(0x41, 0x80, 0x41), 1],
    ['0xFF', bytes(0x7b, 0x22, 0xff), 2],
    ['an overlong slash (C0 AF)', bytes(0x61, 0xc0, 0xaf), 1],
    ['an overlong three-byte form (E0 80 AF)', bytes(0xe0, 0x80, 0xaf), 0],
    ['a surrogate (ED A0 80 = U+D800)', bytes(0x20, 0x20, 0xed, 0xa0, 0x80), 2],
    ['above U+10FFFF (F4 90 80 80)', bytes(0xf4, 0x90, 0x80, 0x80), 0],
    ['a lead byte F5', bytes(0xf5, 0x80, 0x80, 0x80), 0],
    ['a sequence cut at the end', bytes(0x41, 0xe2, 0x82), 1],
    ['a lead byte followed by ASCII', bytes(0xc3, 0x41), 0],
    ['a bad third byte', bytes(0x41, 0x41, 0xe2, 0x82, 0x41), 2],
  ];
  for (const [what, b, at] of bad) {
    it(`${what}: offset ${at}`, () => {
      expect(firstInvalidUtf8(b)).toBe(at);
      // the fatal decoder agrees that it is not UTF-8 (common practice (no source): WHATWG Encoding's decoder)
      expect(() => new TextDecoder('utf-8', { fatal: true }).decode(b)).toThrow(TypeError);
    });
  }
});
