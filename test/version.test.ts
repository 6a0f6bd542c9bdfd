import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { TOOL_VERSION } from '../src/core/base/version';

describe('tool version', () => {
  it('is package.json version (printed on every exported figure)', () => {
    const pkg = JSON.parse(readFileSync(join(__dirname, '..', 'package.json'), 'utf8')) as { version: string };
    expect(TOOL_VERSION).toBe(pkg.version);
  });
});
