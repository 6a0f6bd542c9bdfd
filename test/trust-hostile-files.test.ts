// The hostile-file cases of `npm run trust` (trust/hostile-files.ts), a fixed-seed set: CSV paths
// aliasing the project and full disks, names with control and bidirectional characters through
// every command, duplicate keys, invalid UTF-8 and repeated options through the CLI.
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { HOSTILE_KINDS, runHostileCase, runHostileFiles } from '../trust/hostile-files';

describe('hostile files through the CLI', () => {
  it('a fixed-seed set of 60 cases: every kind run, every case passes', async () => {
    const t = await runHostileFiles(7, 60);
    expect(t.failures).toEqual([]);
    expect(t.run).toBe(60);
    expect(t.passed).toBe(60);
    for (const k of HOSTILE_KINDS) expect(t.byKind[k].run, k).toBeGreaterThan(0);
  }, 120_000);

  it('every alias way and both failing disks, for both writers', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'tw-hostile-'));
    try {
      for (let pick = 0; pick < 12; pick++) {
        const sub = join(dir, `c${pick}`);
        const { mkdirSync } = await import('node:fs');
        mkdirSync(sub);
        expect(await runHostileCase({ kind: 'alias', demo: 'demo-servo-axis', pick, pieces: ['\n'] }, sub)).toEqual({ ok: true });
      }
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  }, 60_000);
});
