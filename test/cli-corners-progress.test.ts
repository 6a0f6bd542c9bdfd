// The `corners` command's progress on a terminal (src/cli/commands/corners.ts cornersProgress): a line
// rewritten in place per corner on standard error and cleared at the end, and nothing at all when
// standard error is not a terminal, so piped output never changes (common practice (no source):
// carriage-return progress lines on a TTY only).
import { describe, expect, it } from 'vitest';
import { cornersProgress } from '../src/cli/commands/corners';

const sink = (isTTY: boolean) => {
  const out: string[] = [];
  return { isTTY, out, write: (s: string) => out.push(s) };
};

describe('corners progress on a terminal', () => {
  it('writes k of n with its percentage in place, then clears the line', () => {
    const s = sink(true);
    const p = cornersProgress(s);
    for (let k = 1; k <= 3; k++) p.onCorner!(k, 64);
    p.end();
    expect(s.out).toEqual(['\rcorners: 1 of 64 (1 %)\u001b[K', '\rcorners: 2 of 64 (3 %)\u001b[K', '\rcorners: 3 of 64 (4 %)\u001b[K', '\r\u001b[K']);
  });

  it('writes nothing when standard error is a pipe or a file', () => {
    const s = sink(false);
    const p = cornersProgress(s);
    expect(p.onCorner).toBeUndefined();
    p.end();
    expect(s.out).toEqual([]);
  });
});
