// Save notices a file changed on disk since it was opened or saved here, and asks before
// replacing it: the check, the question as data, and the whole flow through FileService.
import { mkdtempSync, readFileSync, rmSync, utimesSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { changedOnDisk, changedOnDiskPrompt, formatLocalTime, keptMessage, overwriteAllowed, type ChangedOnDisk } from '../src/main/changed-on-disk';
import { FileService } from '../src/main/file-service';

let dir: string;
beforeEach(() => {
  dir = mkdtempSync(join(tmpdir(), 'tw-changed-'));
});
afterEach(() => rmSync(dir, { recursive: true, force: true }));

const P1 = readFileSync(join(__dirname, '../resources/demo-ipm-traction.json'), 'utf8').trimEnd();
const P2 = P1.replace('"name": "Invented demo', '"name": "Edited invented demo');
const OTHER = P1.replace('"name": "Invented demo', '"name": "Changed elsewhere, invented demo');

// local times built from local parts, so the expected text holds in any time zone
const OPENED = new Date(2026, 2, 4, 5, 6, 7);
const CHANGED_AT = new Date(2026, 2, 4, 5, 20, 0);

function service(p: string, answers: boolean[]) {
  const asked: ChangedOnDisk[] = [];
  const s = new FileService({
    userDataDir: join(dir, 'user-data'),
    initialPath: null,
    platform: 'linux',
    now: () => OPENED,
    dialogs: {
      showOpen: async () => p,
      showSave: async () => null,
      confirmOverwrite: async (c) => {
        asked.push(c);
        return answers.shift() ?? false;
      },
    },
  });
  return { s, asked };
}

/** Another program writes the file, with a modification time of CHANGED_AT. */
function changeElsewhere(p: string, text = OTHER): void {
  writeFileSync(p, text);
  utimesSync(p, CHANGED_AT, CHANGED_AT);
}

describe('a file changed on disk since it was opened', () => {
  it('Save asks, showing both times; Cancel keeps the other edit and says so', async () => {
    const p = join(dir, 'a.json');
    writeFileSync(p, P1);
    const { s, asked } = service(p, [false]);
    await s.open();
    changeElsewhere(p);
    const r = await s.save({ path: p, text: P2 });
    expect(asked).toEqual([{ path: p, name: 'a.json', ours: OPENED, how: 'opened', disk: CHANGED_AT }]);
    expect(r).toEqual({
      ok: false,
      canceled: false,
      message: 'Not saved: “a.json” was changed on disk at 2026-03-04 05:20:00, after it was opened here at 2026-03-04 05:06:07. The file on disk is unchanged; use Save As… to keep your version beside it.',
    });
    expect(readFileSync(p, 'utf8')).toBe(OTHER);
  });

  it('Overwrite replaces it; the next Save does not ask again (its own version is known)', async () => {
    const p = join(dir, 'a.json');
    writeFileSync(p, P1);
    const { s, asked } = service(p, [true]);
    await s.open();
    changeElsewhere(p);
    expect(await s.save({ path: p, text: P2 })).toEqual({ ok: true, path: p });
    expect(readFileSync(p, 'utf8')).toBe(`${P2}\n`);
    expect(await s.save({ path: p, text: P1 })).toEqual({ ok: true, path: p });
    expect(asked).toHaveLength(1);
    // changed again after our own save: asked again, as "last saved here"
    changeElsewhere(p);
    expect((await s.save({ path: p, text: P2 })).ok).toBe(false);
    expect(asked.map((a) => a.how)).toEqual(['opened', 'saved']);
    expect(readFileSync(p, 'utf8')).toBe(OTHER);
  });

  it('a file touched but not changed, or not touched at all, is saved without a question', async () => {
    const p = join(dir, 'a.json');
    writeFileSync(p, P1);
    const { s, asked } = service(p, []);
    await s.open();
    utimesSync(p, CHANGED_AT, CHANGED_AT);
    expect(await s.save({ path: p, text: P2 })).toEqual({ ok: true, path: p });
    expect(await s.save({ path: p, text: P1 })).toEqual({ ok: true, path: p });
    expect(asked).toEqual([]);
  });

  it('without a way to ask, a changed file is never replaced', async () => {
    const p = join(dir, 'a.json');
    writeFileSync(p, P1);
    const s = new FileService({ userDataDir: join(dir, 'ud'), initialPath: null, platform: 'linux', dialogs: { showOpen: async () => p, showSave: async () => null } });
    await s.open();
    changeElsewhere(p);
    expect((await s.save({ path: p, text: P2 })).ok).toBe(false);
    expect(readFileSync(p, 'utf8')).toBe(OTHER);
  });

  it('recovered edits: a file changed after their autosave is asked about', async () => {
    const p = join(dir, 'a.json');
    writeFileSync(p, P1);
    const first = service(p, []);
    await first.s.open();
    await first.s.recoveryWrite({ text: P2, documentPath: p });
    const savedAt = (await first.s.recoveryCheck())!.savedAt;
    const later = new Date(Math.floor(new Date(savedAt).getTime() / 1000) * 1000 + 60_000); // whole seconds: any file system keeps them
    writeFileSync(p, OTHER);
    utimesSync(p, later, later);
    const next = service(p, [false]);
    await next.s.recoveryCheck();
    expect((await next.s.save({ path: p, text: P2 })).ok).toBe(false);
    expect(next.asked).toEqual([{ path: p, name: 'a.json', ours: new Date(savedAt), how: 'autosaved', disk: later }]);
    expect(readFileSync(p, 'utf8')).toBe(OTHER);
  });
});

describe('changedOnDisk and the question', () => {
  it('no known version, a vanished file: nothing to ask', async () => {
    const p = join(dir, 'gone.json');
    expect(await changedOnDisk(p, undefined)).toBeNull();
    expect(await changedOnDisk(p, { text: 'x', at: OPENED, how: 'opened' })).toBeNull();
  });

  it('bytes that are not UTF-8 are a change; a byte-order mark alone is not', async () => {
    const p = join(dir, 'a.json');
    writeFileSync(p, Buffer.from([0x7b, 0xe9, 0x7d]));
    expect((await changedOnDisk(p, { text: '{\u00e9}', at: OPENED, how: 'opened' }))?.name).toBe('a.json');
    writeFileSync(p, '\ufeff{}');
    expect(await changedOnDisk(p, { text: '{}', at: OPENED, how: 'opened' })).toBeNull();
  });

  it('the prompt shows both times and defaults to keeping the file', () => {
    const c: ChangedOnDisk = { path: join(dir, 'a.json'), name: 'a.json', ours: OPENED, how: 'saved', disk: CHANGED_AT };
    const p = changedOnDiskPrompt(c);
    expect(p).toEqual({
      type: 'warning',
      title: 'File changed on disk',
      message: '“a.json” was changed on disk by another program or window.',
      detail: 'Last saved here: 2026-03-04 05:06:07\nChanged on disk: 2026-03-04 05:20:00\n\nSaving now replaces that version with yours, and its changes are lost. Cancel keeps it; Save As… then keeps both.',
      buttons: ['Cancel', 'Overwrite'],
      defaultId: 0,
      cancelId: 0,
      noLink: true,
    });
    expect(p.buttons[p.cancelId]).toBe('Cancel');
    expect(overwriteAllowed(p.defaultId)).toBe(false);
    expect(overwriteAllowed(p.buttons.indexOf('Overwrite'))).toBe(true);
    expect(keptMessage(c)).toContain('after it was last saved here at 2026-03-04 05:06:07');
    expect(formatLocalTime(new Date(Number.NaN))).toBe('unknown');
  });
});
