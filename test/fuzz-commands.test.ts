// The fixed-seed fuzz set of `npm test`: mutated demo files and random legal projects through
// loadProjectText / parseProject + resolveProject and the commands params, envelope, point, size,
// simulate (with a small step budget) and tune. Each case ends with finite numbers or one
// one-line InputError naming its field (see trust/fuzz-cases.ts for the oracle).
// `npm run trust` runs the same generator with 10 000+ cases.
import { describe, expect, it } from 'vitest';
import { runFuzz, runCase } from '../trust/fuzz-cases';
import { loadProjectText } from '../src/core/project/project';
import { DEMOS } from '../trust/fuzz-cases';
import { InputError } from '../src/core/base/errors';

const N = 1200;

describe('fuzzed project files through every command', () => {
  it(`${N} fixed-seed cases: all end in finite numbers or one InputError naming the field`, async () => {
    const t = await runFuzz(20261201, N);
    expect(t.failures).toEqual([]);
    expect(t.run).toBe(N);
    expect(t.passed).toBe(N);
    // the set exercises both outcomes, not only refusals
    expect(t.ok).toBeGreaterThan(N / 20);
    expect(t.inputErrors).toBeGreaterThan(N / 2);
  }, 120_000);
});

describe('fuzz findings, fixed', () => {
  it('an unknown key of 50 000 characters gives a short one-line message that still names where it is', () => {
    const j = structuredClone(DEMOS['demo-spm-48v']) as Record<string, any>;
    j.control['k'.repeat(50_000)] = 1;
    let msg = '';
    try {
      loadProjectText(JSON.stringify(j));
    } catch (e) {
      expect(e).toBeInstanceOf(InputError);
      msg = (e as InputError).message;
      expect((e as InputError).field.startsWith('control.kkkk')).toBe(true);
    }
    expect(msg).toMatch(/^control\.k+… \(50000 characters\) is not a known key/);
    expect(msg.length).toBeLessThan(400);
  });

  it('Infinity written as 1e999 in the text is refused with its field', async () => {
    const j = structuredClone(DEMOS['demo-spm-48v']) as Record<string, any>;
    const text = JSON.stringify(j).replace('"Vdc":48', '"Vdc":1e999');
    const r = await runCase({ input: { text }, command: 'params', flags: [] });
    expect(r).toMatchObject({ kind: 'input-error', field: 'inverter.Vdc' });
  });
});
