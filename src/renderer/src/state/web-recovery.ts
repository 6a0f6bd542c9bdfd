// The web page's recovery of unsaved edits, kept in local storage: the browser's counterpart of the
// desktop's recovery file. An entry is offered at most once as it is: checking marks it offered,
// and only a fresh autosave (new edits, or the restore that succeeded) clears the mark. An entry
// still marked at the next start could not be restored (it was refused, or the tab went down while
// restoring it), and an entry that cannot be read at all cannot be offered: either is moved aside
// under its own key (nothing is lost) and is not offered again. Plain logic over a storage
// interface, tested under Node.
import type { RecoveryOffer } from '../../../types/bridge';

/** Key of the autosaved edits (the web variant's recovery file). */
export const RECOVERY_KEY = 'torquewise.recovery';
/** Entries that could not be restored are kept under this prefix and the time they were set aside. */
export const SET_ASIDE_PREFIX = 'torquewise.recovery.set-aside.';

export interface StorageLike {
  getItem(key: string): string | null;
  setItem(key: string, value: string): void;
  removeItem(key: string): void;
}

interface Entry extends RecoveryOffer {
  /** set when the entry has been offered; cleared by the next autosave */
  offered?: boolean;
}

function readEntry(raw: string): Entry | null {
  try {
    const o = JSON.parse(raw) as Partial<Entry> | null;
    if (!o || typeof o !== 'object' || typeof o.text !== 'string' || typeof o.savedAt !== 'string') return null;
    return { text: o.text, documentPath: typeof o.documentPath === 'string' ? o.documentPath : null, savedAt: o.savedAt, offered: o.offered === true };
  } catch {
    return null;
  }
}

export interface WebRecovery {
  /** The edits to offer, or null. Marks the entry offered; an unrestorable one is set aside instead. */
  check(): RecoveryOffer | null;
  /** Autosave (also right after a successful restore): a fresh entry, not yet offered. */
  write(text: string, documentPath: string | null): void;
  /** The user declined the offer, or saved: drop the entry. */
  discard(): void;
}

/**
 * `storage` is called on each use (local storage may be missing or refuse: private mode, quota);
 * a refusing storage only loses the autosave, never the edits on screen.
 */
export function webRecovery(storage: () => StorageLike | null | undefined, now: () => Date = () => new Date()): WebRecovery {
  const setAside = (s: StorageLike, raw: string): void => {
    try {
      s.setItem(`${SET_ASIDE_PREFIX}${now().toISOString()}`, raw);
      s.removeItem(RECOVERY_KEY);
    } catch {
      // no room to keep a copy: the entry stays where it is (marked, so it is not offered again)
    }
  };
  return {
    check() {
      try {
        const s = storage();
        const raw = s?.getItem(RECOVERY_KEY);
        if (!s || !raw) return null;
        const e = readEntry(raw);
        if (!e || e.offered) {
          setAside(s, raw);
          return null;
        }
        s.setItem(RECOVERY_KEY, JSON.stringify({ ...e, offered: true }));
        return { text: e.text, documentPath: e.documentPath, savedAt: e.savedAt };
      } catch {
        return null;
      }
    },
    write(text, documentPath) {
      try {
        const entry: RecoveryOffer = { text, documentPath, savedAt: now().toISOString() };
        storage()?.setItem(RECOVERY_KEY, JSON.stringify(entry));
      } catch {
        /* storage full or refused: the edits stay on screen */
      }
    },
    discard() {
      try {
        storage()?.removeItem(RECOVERY_KEY);
      } catch {
        /* nothing kept */
      }
    },
  };
}
