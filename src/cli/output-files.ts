// The files the CLI writes (--csv FILE): named by options of kind 'output', checked before any
// work, written atomically by the app's own save (src/node/atomic-write.ts) after the command
// succeeded. A full disk or a file-size limit leaves the old file as it was; the project file is
// never written over, whatever path names it (a symbolic link, `..`, a hard link).
import { resolve } from 'node:path';
import { InputError } from '../core/base/errors';
import { atomicWrite } from '../node/atomic-write';
import type { FileStat, FsLayer } from '../node/fs-layer';
import type { FlagSpec, ParsedArgs } from './args';
import type { CommandResult } from './command';
import { visible } from './terminal';

const sameFile = (a: FileStat | null, b: FileStat | null): boolean => a !== null && b !== null && a.dev === b.dev && a.ino === b.ino;

async function statOrNull(fs: FsLayer, path: string): Promise<FileStat | null> {
  try {
    return await fs.stat(path);
  } catch {
    return null;
  }
}

/**
 * Refuses, before the command runs, an output option whose path is the project file itself (the
 * same device and inode: also through a symbolic link, `..` or a hard link), is not a regular
 * file (a folder, a device), or names the same file as another output option.
 */
export async function checkOutputPaths(args: ParsedArgs, spec: FlagSpec, projectPath: string, fs: FsLayer): Promise<void> {
  const project = await statOrNull(fs, projectPath);
  const seen: Array<{ name: string; path: string; st: FileStat | null }> = [];
  for (const [name, kind] of Object.entries(spec)) {
    const path = args.flags.get(name);
    if (kind !== 'output' || typeof path !== 'string') continue;
    if (path === '') throw new InputError(`--${name}`, 'needs a file name (got an empty one)');
    const st = await statOrNull(fs, path);
    if (sameFile(st, project) || resolve(path) === resolve(projectPath)) {
      throw new InputError(`--${name}`, `'${visible(path)}' is the project file itself; it is never written over: name another file`);
    }
    if (st && !st.isFile) throw new InputError(`--${name}`, `'${visible(path)}' is not a regular file (a folder or a device); name a file`);
    const twin = seen.find((o) => sameFile(o.st, st) || resolve(o.path) === resolve(path));
    if (twin) throw new InputError(`--${name}`, `'${visible(path)}' is the same file as --${twin.name}; name another file`);
    seen.push({ name, path, st });
  }
}

/**
 * Writes the command's files atomically. A failure is an InputError naming the option and the
 * reason (the file there is unchanged); a write that could not be made durable returns its warning.
 */
export async function writeOutputs(files: CommandResult['files'], args: ParsedArgs, fs: FsLayer, platform?: string): Promise<string[]> {
  const warnings: string[] = [];
  for (const f of files ?? []) {
    const path = args.flags.get(f.flag);
    if (typeof path !== 'string' || path === '') throw new InputError(`--${f.flag}`, 'needs a file name');
    const r = await atomicWrite(path, f.contents, { fs, ...(platform ? { platform } : {}) });
    if (!r.ok) throw new InputError(`--${f.flag}`, `'${visible(path)}' was not written: ${r.reason}; any file there is unchanged`);
    if (r.warning) warnings.push(r.warning);
  }
  return warnings;
}
