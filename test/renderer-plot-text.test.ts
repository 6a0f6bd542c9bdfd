// Text from a file reaches plotly as plain text. The decoder below follows what plotly does with a
// text string (common practice (no source): read from plotly.js-dist-min 4.1.2, svg text
// utilities): it splits the text at tags first, then turns entities (&lt; &#37; ...) back into
// characters in the text between them.
import { describe, expect, it } from 'vitest';
import { plotText } from '../src/renderer/src/components/plot-text';

const TAG = /(<[^<>]*>)/;
const NAMED: Record<string, string> = { lt: '<', gt: '>', amp: '&', nbsp: '\u00a0', mu: 'μ', times: '×', plusmn: '±', deg: '°' };
function plotlyReads(s: string): { tags: string[]; text: string } {
  const tags: string[] = [];
  let text = '';
  for (const part of s.split(TAG)) {
    if (TAG.test(part) && /^<\/?(br|b|i|em|sup|sub|span|a|s|u)\b/i.test(part)) tags.push(part);
    else text += part.replace(/&(#\d+|#x[\da-fA-F]+|[a-z]+);/g, (m, e: string) => (e[0] === '#' ? String.fromCodePoint(e[1] === 'x' ? parseInt(e.slice(2), 16) : parseInt(e.slice(1), 10)) : NAMED[e] ?? m));
  }
  return { tags, text };
}

const HOSTILE = [
  '<a href="x">A</a><br>',
  '<span style="color:red">red</span>',
  '<b>bold</b><i>it</i><sup>2</sup><sub>d</sub>',
  '%{x} and %{y:.2f}',
  '&lt;already escaped&gt; &amp; &#60;',
  'a <br/> b',
  '<a href="javascript:alert(1)">x</a>',
  'unclosed <a href="x',
  'plain label 1',
  '"quotes" and \'ticks\'',
];

describe('plotText', () => {
  for (const h of HOSTILE) {
    it(`${JSON.stringify(h)} is shown as itself, with no tag and no placeholder`, () => {
      const e = plotText(h);
      expect(e).not.toMatch(/[<>]/);
      expect(e).not.toContain('%{');
      const read = plotlyReads(e);
      expect(read.tags).toEqual([]);
      expect(read.text).toBe(h);
    });
  }
  it('the unescaped text would have been markup (the check above can fail)', () => {
    expect(plotlyReads('<a href="x">A</a><br>').tags).toEqual(['<a href="x">', '</a>', '<br>']);
    expect(plotlyReads('&lt;').text).toBe('<');
  });
  it('leaves ordinary text as it is', () => {
    expect(plotText('peak hot, 4000 rpm')).toBe('peak hot, 4000 rpm');
  });
});
