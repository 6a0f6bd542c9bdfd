// Atomic replace of a file: write a temporary file in the same folder, fsync it, rename it over
// the target, then fsync the folder where the platform allows. A failure at any step leaves the
// old file as it was; a crash leaves at most a temporary file, removed by a later save once it is
// stale (its process is gone, or it is older than a bound), never while another save still writes it.
//
// The file keeps what made it the user's: a symbolic link is followed (the link's target is
// replaced, the link stays), the permission bits (group-writable, setgid and sticky included) are
// copied, and the owner and group where the system permits. Two cases are refused, with a
// sentence, instead of being replaced silently: a read-only file, and a file with more than one
// hard link (replacing it would leave the other names with the old content).
import { basename, dirname, join } from 'node:path';
import { hostname } from 'node:os';
import { randomBytes } from 'node:crypto';
import { describeFsError, nodeFs, type FileHandleLike, type FileStat, type FsLayer } from './fs-layer';

/** 'check' is before anything is written: the target is a folder, read-only or hard-linked. */
export type WriteStep = 'check' | 'open' | 'write' | 'fsync' | 'close' | 'rename';

export type AtomicWriteResult =
  | {
      ok: true;
      path: string;
      /** stale temporaries of earlier crashed saves that were removed */
      cleaned: number;
      /** false when the folder could not be flushed after the rename: the new content is in place, but a power loss could still undo it */
      durable: boolean;
      /** set when not durable: a sentence for the user */
      warning?: string;
    }
  | {
      ok: false;
      path: string;
      step: WriteStep;
      code: string | null;
      /** what went wrong, as a phrase: "the disk is full (while writing)" */
      reason: string;
      /** the whole sentence for the user */
      message: string;
    };

export interface AtomicWriteOptions {
  fs?: FsLayer;
  /** process.platform by default; folder fsync is skipped on win32, where it is not possible. */
  platform?: string;
  /** Permission bits of a new file (an existing file keeps its own). Default 0o644. */
  mode?: number;
  /** A temporary of another save older than this is stale, ms. Default 10 minutes. */
  staleAfterMs?: number;
  /** Whether a process of this machine still runs (default: signal 0). A temporary of a process that is gone is stale at once. */
  isProcessAlive?: (pid: number) => boolean;
}

export const DEFAULT_ATOMIC_WRITE_OPTIONS = { mode: 0o644, staleAfterMs: 10 * 60 * 1000 } as const;

const TEMP_SUFFIX = '.tw-tmp';
/** This machine's name as it may appear in a file name. */
const HOST = hostname().replace(/[^A-Za-z0-9-]/g, '-').slice(0, 40);

/**
 * The temporary name for a save of `target`: hidden, same folder, unique per attempt, and naming
 * its writer (`<pid>@<host>.<random>`) so that a later save can tell whether that writer is gone.
 */
export function tempPathFor(target: string, tag: string = `${process.pid}@${HOST}.${randomBytes(4).toString('hex')}`): string {
  return join(dirname(target), `.${basename(target)}.${tag}${TEMP_SUFFIX}`);
}

/** True for a temporary left by a save of `target` (any process, any attempt). */
export function isTempOf(target: string, name: string): boolean {
  const prefix = `.${basename(target)}.`;
  return name.startsWith(prefix) && name.endsWith(TEMP_SUFFIX) && name.length > prefix.length + TEMP_SUFFIX.length;
}

function processAlive(pid: number): boolean {
  if (!(Number.isInteger(pid) && pid > 0)) return true;
  try {
    process.kill(pid, 0);
    return true;
  } catch (e) {
    return (e as NodeJS.ErrnoException).code === 'EPERM'; // it runs, under another user
  }
}

/**
 * Whether the temporary `name` of `target` may be removed: older than the bound, or written by a
 * process of this machine that is no longer running. A temporary whose writer still runs (another
 * window of this process, another instance of the app) is left alone, so concurrent saves never
 * delete each other's temporaries.
 */
export function isStaleTemp(target: string, name: string, mtimeMs: number, now: number, options: Pick<AtomicWriteOptions, 'staleAfterMs' | 'isProcessAlive'> = {}): boolean {
  if (!isTempOf(target, name)) return false;
  if (now - mtimeMs > (options.staleAfterMs ?? DEFAULT_ATOMIC_WRITE_OPTIONS.staleAfterMs)) return true;
  const tag = name.slice(basename(target).length + 2, -TEMP_SUFFIX.length);
  const m = /^(\d+)@([A-Za-z0-9-]*)\.[0-9a-f]+$/.exec(tag);
  if (!m || m[2] !== HOST) return false; // an unknown writer or another machine: only the age tells
  return !(options.isProcessAlive ?? processAlive)(Number(m[1]));
}

