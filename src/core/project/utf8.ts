/**
 * Strict UTF-8: where a byte sequence stops being well-formed UTF-8 (RFC 3629, section 4): no
 * overlong forms, no surrogates (U+D800..U+DFFF), nothing above U+10FFFF, no truncated sequence.
 * One pass, no allocation; a project file is refused with the offset this gives.
 */

/** Byte offset of the first byte that starts an ill-formed sequence, or -1 when all of `b` is UTF-8. */
export function firstInvalidUtf8(b: Uint8Array): number {
  const n = b.length;
  let i = 0;
  while (i < n) {
    const c = b[i]!;
    if (c < 0x80) {
      i++;
      continue;
    }
    let need: number;
    // the allowed range of the second byte (the first continuation byte) depends on the lead byte
    let lo = 0x80;
    let hi = 0xbf;
    if (c >= 0xc2 && c <= 0xdf) need = 1;
    else if (c >= 0xe0 && c <= 0xef) {
      need = 2;
      if (c === 0xe0) lo = 0xa0; // overlong below U+0800
      else if (c === 0xed) hi = 0x9f; // surrogates U+D800..U+DFFF
    } else if (c >= 0xf0 && c <= 0xf4) {
      need = 3;
      if (c === 0xf0) lo = 0x90; // overlong below U+10000
      else if (c === 0xf4) hi = 0x8f; // above U+10FFFF
    } else return i; // a continuation byte without a lead, 0xC0/0xC1 (overlong) or 0xF5..0xFF
    if (i + need >= n) return i; // truncated at the end
    const b1 = b[i + 1]!;
    if (b1 < lo || b1 > hi) return i;
    for (let k = 2; k <= need; k++) {
      const x = b[i + k]!;
      if (x < 0x80 || x > 0xbf) return i;
    }
    i += need + 1;
  }
  return -1;
}
