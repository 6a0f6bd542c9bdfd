// Autosave of unsaved edits to one recovery file in the app's user-data folder. It is offered
// back on the next start and removed after a clean save (or when the user declines it).
import { join } from 'node:path';
import type { RecoveryOffer, SaveResult } from '../types/bridge';
import { atomicWrite } from './atomic-write';
import { nodeFs, type FsLayer } from './fs-layer';

export const RECOVERY_FILE_NAME = 'recovery.json';
const RECOVERY_FORMAT = 'torquewise-recovery';
/** Largest project text kept for recovery, in characters (a project is a few kB). */
export const MAX_RECOVERY_CHARS = 16 * 1024 * 1024;

export interface RecoveryOptions {
  fs?: FsLayer;
  /** The clock, for the timestamp. Default: () => new Date(). */
  now?: () => Date;
}

export async function writeRecovery(userDataDir: string, text: string, documentPath: string | null, options: RecoveryOptions = {}): Promise<SaveResult> {
  const fs = options.fs ?? nodeFs;
  const now = options.now ?? (() => new Date());
  const path = join(userDataDir, RECOVERY_FILE_NAME);
  if (text.length > MAX_RECOVERY_CHARS) return { ok: false, canceled: false, message: `Autosave skipped: the project is larger than ${MAX_RECOVERY_CHARS} characters.` };
  const body = JSON.stringify({ format: RECOVERY_FORMAT, version: 1, documentPath, savedAt: now().toISOString(), text });
  try {
    await fs.mkdir(userDataDir);
  } catch {
    // reported by the write below
  }
  const r = await atomicWrite(path, body, { fs });
  return r.ok ? { ok: true, path } : { ok: false, canceled: false, message: `Autosave failed: ${r.message}` };
}

/** The unsaved edits of an earlier run, or null (none, or the recovery file is damaged). */
export async function readRecovery(userDataDir: string, options: RecoveryOptions = {}): Promise<RecoveryOffer | null> {
  const fs = options.fs ?? nodeFs;
  try {
    const o = JSON.parse((await fs.readFile(join(userDataDir, RECOVERY_FILE_NAME))).toString('utf8')) as Record<string, unknown> | null;
    if (!o || o['format'] !== RECOVERY_FORMAT || typeof o['text'] !== 'string' || typeof o['savedAt'] !== 'string') return null;
    const dp = o['documentPath'];
    return { text: o['text'], documentPath: typeof dp === 'string' ? dp : null, savedAt: o['savedAt'] };
  } catch {
    return null;
  }
}

export async function clearRecovery(userDataDir: string, options: RecoveryOptions = {}): Promise<void> {
  const fs = options.fs ?? nodeFs;
  await fs.unlink(join(userDataDir, RECOVERY_FILE_NAME)).catch(() => undefined);
}
