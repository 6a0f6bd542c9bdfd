// The corners' progress and stop (src/core/project/tolerance-corners.ts onCorner, signal): one call per
// corner in order up to the total, the same result as without the hook, and a run stopped between two
// corners (common practice (no source): progress as items done / items, cancellation checked between items).
import { describe, expect, it } from 'vitest';
import { parseProject } from '../src/core/project/schema';
import { CornersAborted, toleranceCorners } from '../src/core/project/tolerance-corners';
import { linearSpm } from './tolerance-fixtures';

const file = () => parseProject(linearSpm({ 'motor.psiM': { minus_pct: 10, plus_pct: 10 }, 'inverter.Imax': { minus_pct: 5, plus_pct: 5 }, 'motor.Rs': { minus_pct: 20, plus_pct: 20 } }));

describe('corners progress', () => {
  it('reports each corner done out of 2^3 = 8, and the result is the run without the hook', () => {
    const calls: Array<[number, number]> = [];
    const r = toleranceCorners(file(), { onCorner: (d, t) => calls.push([d, t]) });
    expect(calls).toEqual([1, 2, 3, 4, 5, 6, 7, 8].map((d) => [d, 8]));
    expect(r).toEqual(toleranceCorners(file()));
  });

  it('stops between corners once the signal is aborted: the corners done are the ones reported', () => {
    const signal = { aborted: false };
    let seen = 0;
    const run = () => toleranceCorners(file(), { signal, onCorner: (d) => { seen = d; if (d === 3) signal.aborted = true; } });
    expect(run).toThrow(CornersAborted);
    expect(seen).toBe(3);
    expect(run).toThrow(/stopped after 0 of 8/);
  });

  it('an AbortSignal aborted before the run stops it before the first corner', () => {
    const c = new AbortController();
    c.abort();
    let calls = 0;
    expect(() => toleranceCorners(file(), { signal: c.signal, onCorner: () => calls++ })).toThrow(/stopped after 0 of 8/);
    expect(calls).toBe(0);
  });
});
