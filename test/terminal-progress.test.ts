// A progress line on a terminal (src/cli/terminal-progress.ts): rewritten in place on standard error
// and cleared at the end, nothing when standard error is not a terminal, and for many steps at most
// one line per whole percent (common practice (no source): carriage-return progress lines on a TTY only).
import { describe, expect, it } from 'vitest';
import { terminalProgress } from '../src/cli/terminal-progress';

const sink = (isTTY: boolean) => {
  const out: string[] = [];
  return { isTTY, out, write: (s: string) => out.push(s) };
};

describe('terminal progress line', () => {
  it('a few steps: every step written in place, then the line cleared', () => {
    const s = sink(true);
    const p = terminalProgress('samples', s);
    p.onStep!(10, 30);
    p.onStep!(10, 30); // the same count again: nothing new
    p.onStep!(30, 30);
    p.end();
    expect(s.out).toEqual(['\rsamples: 10 of 30 (33 %)\u001b[K', '\rsamples: 30 of 30 (100 %)\u001b[K', '\r\u001b[K']);
  });

  it('many steps: one line per whole percent, the last step always', () => {
    const s = sink(true);
    const p = terminalProgress('samples', s);
    for (let k = 10; k <= 10000; k += 10) p.onStep!(k, 10000);
    p.end();
    expect(s.out.length).toBe(100 + 1 + 1); // 0 % (first step), 1..100 %, the clearing
    expect(s.out[0]).toBe('\rsamples: 10 of 10000 (0 %)\u001b[K');
    expect(s.out[s.out.length - 2]).toBe('\rsamples: 10000 of 10000 (100 %)\u001b[K');
  });

  it('writes nothing when standard error is a pipe or a file', () => {
    const s = sink(false);
    const p = terminalProgress('samples', s);
    expect(p.onStep).toBeUndefined();
    p.end();
    expect(s.out).toEqual([]);
  });
});
