import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { CHANNELS, createBridge, type IpcLike } from '../src/preload/bridge';

function fakeIpc(answer: unknown = { ok: true, path: '/x.json' }) {
  const sent: Array<[string, unknown[]]> = [];
  const listeners = new Map<string, Set<(e: unknown, ...a: unknown[]) => void>>();
  const ipc: IpcLike = {
    invoke: async (ch, ...args) => {
      sent.push([ch, args]);
      return answer;
    },
    on: (ch, l) => {
      if (!listeners.has(ch)) listeners.set(ch, new Set());
      listeners.get(ch)!.add(l);
    },
    removeListener: (ch, l) => listeners.get(ch)?.delete(l),
  };
  const emit = (ch: string, payload: unknown) => listeners.get(ch)?.forEach((l) => l({ sender: 'SECRET' }, payload));
  return { ipc, sent, emit, listeners };
}

describe('preload bridge', () => {
  it('exposes exactly the TorquewiseBridge members, all functions', () => {
    const b = createBridge(fakeIpc().ipc);
    expect(Object.keys(b).sort()).toEqual(['export', 'initialFile', 'onMenu', 'open', 'openRecent', 'recent', 'recovery', 'save', 'saveAs']);
    expect(Object.keys(b.recovery).sort()).toEqual(['check', 'discard', 'write']);
    const all = [...Object.values(b).filter((v) => typeof v !== 'object'), ...Object.values(b.recovery)];
    expect(all.every((v) => typeof v === 'function')).toBe(true);
  });

  it('sends each call on its channel with one argument', async () => {
    const f = fakeIpc();
    const b = createBridge(f.ipc);
    await b.open();
    await b.save({ path: '/a.json', text: '{}' });
    await b.saveAs({ text: '{}' });
    await b.export({ kind: 'plot-svg', data: '<svg/>' });
    await b.openRecent('/r.json');
    await b.recent();
    await b.initialFile();
    await b.recovery.check();
    await b.recovery.write({ text: 't', documentPath: null });
    await b.recovery.discard();
    expect(f.sent).toEqual([
      [CHANNELS.open, []],
      [CHANNELS.save, [{ path: '/a.json', text: '{}' }]],
      [CHANNELS.saveAs, [{ text: '{}' }]],
      [CHANNELS.export, [{ kind: 'plot-svg', data: '<svg/>' }]],
      [CHANNELS.openRecent, ['/r.json']],
      [CHANNELS.recent, []],
      [CHANNELS.initialFile, []],
      [CHANNELS.recoveryCheck, []],
      [CHANNELS.recoveryWrite, [{ text: 't', documentPath: null }]],
      [CHANNELS.recoveryDiscard, []],
    ]);
  });

  it('rejects wrong shapes without sending anything, with a message', async () => {
    const f = fakeIpc();
    const b = createBridge(f.ipc);
    expect(await b.save({ path: 42, text: '' } as never)).toEqual({ ok: false, canceled: false, message: 'save.path must be a non-empty string' });
    expect(await b.export({ kind: 'plot-png', data: 'abc' } as never)).toEqual({ ok: false, canceled: false, message: 'export.data must be bytes (Uint8Array) for plot-png' });
    expect(await b.openRecent('' as never)).toEqual({ ok: false, canceled: false, message: 'openRecent.path must be a non-empty string' });
    expect(await b.saveAs(null as never)).toEqual({ ok: false, canceled: false, message: 'saveAs: the request must be an object { text, suggestedName? }' });
    expect(await b.recovery.write({ text: 1 } as never)).toEqual({ ok: false, canceled: false, message: 'recovery.write.text must be a string' });
    expect(f.sent).toEqual([]);
    expect(() => b.onMenu('nope' as never)).toThrow('onMenu(listener): listener must be a function');
  });

  it('passes on menu events without the IPC event object, drops unknown ones, and unsubscribes', () => {
    const f = fakeIpc();
    const b = createBridge(f.ipc);
    const got: unknown[] = [];
    const off = b.onMenu((e) => got.push(e));
    f.emit(CHANNELS.menu, { name: 'file:save' });
    f.emit(CHANNELS.menu, { name: 'file:open-recent', path: '/p.json', extra: 1 });
    f.emit(CHANNELS.menu, { name: 'shell:exec' });
    f.emit(CHANNELS.menu, null);
    expect(got).toEqual([{ name: 'file:save' }, { name: 'file:open-recent', path: '/p.json' }]);
    expect(JSON.stringify(got)).not.toContain('SECRET');
    off();
    f.emit(CHANNELS.menu, { name: 'file:new' });
    expect(got).toHaveLength(2);
    expect(f.listeners.get(CHANNELS.menu)!.size).toBe(0);
  });

  it('index.ts exposes only the bridge, under one name, and hands no Node API or ipcRenderer to the page', () => {
    const src = readFileSync(join(__dirname, '../src/preload/index.ts'), 'utf8');
    expect(src.match(/exposeInMainWorld\(/g)).toHaveLength(1);
    expect(src).toContain("contextBridge.exposeInMainWorld('torquewise', createBridge(ipcRenderer));");
    expect(src).not.toMatch(/from ['"]node:|require\(/);
  });
});
