import { existsSync, mkdtempSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { nodeFs, type FsLayer } from '../src/node/fs-layer';
import { clearRecovery, LEGACY_RECOVERY_FILE_NAME, listRecoveries, readRecovery, recoveryFileName, writeRecovery } from '../src/node/recovery';

let dir: string;
beforeEach(() => {
  dir = mkdtempSync(join(tmpdir(), 'tw-recovery-'));
});
afterEach(() => rmSync(dir, { recursive: true, force: true }));

const now = () => new Date('2026-03-04T05:06:07.000Z');
const later = () => new Date('2026-03-04T05:07:07.000Z');

describe('recovery file', () => {
  it('round-trips unsaved edits with the document path and time', async () => {
    const text = '{"format":"torquewise-project","version":1,"edited":true}';
    expect(await writeRecovery(dir, text, '/projects/a.json', { now })).toEqual({ ok: true, path: join(dir, recoveryFileName('/projects/a.json')) });
    expect(await readRecovery(dir)).toEqual({ text, documentPath: '/projects/a.json', savedAt: '2026-03-04T05:06:07.000Z' });
    await writeRecovery(dir, 'second', '/projects/a.json', { now: later });
    expect(await readRecovery(dir)).toEqual({ text: 'second', documentPath: '/projects/a.json', savedAt: '2026-03-04T05:07:07.000Z' });
    expect(readdirSync(dir)).toEqual([recoveryFileName('/projects/a.json')]);
  });

  it('offers nothing when there is no file or it is damaged', async () => {
    expect(await readRecovery(dir)).toBeNull();
    writeFileSync(join(dir, recoveryFileName(null)), '{"format":"torquewise-recovery","text":');
    expect(await readRecovery(dir)).toBeNull();
    writeFileSync(join(dir, recoveryFileName(null)), '{"format":"other","text":"x","savedAt":"t"}');
    expect(await readRecovery(dir)).toBeNull();
  });

  it('is removed by clearRecovery, and clearing twice is harmless', async () => {
    await writeRecovery(dir, 'x', null, { now });
    await clearRecovery(dir, null);
    expect(existsSync(join(dir, recoveryFileName(null)))).toBe(false);
    await expect(clearRecovery(dir, null)).resolves.toBeUndefined();
  });

  it('a failed autosave says so and keeps the previous recovery file', async () => {
    await writeRecovery(dir, 'kept', null, { now });
    const fs: FsLayer = { ...nodeFs, rename: async () => { throw Object.assign(new Error('x'), { code: 'ENOSPC' }); } };
    const r = await writeRecovery(dir, 'lost', null, { fs, now });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toBe('Autosave failed: Could not save "recovery-untitled.json": the disk is full (while replacing the file). The file on disk is unchanged.');
    expect((await readRecovery(dir))?.text).toBe('kept');
  });

  it('two documents never share one recovery file: each keeps its own edits, the newest is offered', async () => {
    await writeRecovery(dir, 'edits of a', '/projects/a.json', { now });
    await writeRecovery(dir, 'edits of b', '/projects/b.json', { now: later });
    await writeRecovery(dir, 'untitled edits', null, { now });
    expect(new Set([recoveryFileName('/projects/a.json'), recoveryFileName('/projects/b.json'), recoveryFileName(null)]).size).toBe(3);
    expect((await listRecoveries(dir)).map((r) => r.offer.text).sort()).toEqual(['edits of a', 'edits of b', 'untitled edits']);
    expect((await readRecovery(dir))?.text).toBe('edits of b');
    // a clean save of b drops b's file only
    await clearRecovery(dir, '/projects/b.json');
    expect((await listRecoveries(dir)).map((r) => r.offer.text).sort()).toEqual(['edits of a', 'untitled edits']);
    expect(recoveryFileName('/projects/a.json')).toMatch(/^recovery-[0-9a-f]{16}\.json$/);
  });

  it('the single file of an earlier version is still offered, and removed with its document', async () => {
    writeFileSync(join(dir, LEGACY_RECOVERY_FILE_NAME), JSON.stringify({ format: 'torquewise-recovery', version: 1, documentPath: '/p/old.json', savedAt: '2026-01-01T00:00:00.000Z', text: 'old' }));
    expect(await readRecovery(dir)).toEqual({ text: 'old', documentPath: '/p/old.json', savedAt: '2026-01-01T00:00:00.000Z' });
    await clearRecovery(dir, '/p/other.json');
    expect(existsSync(join(dir, LEGACY_RECOVERY_FILE_NAME))).toBe(true);
    await clearRecovery(dir, '/p/old.json');
    expect(existsSync(join(dir, LEGACY_RECOVERY_FILE_NAME))).toBe(false);
  });
});
