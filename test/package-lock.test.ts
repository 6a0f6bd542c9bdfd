// `npm install` on a clean clone leaves `git status` clean only when the committed lock file already
// says what npm would write for the root package: its name, version, licence, bin, engines and every
// dependency range. (npm writes these from package.json on every install; a change to one that is
// not carried into the lock shows up as a modified package-lock.json after the README's first step.)
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';

const root = resolve(__dirname, '..');
const pkg = JSON.parse(readFileSync(join(root, 'package.json'), 'utf8'));
const lock = JSON.parse(readFileSync(join(root, 'package-lock.json'), 'utf8'));

describe('package-lock.json agrees with package.json', () => {
  it('the root entry holds what npm writes from package.json', () => {
    const written: Record<string, unknown> = {};
    for (const k of ['name', 'version', 'license', 'bin', 'dependencies', 'devDependencies', 'engines']) if (pkg[k] !== undefined) written[k] = pkg[k];
    expect(lock.packages['']).toEqual(written);
    expect(lock.name).toBe(pkg.name);
    expect(lock.version).toBe(pkg.version);
  });
  it('every dependency is locked at the exact version package.json pins', () => {
    for (const [name, version] of Object.entries({ ...pkg.dependencies, ...pkg.devDependencies })) {
      expect({ name, locked: lock.packages[`node_modules/${name}`]?.version }).toEqual({ name, locked: version });
    }
  });
});
