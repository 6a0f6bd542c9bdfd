// One running app: a second launch's file opens in the running instance. The argv -> file logic,
// the service's side of it, and main's wiring of Electron's single-instance lock.
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { FileService } from '../src/main/file-service';
import { secondLaunch } from '../src/main/single-instance';

let dir: string;
beforeEach(() => {
  dir = mkdtempSync(join(tmpdir(), 'tw-single-'));
});
afterEach(() => rmSync(dir, { recursive: true, force: true }));

const P1 = readFileSync(join(__dirname, '../resources/demo-ipm-traction.json'), 'utf8').trimEnd();

describe('secondLaunch', () => {
  it('takes the file named by the second launch, relative to where that launch was started', () => {
    expect(secondLaunch(['/opt/tw/torquewise', 'motor.json'], '/home/u/work', { packaged: true })).toEqual({ focus: true, open: resolve('/home/u/work', 'motor.json') });
    expect(secondLaunch(['/opt/tw/torquewise', '/abs/p.json'], '/home/u/work', { packaged: true }).open).toBe('/abs/p.json');
  });
  it('skips Chromium and app flags, and the app path when not packaged', () => {
    const argv = ['/usr/bin/electron', 'out/main/index.js', '--allow-file-access-from-files', '--original-process-start-time=123', 'drive.JSON'];
    expect(secondLaunch(argv, '/w', { packaged: false }).open).toBe(resolve('/w', 'drive.JSON'));
  });
  it('a launch without a project only brings the window to the front', () => {
    expect(secondLaunch(['/opt/tw/torquewise'], '/w', { packaged: true })).toEqual({ focus: true, open: null });
    expect(secondLaunch(['/opt/tw/torquewise', 'notes.txt', '--flag.json'], '/w', { packaged: true })).toEqual({ focus: true, open: null });
  });
});

describe('the running instance opens the second launch\'s file', () => {
  function service() {
    return new FileService({ userDataDir: join(dir, 'ud'), initialPath: null, platform: 'linux', dialogs: { showOpen: async () => null, showSave: async () => null } });
  }
  it('the window opens it as a recent file, and may save back to it', async () => {
    const p = join(dir, 'second.json');
    writeFileSync(p, P1);
    const s = service();
    expect((await s.openRecent(p)).ok).toBe(false); // not before the launch named it
    await s.launch(p);
    expect(await s.openRecent(p)).toEqual({ ok: true, path: p, text: P1, readOnly: false });
    expect(s.grants.has(p)).toBe(true);
  });
  it('a window made for it (none was open) starts with it, once', async () => {
    const p = join(dir, 'second.json');
    writeFileSync(p, P1);
    const s = service();
    expect(await s.initialFile()).toBeNull();
    await s.launch(p);
    expect(await s.initialFile()).toMatchObject({ ok: true, path: p });
    expect(await s.initialFile()).toBeNull();
  });
});

describe('main holds the single-instance lock', () => {
  const src = readFileSync(join(__dirname, '../src/main/index.ts'), 'utf8');
  it('asks for the lock before the app is ready, quits without it, and handles second launches', () => {
    const lock = src.indexOf('app.requestSingleInstanceLock()');
    expect(lock).toBeGreaterThan(0);
    expect(src.indexOf('app.whenReady()')).toBeGreaterThan(lock);
    expect(src).toMatch(/if \(!app\.requestSingleInstanceLock\(\)\) \{\s*app\.quit\(\);/);
    expect(src).toMatch(/app\.on\('second-instance', \(_event, argv, workingDirectory\) => void onSecondLaunch\(argv, workingDirectory\)\)/);
    expect(src).toContain('secondLaunch(argv, workingDirectory');
  });
});
