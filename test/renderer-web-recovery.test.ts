// The web page's autosave: an entry that cannot be restored is offered once, then kept aside.
import { afterEach, describe, expect, it } from 'vitest';
import { browserRecovery } from '../src/renderer/src/state/file-bridge';
import { RECOVERY_KEY, SET_ASIDE_PREFIX, webRecovery, type StorageLike } from '../src/renderer/src/state/web-recovery';

class MemoryStorage implements StorageLike {
  readonly map = new Map<string, string>();
  full = false;
  getItem(k: string) {
    return this.map.get(k) ?? null;
  }
  setItem(k: string, v: string) {
    if (this.full && !this.map.has(k)) throw new Error('QuotaExceededError');
    this.map.set(k, v);
  }
  removeItem(k: string) {
    this.map.delete(k);
  }
}

let clock = 0;
const now = () => new Date(Date.UTC(2026, 0, 2, 3, 4, 5) + 1000 * clock++);

describe('web recovery', () => {
  it('offers an entry, and offers it again after the restore autosaved it afresh', () => {
    const s = new MemoryStorage();
    const r = webRecovery(() => s, now);
    r.write('{"edited":1}', null);
    const offer = r.check();
    expect(offer).toMatchObject({ text: '{"edited":1}', documentPath: null });
    // restored: the app autosaves the restored text at once
    r.write(offer!.text, offer!.documentPath);
    expect(r.check()?.text).toBe('{"edited":1}');
  });

  it('an entry offered and not restored is kept aside at the next start and not offered again', () => {
    const s = new MemoryStorage();
    const r = webRecovery(() => s, now);
    r.write('not a project {', 'a.json');
    const raw = s.getItem(RECOVERY_KEY)!;
    expect(r.check()?.text).toBe('not a project {'); // offered once
    // the restore failed (or the tab went down): no autosave followed
    expect(r.check()).toBeNull();
    expect(r.check()).toBeNull();
    expect(s.getItem(RECOVERY_KEY)).toBeNull();
    const aside = [...s.map.keys()].filter((k) => k.startsWith(SET_ASIDE_PREFIX));
    expect(aside).toHaveLength(1);
    // nothing lost: the text and its file name are all there
    expect(JSON.parse(s.getItem(aside[0]!)!)).toMatchObject({ text: 'not a project {', documentPath: 'a.json', savedAt: JSON.parse(raw).savedAt, offered: true });
  });

  it('an entry that cannot be read at all is kept aside as it is, never offered', () => {
    const s = new MemoryStorage();
    s.setItem(RECOVERY_KEY, '{"text": 1, "savedAt":');
    const r = webRecovery(() => s, now);
    expect(r.check()).toBeNull();
    expect(s.getItem(RECOVERY_KEY)).toBeNull();
    expect([...s.map.values()]).toEqual(['{"text": 1, "savedAt":']);
  });

  it('a storage with no room for the copy keeps the entry where it is, and still does not offer it again', () => {
    const s = new MemoryStorage();
    const r = webRecovery(() => s, now);
    r.write('x', null);
    expect(r.check()?.text).toBe('x');
    s.full = true;
    expect(r.check()).toBeNull();
    expect(JSON.parse(s.getItem(RECOVERY_KEY)!)).toMatchObject({ text: 'x', offered: true });
  });

  it('a missing or refusing storage offers nothing and throws nothing', () => {
    expect(webRecovery(() => undefined).check()).toBeNull();
    const refusing = webRecovery(() => {
      throw new Error('SecurityError');
    });
    expect(refusing.check()).toBeNull();
    expect(() => refusing.write('x', null)).not.toThrow();
    expect(() => refusing.discard()).not.toThrow();
  });
});

describe('the page uses it (local storage)', () => {
  const g = globalThis as { localStorage?: StorageLike };
  afterEach(() => {
    delete g.localStorage;
  });
  it('an unrestorable autosave is offered once by the page, then kept aside', () => {
    const s = new MemoryStorage();
    g.localStorage = s;
    s.setItem(RECOVERY_KEY, JSON.stringify({ text: '{"requirements": [', documentPath: null, savedAt: '2026-01-01T00:00:00.000Z' }));
    expect(browserRecovery.check()?.text).toBe('{"requirements": [');
    expect(browserRecovery.check()).toBeNull();
    expect([...s.map.keys()].filter((k) => k.startsWith(SET_ASIDE_PREFIX))).toHaveLength(1);
  });
});
