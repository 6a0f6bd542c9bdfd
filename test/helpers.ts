// Small helpers shared by test files (not a test file itself).
import { readFileSync, readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { expect } from 'vitest';
import { InputError } from '../src/core/base/errors';

/** Every .ts/.tsx file below dir. */
export function sourceFiles(dir: string): string[] {
  const out: string[] = [];
  for (const name of readdirSync(dir)) {
    const p = join(dir, name);
    if (statSync(p).isDirectory()) out.push(...sourceFiles(p));
    else if (/\.(ts|tsx)$/.test(name)) out.push(p);
  }
  return out;
}

/** The InputError that f throws; fails the test when f throws anything else or nothing. */
export function refusal(f: () => unknown): InputError {
  try {
    f();
  } catch (e) {
    expect(e).toBeInstanceOf(InputError);
    return e as InputError;
  }
  throw new Error('was not refused');
}

/** The message of the InputError that f throws; fails the test when f throws anything else or nothing. */
export function messageOf(f: () => unknown): string {
  return refusal(f).message;
}

/** A demo project from resources/ as a plain JSON object (to mutate in a test). */
// eslint-disable-next-line @typescript-eslint/no-explicit-any
export function demoJson(name: string): Record<string, any> {
  return JSON.parse(readFileSync(join(__dirname, '..', 'resources', `${name}.json`), 'utf8'));
}
