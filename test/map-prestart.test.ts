// src/cli/map-prestart.ts: the efficiency command's grid and threads from its arguments, the default
// thread count, and the script its workers run.
import { describe, expect, it } from 'vitest';
import { parseArgs } from '../src/cli/args';
import { defaultMapThreads, mapGridFlags, workerScript } from '../src/cli/map-prestart';

describe('mapGridFlags', () => {
  it('defaults: 50 x 50 on one thread', () => {
    expect(mapGridFlags(parseArgs(['efficiency', 'p.json']))).toEqual({ nS: 50, nT: 50, threads: 1 });
  });
  it('the values given', () => {
    expect(mapGridFlags(parseArgs(['efficiency', 'p.json', '--speed-points', '120', '--torque-points', '80', '--threads', '3']))).toEqual({ nS: 120, nT: 80, threads: 3 });
  });
  it('a bad value: an InputError naming the option', () => {
    expect(() => mapGridFlags(parseArgs(['efficiency', 'p.json', '--threads', '0']))).toThrow(/--threads must be >= 1/);
    expect(() => mapGridFlags(parseArgs(['efficiency', 'p.json', '--speed-points', '2.5']))).toThrow(/--speed-points must be a whole number/);
  });
});

describe('defaultMapThreads', () => {
  it('one, on a small grid and a large one (two threads measured no faster on two cores)', () => {
    expect(defaultMapThreads(10, 10)).toBe(1);
    expect(defaultMapThreads(200, 200)).toBe(1);
  });
});

describe('workerScript', () => {
  it('from the sources: the tsx bootstrap beside this module', () => {
    const s = String(workerScript().script);
    expect(s.startsWith('file:')).toBe(true);
    expect(s.endsWith('/src/cli/efficiency-worker-source.mjs')).toBe(true);
  });
});
