import { existsSync, mkdtempSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { nodeFs, type FsLayer } from '../src/node/fs-layer';
import { clearRecovery, readRecovery, RECOVERY_FILE_NAME, writeRecovery } from '../src/node/recovery';

let dir: string;
beforeEach(() => {
  dir = mkdtempSync(join(tmpdir(), 'tw-recovery-'));
});
afterEach(() => rmSync(dir, { recursive: true, force: true }));

const now = () => new Date('2026-03-04T05:06:07.000Z');

describe('recovery file', () => {
  it('round-trips unsaved edits with the document path and time', async () => {
    const text = '{"format":"torquewise-project","version":1,"edited":true}';
    expect(await writeRecovery(dir, text, '/projects/a.json', { now })).toEqual({ ok: true, path: join(dir, RECOVERY_FILE_NAME) });
    expect(await readRecovery(dir)).toEqual({ text, documentPath: '/projects/a.json', savedAt: '2026-03-04T05:06:07.000Z' });
    await writeRecovery(dir, 'second', null, { now });
    expect(await readRecovery(dir)).toEqual({ text: 'second', documentPath: null, savedAt: '2026-03-04T05:06:07.000Z' });
    expect(readdirSync(dir)).toEqual([RECOVERY_FILE_NAME]);
  });

  it('offers nothing when there is no file or it is damaged', async () => {
    expect(await readRecovery(dir)).toBeNull();
    writeFileSync(join(dir, RECOVERY_FILE_NAME), '{"format":"torquewise-recovery","text":');
    expect(await readRecovery(dir)).toBeNull();
    writeFileSync(join(dir, RECOVERY_FILE_NAME), '{"format":"other","text":"x","savedAt":"t"}');
    expect(await readRecovery(dir)).toBeNull();
  });

  it('is removed by clearRecovery, and clearing twice is harmless', async () => {
    await writeRecovery(dir, 'x', null, { now });
    await clearRecovery(dir);
    expect(existsSync(join(dir, RECOVERY_FILE_NAME))).toBe(false);
    await expect(clearRecovery(dir)).resolves.toBeUndefined();
  });

  it('a failed autosave says so and keeps the previous recovery file', async () => {
    await writeRecovery(dir, 'kept', null, { now });
    const fs: FsLayer = { ...nodeFs, rename: async () => { throw Object.assign(new Error('x'), { code: 'ENOSPC' }); } };
    const r = await writeRecovery(dir, 'lost', null, { fs, now });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toBe('Autosave failed: Could not save "recovery.json": the disk is full (while replacing the file). The file on disk is unchanged.');
    expect((await readRecovery(dir))?.text).toBe('kept');
  });
});