/** Remove stale temporaries left beside `target` by crashed saves; returns how many were removed. */
export async function cleanStaleTemps(target: string, fs: FsLayer = nodeFs, options: Pick<AtomicWriteOptions, 'staleAfterMs' | 'isProcessAlive'> = {}): Promise<number> {
  let names: string[];
  try {
    names = await fs.readdir(dirname(target));
  } catch {
    return 0;
  }
  let n = 0;
  const now = Date.now();
  for (const name of names) {
    if (!isTempOf(target, name)) continue;
    try {
      const p = join(dirname(target), name);
      const st = await fs.stat(p);
      if (!st || !isStaleTemp(target, name, st.mtimeMs, now, options)) continue;
      await fs.unlink(p);
      n++;
    } catch {
      // best effort: a temporary we cannot remove harms nothing
    }
  }
  return n;
}

function stepVerb(step: WriteStep): string {
  switch (step) {
    case 'check': return 'checking the file';
    case 'open': return 'creating the temporary file';
    case 'write': return 'writing';
    case 'fsync': return 'flushing to disk';
    case 'close': return 'closing the temporary file';
    case 'rename': return 'replacing the file';
  }
}

/** Mode bits kept from the replaced file: permissions, setuid, setgid, sticky. */
const KEPT_MODE_BITS = 0o7777;

export async function atomicWrite(target: string, data: string | Uint8Array, options: AtomicWriteOptions = {}): Promise<AtomicWriteResult> {
  const fs = options.fs ?? nodeFs;
  const platform = options.platform ?? process.platform;
  const name = basename(target);
  const refuse = (code: string, reason: string, existed: boolean): AtomicWriteResult => ({
    ok: false,
    path: target,
    step: 'check',
    code,
    reason,
    message: `Could not save "${name}": ${reason}. ${existed ? 'The file on disk is unchanged.' : 'Nothing was written.'}`,
  });
  let old: FileStat | null = null;
  // the file actually replaced: the target of a symbolic link (the link itself stays)
  let dest = target;
  try {
    old = await fs.stat(target);
  } catch {
    // stat trouble shows up again at open, with its reason
  }
  if (old) {
    if (!old.isFile) return refuse('EISDIR', 'the path is a folder', false);
    try {
      dest = await fs.realpath(target);
    } catch {
      // the link changed under us: the rename below then writes the name given
    }
    if (old.nlink > 1) {
      return refuse('EMLINK', `the file has ${old.nlink} hard links (other names for the same file), and replacing it would leave the other names with the old content. Save under another name, or remove the other links first`, true);
    }
    if ((old.mode & 0o222) === 0 || !(await fs.canWrite(dest))) {
      return refuse('EACCES', 'the file is read-only. Make it writable, or save under another name', true);
    }
  }
  const cleaned = await cleanStaleTemps(dest, fs, options);
  const temp = tempPathFor(dest);
  let handle: FileHandleLike | null = null;
  let step: WriteStep = 'open';
  const unchanged = old ? 'The file on disk is unchanged.' : 'Nothing was written.';
  try {
    handle = await fs.open(temp, 'wx', old ? old.mode & 0o777 : options.mode ?? DEFAULT_ATOMIC_WRITE_OPTIONS.mode);
    if (old) {
      // owner and group first (a change of owner may clear setgid), then the exact bits: the mode
      // given to open is masked by the umask and has no setgid. Both where the system permits.
      await handle.chown(old.uid, old.gid).catch(() => undefined);
      await handle.chmod(old.mode & KEPT_MODE_BITS).catch(() => undefined);
    }
    step = 'write';
    await handle.writeFile(data);
    step = 'fsync';
    await handle.sync();
    step = 'close';
    const h = handle;
    handle = null;
    await h.close();
    step = 'rename';
    await fs.rename(temp, dest);
  } catch (e) {
    if (handle) await handle.close().catch(() => undefined);
    if (step !== 'open') await fs.unlink(temp).catch(() => undefined);
    const code = (e as NodeJS.ErrnoException | null)?.code ?? null;
    const reason = `${describeFsError(e)} (while ${stepVerb(step)})`;
    return { ok: false, path: target, step, code, reason, message: `Could not save "${name}": ${reason}. ${unchanged}` };
  }
  // The rename is done; make it durable by flushing the folder. If that fails, the new content is
  // in place but a power loss could still undo the rename: say so (the save is not durable).
  if (platform !== 'win32') {
    try {
      const dir = await fs.open(dirname(dest), 'r');
      try {
        await dir.sync();
      } finally {
        await dir.close();
      }
    } catch (e) {
      return {
        ok: true,
        path: target,
        cleaned,
        durable: false,
        warning: `Saved "${name}", but the system did not confirm that the folder was written to disk (${describeFsError(e)}): if the power fails soon, the save may be lost. Save again, or check the disk.`,
      };
    }
  }
  return { ok: true, path: target, cleaned, durable: true };
}
