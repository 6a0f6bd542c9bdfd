import { resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { projectPathFromArgv } from '../src/main/argv';
import { checkExportRequest, checkRecoveryWrite, checkSaveAsRequest, checkSaveRequest, CHANNELS, MAX_TEXT_CHARS } from '../src/main/ipc';
import { PathGrants } from '../src/main/path-grants';
import { MAX_PROJECT_BYTES } from '../src/core/project/schema';
import { CHANNELS as PRELOAD_CHANNELS } from '../src/preload/bridge';
import { shapeError } from '../src/preload/validate';

/** Wrong shapes, each with the message main gives. */
const BAD: Array<[string, (x: unknown) => { ok: boolean; message?: string }, 'save' | 'saveAs' | 'export' | 'recovery.write', unknown, string]> = [
  ['save: not an object', checkSaveRequest, 'save', 'x.json', 'save: the request must be an object { path, text }'],
  ['save: array', checkSaveRequest, 'save', ['a', 'b'], 'save: the request must be an object { path, text }'],
  ['save: no path', checkSaveRequest, 'save', { text: '{}' }, 'save.path must be a non-empty string'],
  ['save: empty path', checkSaveRequest, 'save', { path: '', text: '{}' }, 'save.path must be a non-empty string'],
  ['save: numeric path', checkSaveRequest, 'save', { path: 3, text: '{}' }, 'save.path must be a non-empty string'],
  ['save: NUL in path', checkSaveRequest, 'save', { path: 'a\0b', text: '{}' }, 'save.path must not contain a NUL character'],
  ['save: text not a string', checkSaveRequest, 'save', { path: '/a.json', text: { a: 1 } }, 'save.text must be a string'],
  ['save: unknown key', checkSaveRequest, 'save', { path: '/a.json', text: '{}', mode: 0o777 }, 'save.mode is not a known field'],
  ['saveAs: no text', checkSaveAsRequest, 'saveAs', {}, 'saveAs.text must be a string'],
  ['saveAs: a path as name', checkSaveAsRequest, 'saveAs', { text: '', suggestedName: '../../etc/x.json' }, 'saveAs.suggestedName must be a file name, not a path'],
  ['export: unknown kind', checkExportRequest, 'export', { kind: 'exe', data: '' }, 'export.kind must be one of envelope-csv, traces-csv, plot-png, plot-svg, datasheet, efficiency-csv, duty-cycle-csv, switching-csv, current-table-header, tolerance-csv'],
  ['export: PNG as text', checkExportRequest, 'export', { kind: 'plot-png', data: 'iVBOR' }, 'export.data must be bytes (Uint8Array) for plot-png'],
  ['export: CSV as bytes', checkExportRequest, 'export', { kind: 'envelope-csv', data: new Uint8Array(3) }, 'export.data must be a string for envelope-csv'],
  ['export: a path smuggled in', checkExportRequest, 'export', { kind: 'plot-svg', data: '<svg/>', path: '/etc/passwd' }, 'export.path is not a known field'],
  ['recovery: bad documentPath', checkRecoveryWrite, 'recovery.write', { text: '', documentPath: 5 }, 'recovery.write.documentPath must be a non-empty string or null'],
  ['recovery: missing documentPath', checkRecoveryWrite, 'recovery.write', { text: '' }, 'recovery.write.documentPath must be a non-empty string or null'],
];

describe('IPC argument checks (main)', () => {
  for (const [what, check, , arg, message] of BAD) {
    it(`rejects ${what} with a message naming the field`, () => {
      expect(check(arg)).toEqual({ ok: false, message });
    });
  }
  it('the preload rejects the same shapes before sending, with the same message', () => {
    for (const [, , call, arg, message] of BAD) expect(shapeError(call, arg)).toBe(message);
  });
  it('accepts the right shapes and returns only the known fields', () => {
    expect(checkSaveRequest({ path: '/a.json', text: '{}' })).toEqual({ ok: true, value: { path: '/a.json', text: '{}' } });
    expect(checkSaveAsRequest({ text: 'x', suggestedName: 'motor.json' })).toEqual({ ok: true, value: { text: 'x', suggestedName: 'motor.json' } });
    const png = new Uint8Array([137, 80, 78, 71]);
    expect(checkExportRequest({ kind: 'plot-png', data: png })).toEqual({ ok: true, value: { kind: 'plot-png', data: png } });
    expect(checkRecoveryWrite({ text: 't', documentPath: null })).toEqual({ ok: true, value: { text: 't', documentPath: null } });
    for (const [, , call] of BAD) expect(typeof call).toBe('string');
    expect(shapeError('save', { path: '/a.json', text: '{}' })).toBeNull();
    expect(shapeError('export', { kind: 'plot-png', data: png })).toBeNull();
  });
  it('refuses an oversized text', () => {
    const r = checkSaveRequest({ path: '/a.json', text: 'x'.repeat(MAX_TEXT_CHARS + 1) });
    expect(r).toEqual({ ok: false, message: `save.text must be at most ${MAX_TEXT_CHARS} characters` });
  });
  it('the text limit is the project file limit, 16 MiB (the schema\'s MAX_PROJECT_BYTES)', () => {
    expect(MAX_TEXT_CHARS).toBe(16_777_216);
    expect(MAX_TEXT_CHARS).toBe(MAX_PROJECT_BYTES);
  });
  it('main and preload use the same channel names', () => {
    expect(PRELOAD_CHANNELS).toEqual(CHANNELS);
    expect(new Set(Object.values(CHANNELS)).size).toBe(Object.keys(CHANNELS).length);
  });
});

describe('path grants', () => {
  it('grant exactly the resolved path picked', () => {
    const g = new PathGrants('linux');
    g.grant('/home/u/p/motor.json');
    expect(g.has('/home/u/p/motor.json')).toBe(true);
    expect(g.has('/home/u/p/../p/motor.json')).toBe(true);
    expect(g.has('/home/u/p/Motor.json')).toBe(false);
    expect(g.has('/home/u/p/motor.json.bak')).toBe(false);
    expect(g.has('/home/u/p')).toBe(false);
    g.revoke('/home/u/p/motor.json');
    expect(g.size).toBe(0);
  });
  it('compare without case where the file system does', () => {
    const g = new PathGrants('darwin');
    g.grant('/Users/u/Motor.json');
    expect(g.has('/users/u/motor.json')).toBe(true);
  });
});

describe('command-line project', () => {
  it('takes the first .json argument, skipping flags and the app path in development', () => {
    expect(projectPathFromArgv(['/usr/bin/electron', '.', '--no-sandbox', 'demo.json'], { packaged: false, cwd: '/w' })).toBe(resolve('/w', 'demo.json'));
    expect(projectPathFromArgv(['/opt/tw/torquewise', '/abs/m.JSON', 'b.json'], { packaged: true, cwd: '/w' })).toBe('/abs/m.JSON');
    expect(projectPathFromArgv(['/usr/bin/electron', 'x.json'], { packaged: false, cwd: '/w' })).toBeNull();
    expect(projectPathFromArgv(['/opt/tw/torquewise', '--inspect=9229', 'notes.txt'], { packaged: true, cwd: '/w' })).toBeNull();
  });
});
