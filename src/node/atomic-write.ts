// Atomic replace of a file: write a temporary file in the same folder, fsync it, rename it over
// the target, then fsync the folder where the platform allows. A failure at any step leaves the
// old file as it was; a crash leaves at most a temporary file, removed by the next save.
import { basename, dirname, join } from 'node:path';
import { randomBytes } from 'node:crypto';
import { describeFsError, nodeFs, type FileHandleLike, type FsLayer } from './fs-layer';

export type WriteStep = 'open' | 'write' | 'fsync' | 'close' | 'rename';

export type AtomicWriteResult =
  | { ok: true; path: string; /** stale temporaries of earlier crashed saves that were removed */ cleaned: number }
  | { ok: false; path: string; step: WriteStep; code: string | null; message: string };

export interface AtomicWriteOptions {
  fs?: FsLayer;
  /** process.platform by default; folder fsync is skipped on win32, where it is not possible. */
  platform?: string;
  /** Permission bits of a new file (an existing file keeps its own). Default 0o644. */
  mode?: number;
}

export const DEFAULT_ATOMIC_WRITE_OPTIONS: Required<Omit<AtomicWriteOptions, 'fs' | 'platform'>> = { mode: 0o644 };

const TEMP_SUFFIX = '.tw-tmp';

/** The temporary name for a save of `target`: hidden, same folder, unique per attempt. */
export function tempPathFor(target: string, tag: string = `${process.pid}-${randomBytes(4).toString('hex')}`): string {
  return join(dirname(target), `.${basename(target)}.${tag}${TEMP_SUFFIX}`);
}

/** True for a temporary left by a save of `target` (any process, any attempt). */
export function isTempOf(target: string, name: string): boolean {
  const prefix = `.${basename(target)}.`;
  return name.startsWith(prefix) && name.endsWith(TEMP_SUFFIX) && name.length > prefix.length + TEMP_SUFFIX.length;
}

/** Remove temporaries left beside `target` by crashed saves; returns how many were removed. */
export async function cleanStaleTemps(target: string, fs: FsLayer = nodeFs): Promise<number> {
  let names: string[];
  try {
    names = await fs.readdir(dirname(target));
  } catch {
    return 0;
  }
  let n = 0;
  for (const name of names) {
    if (!isTempOf(target, name)) continue;
    try {
      await fs.unlink(join(dirname(target), name));
      n++;
    } catch {
      // best effort: a temporary we cannot remove harms nothing
    }
  }
  return n;
}

function stepVerb(step: WriteStep): string {
  switch (step) {
    case 'open': return 'creating the temporary file';
    case 'write': return 'writing';
    case 'fsync': return 'flushing to disk';
    case 'close': return 'closing the temporary file';
    case 'rename': return 'replacing the file';
  }
}

export async function atomicWrite(target: string, data: string | Uint8Array, options: AtomicWriteOptions = {}): Promise<AtomicWriteResult> {
  const fs = options.fs ?? nodeFs;
  const platform = options.platform ?? process.platform;
  const name = basename(target);
  let existed = false;
  let mode = options.mode ?? DEFAULT_ATOMIC_WRITE_OPTIONS.mode;
  try {
    const st = await fs.stat(target);
    if (st) {
      if (!st.isFile) return { ok: false, path: target, step: 'open', code: 'EISDIR', message: `Could not save "${name}": the path is a folder. Nothing was written.` };
      existed = true;
      mode = st.mode & 0o777;
    }
  } catch {
    // stat trouble shows up again at open, with its reason
  }
  const cleaned = await cleanStaleTemps(target, fs);
  const temp = tempPathFor(target);
  let handle: FileHandleLike | null = null;
  let step: WriteStep = 'open';
  const unchanged = existed ? 'The file on disk is unchanged.' : 'Nothing was written.';
  try {
    handle = await fs.open(temp, 'wx', mode);
    step = 'write';
    await handle.writeFile(data);
    step = 'fsync';
    await handle.sync();
    step = 'close';
    const h = handle;
    handle = null;
    await h.close();
    step = 'rename';
    await fs.rename(temp, target);
  } catch (e) {
    if (handle) await handle.close().catch(() => undefined);
    if (step !== 'open') await fs.unlink(temp).catch(() => undefined);
    const code = (e as NodeJS.ErrnoException | null)?.code ?? null;
    return {
      ok: false,
      path: target,
      step,
      code,
      message: `Could not save "${name}": ${describeFsError(e)} (while ${stepVerb(step)}). ${unchanged}`,
    };
  }
  // The rename is done; make it durable. Some platforms and file systems refuse a folder fsync:
  // the data is already safe in the renamed file, so that is not reported as a failure.
  if (platform !== 'win32') {
    try {
      const dir = await fs.open(dirname(target), 'r');
      try {
        await dir.sync();
      } finally {
        await dir.close();
      }
    } catch {
      // not possible here
    }
  }
  return { ok: true, path: target, cleaned };
}
