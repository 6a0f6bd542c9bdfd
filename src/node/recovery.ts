// Autosave of unsaved edits, one recovery file per document in the app's user-data folder
// (recovery-<key>.json, the key a hash of the document's path; "untitled" for a project never
// saved), so two documents never share one file. The newest is offered back on the next start;
// a document's file is removed after a clean save of it (or when the user declines it).
import { createHash } from 'node:crypto';
import { join } from 'node:path';
import type { RecoveryOffer, SaveResult } from '../types/bridge';
import { atomicWrite } from './atomic-write';
import { nodeFs, type FsLayer } from './fs-layer';
import { MAX_PROJECT_BYTES } from '../core/project/schema-keys';

/** The single recovery file of earlier versions: still read (and removed with its document). */
export const LEGACY_RECOVERY_FILE_NAME = 'recovery.json';
const RECOVERY_FORMAT = 'torquewise-recovery';
const RECOVERY_FILE = /^recovery(-(untitled|[0-9a-f]{16}))?\.json$/;
/** Largest project text kept for recovery, in characters: as long as a project file may be (the schema's MAX_PROJECT_BYTES; a project is a few kB). */
export const MAX_RECOVERY_CHARS = MAX_PROJECT_BYTES;

export interface RecoveryOptions {
  fs?: FsLayer;
  /** The clock, for the timestamp. Default: () => new Date(). */
  now?: () => Date;
}

/** The recovery file of one document: recovery-untitled.json, or recovery-<16 hex digits of SHA-256 of the path>.json. */
export function recoveryFileName(documentPath: string | null): string {
  if (documentPath === null) return 'recovery-untitled.json';
  return `recovery-${createHash('sha256').update(documentPath, 'utf8').digest('hex').slice(0, 16)}.json`;
}

export async function writeRecovery(userDataDir: string, text: string, documentPath: string | null, options: RecoveryOptions = {}): Promise<SaveResult> {
  const fs = options.fs ?? nodeFs;
  const now = options.now ?? (() => new Date());
  const path = join(userDataDir, recoveryFileName(documentPath));
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

async function readOne(fs: FsLayer, path: string): Promise<RecoveryOffer | null> {
  try {
    const o = JSON.parse((await fs.readFile(path)).toString('utf8')) as Record<string, unknown> | null;
    if (!o || o['format'] !== RECOVERY_FORMAT || typeof o['text'] !== 'string' || typeof o['savedAt'] !== 'string') return null;
    const dp = o['documentPath'];
    return { text: o['text'], documentPath: typeof dp === 'string' ? dp : null, savedAt: o['savedAt'] };
  } catch {
    return null;
  }
}

/** Every readable recovery file, newest first, with its file name. */
export async function listRecoveries(userDataDir: string, options: RecoveryOptions = {}): Promise<Array<{ file: string; offer: RecoveryOffer }>> {
  const fs = options.fs ?? nodeFs;
  let names: string[];
  try {
    names = await fs.readdir(userDataDir);
  } catch {
    return [];
  }
  const out: Array<{ file: string; offer: RecoveryOffer }> = [];
  for (const file of names.filter((n) => RECOVERY_FILE.test(n)).sort()) {
    const offer = await readOne(fs, join(userDataDir, file));
    if (offer) out.push({ file, offer });
  }
  return out.sort((a, b) => (a.offer.savedAt < b.offer.savedAt ? 1 : a.offer.savedAt > b.offer.savedAt ? -1 : 0));
}

/** The newest unsaved edits of an earlier run, or null (none, or only damaged files). */
export async function readRecovery(userDataDir: string, options: RecoveryOptions = {}): Promise<RecoveryOffer | null> {
  return (await listRecoveries(userDataDir, options))[0]?.offer ?? null;
}

/** Remove the recovery file of one document (and an older version's single file when it was that document's). */
export async function clearRecovery(userDataDir: string, documentPath: string | null, options: RecoveryOptions = {}): Promise<void> {
  const fs = options.fs ?? nodeFs;
  await fs.unlink(join(userDataDir, recoveryFileName(documentPath))).catch(() => undefined);
  const legacy = join(userDataDir, LEGACY_RECOVERY_FILE_NAME);
  const old = await readOne(fs, legacy);
  if (old && old.documentPath === documentPath) await fs.unlink(legacy).catch(() => undefined);
}
