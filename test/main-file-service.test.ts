// The IPC handlers' flow under Node: fake dialogs, real temp folders.
import { existsSync, mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { FileService, type SaveDialogRequest } from '../src/main/file-service';
import { nodeFs, type FsLayer } from '../src/node/fs-layer';
import { listRecoveries } from '../src/node/recovery';

let dir: string;
let ud: string;
beforeEach(() => {
  dir = mkdtempSync(join(tmpdir(), 'tw-service-'));
  ud = join(dir, 'user-data');
});
afterEach(() => rmSync(dir, { recursive: true, force: true }));

// two valid projects: the invented traction demo, and the same with another name
const P1 = readFileSync(join(__dirname, '../resources/demo-ipm-traction.json'), 'utf8').trimEnd();
const P2 = P1.replace('"name": "Invented demo', '"name": "Edited invented demo');

function service(picks: { open?: Array<string | null>; save?: Array<string | null> } = {}, extra: { initialPath?: string | null; fs?: FsLayer } = {}) {
  const saveRequests: SaveDialogRequest[] = [];
  const recentSeen: string[][] = [];
  const s = new FileService({
    userDataDir: ud,
    initialPath: extra.initialPath ?? null,
    fs: extra.fs,
    platform: 'linux',
    dialogs: {
      showOpen: async () => (picks.open ?? []).shift() ?? null,
      showSave: async (r) => {
        saveRequests.push(r);
        return (picks.save ?? []).shift() ?? null;
      },
    },
    onRecentChanged: (f) => recentSeen.push(f),
  });
  return { s, saveRequests, recentSeen };
}

describe('FileService', () => {
  it('the fixtures are two different projects', () => {
    expect(P2).not.toBe(P1);
  });
  it('open through the dialog grants saving back to that file and records it as recent', async () => {
    const p = join(dir, 'a.json');
    writeFileSync(p, P1);
    const { s, recentSeen } = service({ open: [p] });
    expect(await s.open()).toEqual({ ok: true, path: p, text: P1, readOnly: false });
    expect(await s.save({ path: p, text: P2 })).toEqual({ ok: true, path: p });
    expect(readFileSync(p, 'utf8')).toBe(`${P2}\n`);
    expect(await s.recent()).toEqual([p]);
    expect(recentSeen.at(-1)).toEqual([p]);
  });

  it('refuses to save to a path the user did not pick, and writes nothing there', async () => {
    const { s } = service();
    const target = join(dir, 'made-up.json');
    const r = await s.save({ path: target, text: P1 });
    expect(r).toEqual({ ok: false, canceled: false, message: 'Not saved: this file was not chosen in a dialog in this session. Use Save As… to pick where to save.' });
    expect(existsSync(target)).toBe(false);
  });

  it('a canceled dialog is reported as canceled and changes nothing', async () => {
    const { s } = service();
    expect(await s.open()).toEqual({ ok: false, canceled: true, message: 'Canceled.' });
    expect(await s.saveAs({ text: P1 })).toEqual({ ok: false, canceled: true, message: 'Canceled.' });
    expect(await s.export({ kind: 'envelope-csv', data: 'a,b\n' })).toEqual({ ok: false, canceled: true, message: 'Canceled.' });
    expect(existsSync(ud)).toBe(false);
  });

  it('Save As grants the picked path; the recovery file is removed after the clean save', async () => {
    const target = join(dir, 'b.json');
    const { s, saveRequests } = service({ save: [target] });
    expect(await s.recoveryWrite({ text: P2, documentPath: null })).toMatchObject({ ok: true });
    expect(await s.recoveryCheck()).toMatchObject({ text: P2, documentPath: null });
    expect(await s.saveAs({ text: P2, suggestedName: 'traction.json' })).toEqual({ ok: true, path: target });
    expect(saveRequests).toEqual([{ kind: 'project', defaultName: 'traction.json' }]);
    expect(await listRecoveries(ud)).toEqual([]);
    expect(await s.recoveryCheck()).toBeNull();
    expect(await s.save({ path: target, text: P1 })).toEqual({ ok: true, path: target });
  });

  it('a failed save keeps the recovery file and the old project, and says why', async () => {
    const p = join(dir, 'a.json');
    writeFileSync(p, P1);
    const failing: FsLayer = { ...nodeFs, rename: async (a, b) => (a.endsWith('.tw-tmp') && b === p ? Promise.reject(Object.assign(new Error('x'), { code: 'ENOSPC' })) : nodeFs.rename(a, b)) };
    const { s } = service({ open: [p] }, { fs: failing });
    await s.open();
    await s.recoveryWrite({ text: P2, documentPath: p });
    const r = await s.save({ path: p, text: P2 });
    expect(r).toEqual({ ok: false, canceled: false, message: 'Could not save "a.json": the disk is full (while replacing the file). The file on disk is unchanged.' });
    expect(readFileSync(p, 'utf8')).toBe(P1);
    expect(await s.recoveryCheck()).toMatchObject({ text: P2, documentPath: p });
    expect(readdirSync(dir).sort()).toEqual(['a.json', 'user-data']);
  });

  it('a newer-version file opens read-only and is not granted for Save', async () => {
    const p = join(dir, 'future.json');
    writeFileSync(p, '{"format":"torquewise-project","version":9}');
    const { s } = service({ open: [p] });
    const r = await s.open();
    expect(r).toMatchObject({ ok: true, readOnly: true });
    expect((await s.save({ path: p, text: P1 })).ok).toBe(false);
    expect(readFileSync(p, 'utf8')).toBe('{"format":"torquewise-project","version":9}');
  });

  it('exports to the picked path with the kind-specific dialog, bytes and text alike', async () => {
    const png = join(dir, 'plot.png');
    const csv = join(dir, 'env.csv');
    const { s, saveRequests } = service({ save: [png, csv] });
    const bytes = new Uint8Array([137, 80, 78, 71, 13, 10, 26, 10]);
    expect(await s.export({ kind: 'plot-png', data: bytes })).toEqual({ ok: true, path: png });
    expect(await s.export({ kind: 'envelope-csv', data: 'speed_rpm,torque_Nm\n0,10\n', suggestedName: 'env.csv' })).toEqual({ ok: true, path: csv });
    expect(new Uint8Array(readFileSync(png))).toEqual(bytes);
    expect(readFileSync(csv, 'utf8')).toBe('speed_rpm,torque_Nm\n0,10\n');
    expect(saveRequests).toEqual([{ kind: 'plot-png', defaultName: 'plot.png' }, { kind: 'envelope-csv', defaultName: 'env.csv' }]);
  });

  it('open-recent accepts only listed files and drops one that vanished', async () => {
    const p = join(dir, 'a.json');
    writeFileSync(p, P1);
    const { s } = service({ open: [p] });
    await s.open();
    expect(await s.openRecent(join(dir, 'other.json'))).toEqual({ ok: false, canceled: false, message: 'Not opened: that file is not in the recent list.' });
    expect(await s.openRecent(p)).toMatchObject({ ok: true, path: p });
    rmSync(p);
    expect(await s.openRecent(p)).toEqual({ ok: false, canceled: false, message: 'Could not open "a.json": it does not exist.' });
    expect(await s.recent()).toEqual([]);
  });

  it('the command-line file is opened, granted and given to the renderer; none gives null', async () => {
    const p = join(dir, 'cli.json');
    writeFileSync(p, P1);
    const { s } = service({}, { initialPath: p });
    expect(await s.initialFile()).toEqual({ ok: true, path: p, text: P1, readOnly: false });
    expect(s.grants.has(p)).toBe(true);
    expect(await service().s.initialFile()).toBeNull();
  });

  it('wrong shapes come back as messages, not throws', async () => {
    const { s } = service();
    expect(await s.save('x')).toEqual({ ok: false, canceled: false, message: 'Not saved: save: the request must be an object { path, text }.' });
    expect(await s.export({ kind: 'plot-png', data: 'x' })).toEqual({ ok: false, canceled: false, message: 'Not exported: export.data must be bytes (Uint8Array) for plot-png.' });
    expect(await s.recoveryWrite(7)).toEqual({ ok: false, canceled: false, message: 'Autosave refused: recovery.write: the request must be an object { text, documentPath }.' });
    expect(await s.openRecent(null)).toEqual({ ok: false, canceled: false, message: 'Not opened: openRecent.path must be a non-empty string.' });
  });

  it('recovered edits of a recent file may be saved back to it; of any other path, not', async () => {
    const p = join(dir, 'a.json');
    writeFileSync(p, P1);
    const first = service({ open: [p] });
    await first.s.open();
    await first.s.recoveryWrite({ text: P2, documentPath: p });
    // next start: a new service, no grants yet
    const next = service();
    expect(next.s.grants.size).toBe(0);
    expect(await next.s.recoveryCheck()).toMatchObject({ text: P2, documentPath: p });
    expect(await next.s.save({ path: p, text: P2 })).toEqual({ ok: true, path: p });
    expect(await next.s.recoveryCheck()).toBeNull();
    // a recovery file naming a path never picked grants nothing
    const elsewhere = join(dir, 'never-picked.json');
    await next.s.recoveryWrite({ text: P2, documentPath: elsewhere });
    const third = service();
    expect(await third.s.recoveryCheck()).toMatchObject({ documentPath: elsewhere });
    expect((await third.s.save({ path: elsewhere, text: P2 })).ok).toBe(false);
    expect(existsSync(elsewhere)).toBe(false);
  });

  it('recovery files are kept per document: declining one offer drops that file only, the other is offered next', async () => {
    const a = join(dir, 'a.json');
    const b = join(dir, 'b.json');
    const { s } = service();
    await s.recoveryWrite({ text: 'edits of a', documentPath: a });
    await new Promise((r) => setTimeout(r, 5)); // a later autosave time for b
    await s.recoveryWrite({ text: 'edits of b', documentPath: b });
    const next = service();
    expect(await next.s.recoveryCheck()).toMatchObject({ text: 'edits of b', documentPath: b });
    await next.s.recoveryDiscard();
    const third = service();
    expect(await third.s.recoveryCheck()).toMatchObject({ text: 'edits of a', documentPath: a });
  });

  it('after another file was opened, a discard (sent after its save) leaves the recovered document\'s edits alone', async () => {
    const a = join(dir, 'a.json');
    const c = join(dir, 'c.json');
    writeFileSync(c, P1);
    await service().s.recoveryWrite({ text: 'edits of a', documentPath: a });
    const next = service({ open: [c] });
    expect(await next.s.recoveryCheck()).toMatchObject({ text: 'edits of a' });
    await next.s.open();
    expect(await next.s.save({ path: c, text: P2 })).toEqual({ ok: true, path: c });
    await next.s.recoveryDiscard();
    expect(await service().s.recoveryCheck()).toMatchObject({ text: 'edits of a', documentPath: a });
  });
});
