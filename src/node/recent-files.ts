// The recently used project files: a short list, newest first, kept as JSON in the app's
// user-data folder. A missing or damaged list reads as empty; it is only a convenience.
import { join, resolve } from 'node:path';
import { atomicWrite } from './atomic-write';
import { nodeFs, type FsLayer } from './fs-layer';

export const RECENT_FILE_NAME = 'recent-files.json';

export interface RecentOptions {
  fs?: FsLayer;
  /** Longest list kept. Default 10. */
  max?: number;
}
export const DEFAULT_RECENT_OPTIONS = { max: 10 } as const;

export async function readRecent(userDataDir: string, options: RecentOptions = {}): Promise<string[]> {
  const fs = options.fs ?? nodeFs;
  const max = options.max ?? DEFAULT_RECENT_OPTIONS.max;
  try {
    const json: unknown = JSON.parse((await fs.readFile(join(userDataDir, RECENT_FILE_NAME))).toString('utf8'));
    const list = (json as { files?: unknown } | null)?.files;
    if (!Array.isArray(list)) return [];
    const out: string[] = [];
    for (const p of list) {
      if (typeof p === 'string' && p.length > 0 && p.length < 4096 && !out.includes(p)) out.push(p);
      if (out.length >= max) break;
    }
    return out;
  } catch {
    return [];
  }
}

async function writeRecent(userDataDir: string, files: string[], fs: FsLayer): Promise<void> {
  try {
    await fs.mkdir(userDataDir);
    await atomicWrite(join(userDataDir, RECENT_FILE_NAME), `${JSON.stringify({ files }, null, 2)}\n`, { fs });
  } catch {
    // the list is a convenience: failing to store it never blocks the user's own save
  }
}

/** Put `path` first (once); returns the new list. */
export async function addRecent(userDataDir: string, path: string, options: RecentOptions = {}): Promise<string[]> {
  const fs = options.fs ?? nodeFs;
  const max = options.max ?? DEFAULT_RECENT_OPTIONS.max;
  const abs = resolve(path);
  const files = [abs, ...(await readRecent(userDataDir, { fs, max })).filter((p) => p !== abs)].slice(0, max);
  await writeRecent(userDataDir, files, fs);
  return files;
}

/** Drop `path` (e.g. it no longer opens); returns the new list. */
export async function removeRecent(userDataDir: string, path: string, options: RecentOptions = {}): Promise<string[]> {
  const fs = options.fs ?? nodeFs;
  const abs = resolve(path);
  const files = (await readRecent(userDataDir, options)).filter((p) => p !== abs);
  await writeRecent(userDataDir, files, fs);
  return files;
}
