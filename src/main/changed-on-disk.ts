// Save notices that the file changed on disk since this window read or wrote it (another
// program, another window). The check is plain logic over the file layer; the question main asks
// is data, like the unsaved-changes prompt, so both are tested under Node.
import { basename } from 'node:path';
import { nodeFs, type FsLayer } from '../node/fs-layer';
import { decodeProjectBytes, ProjectReadError } from '../node/project-file';

/** What this session last knew of a file: the text it read or wrote, and when. */
export interface KnownVersion {
  /** the text read or written here; null when only the time is known (recovered edits) */
  text: string | null;
  /** when this session (or the autosave it recovered) last had the file */
  at: Date;
  /** what happened at `at`, for the question: 'opened', 'saved' or 'autosaved' */
  how: 'opened' | 'saved' | 'autosaved';
}

export interface ChangedOnDisk {
  path: string;
  name: string;
  /** when the file was opened or last saved here */
  ours: Date;
  how: KnownVersion['how'];
  /** when the file on disk was last modified */
  disk: Date;
}

/**
 * Has the file on disk changed since `known`? Compared by content when the text is known (a file
 * touched but unchanged is not a change), by modification time otherwise. A file that is gone, or
 * cannot be read, is not reported here: the save itself says what happens to it.
 */
export async function changedOnDisk(path: string, known: KnownVersion | undefined, fs: FsLayer = nodeFs): Promise<ChangedOnDisk | null> {
  if (!known) return null;
  let st: Awaited<ReturnType<FsLayer['stat']>>;
  try {
    st = await fs.stat(path);
  } catch {
    return null;
  }
  if (!st || !st.isFile) return null;
  const disk = new Date(st.mtimeMs ?? Number.NaN);
  let changed: boolean;
  if (known.text !== null) {
    let bytes: Uint8Array;
    try {
      bytes = await fs.readFile(path);
    } catch {
      return null;
    }
    // decoded as a project file is read (src/node/project-file.ts); bytes that are not UTF-8 are
    // not the text read or written here
    try {
      changed = decodeProjectBytes(bytes) !== known.text;
    } catch (e) {
      if (!(e instanceof ProjectReadError)) throw e;
      changed = true;
    }
  } else {
    changed = Number.isFinite(disk.getTime()) && disk.getTime() > known.at.getTime();
  }
  return changed ? { path, name: basename(path), ours: known.at, how: known.how, disk } : null;
}

/** Local date and time, 2026-03-04 05:06:07 (a time that is not known reads "unknown"). */
export function formatLocalTime(d: Date): string {
  if (!Number.isFinite(d.getTime())) return 'unknown';
  const p = (n: number) => String(n).padStart(2, '0');
  return `${d.getFullYear()}-${p(d.getMonth() + 1)}-${p(d.getDate())} ${p(d.getHours())}:${p(d.getMinutes())}:${p(d.getSeconds())}`;
}

/** Options for Electron's dialog.showMessageBox. */
export interface ChangedOnDiskPrompt {
  type: 'warning';
  title: string;
  message: string;
  detail: string;
  buttons: string[];
  defaultId: number;
  cancelId: number;
  noLink: true;
}

/** Button index that lets the save replace the changed file. */
export const OVERWRITE_BUTTON = 1;

const HOW: Record<KnownVersion['how'], string> = {
  opened: 'Opened here',
  saved: 'Last saved here',
  autosaved: 'Your recovered edits were autosaved',
};

export function changedOnDiskPrompt(c: ChangedOnDisk, format: (d: Date) => string = formatLocalTime): ChangedOnDiskPrompt {
  return {
    type: 'warning',
    title: 'File changed on disk',
    message: `“${c.name}” was changed on disk by another program or window.`,
    detail:
      `${HOW[c.how]}: ${format(c.ours)}\nChanged on disk: ${format(c.disk)}\n\n` +
      'Saving now replaces that version with yours, and its changes are lost. Cancel keeps it; Save As… then keeps both.',
    buttons: ['Cancel', 'Overwrite'],
    defaultId: 0,
    cancelId: 0,
    noLink: true,
  };
}

/** True when the answer lets the save replace the changed file. */
export const overwriteAllowed = (buttonIndex: number): boolean => buttonIndex === OVERWRITE_BUTTON;

/** What Save says when the user kept the changed file. */
export function keptMessage(c: ChangedOnDisk, format: (d: Date) => string = formatLocalTime): string {
  const after = { opened: 'it was opened here', saved: 'it was last saved here', autosaved: 'your recovered edits were autosaved' }[c.how];
  return `Not saved: “${c.name}” was changed on disk at ${format(c.disk)}, after ${after} at ${format(c.ours)}. The file on disk is unchanged; use Save As… to keep your version beside it.`;
}
