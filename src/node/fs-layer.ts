// The few file-system calls the file logic needs, behind an interface so tests can inject faults
// (a read-only folder, a full disk, a crash between write and rename) without root tricks.
import { promises as fsp } from 'node:fs';

export interface FileHandleLike {
  writeFile(data: string | Uint8Array): Promise<void>;
  sync(): Promise<void>;
  close(): Promise<void>;
}

export interface FsLayer {
  /** Like fs.promises.open: flags 'wx' (create, fail if it exists) or 'r'. */
  open(path: string, flags: string, mode?: number): Promise<FileHandleLike>;
  rename(from: string, to: string): Promise<void>;
  unlink(path: string): Promise<void>;
  readFile(path: string): Promise<Buffer>;
  readdir(path: string): Promise<string[]>;
  mkdir(path: string): Promise<void>;
  /** Size in bytes, permission bits and (optional in fakes) the last modification time, or null when the path does not exist. */
  stat(path: string): Promise<{ size: number; mode: number; isFile: boolean; mtimeMs?: number } | null>;
}

/** The real file system (node:fs). */
export const nodeFs: FsLayer = {
  open: (path, flags, mode) => fsp.open(path, flags, mode),
  rename: (from, to) => fsp.rename(from, to),
  unlink: (path) => fsp.unlink(path),
  readFile: (path) => fsp.readFile(path),
  readdir: (path) => fsp.readdir(path),
  mkdir: async (path) => {
    await fsp.mkdir(path, { recursive: true });
  },
  stat: async (path) => {
    try {
      const s = await fsp.stat(path);
      return { size: s.size, mode: s.mode, isFile: s.isFile(), mtimeMs: s.mtimeMs };
    } catch (e) {
      if ((e as NodeJS.ErrnoException).code === 'ENOENT') return null;
      throw e;
    }
  },
};

/** A plain-language reason for a failed file operation, from its errno code. */
export function describeFsError(e: unknown): string {
  const code = (e as NodeJS.ErrnoException | null)?.code;
  switch (code) {
    case 'EACCES':
    case 'EPERM':
      return 'permission denied';
    case 'EROFS':
      return 'the folder is on a read-only file system';
    case 'ENOSPC':
      return 'the disk is full';
    case 'EDQUOT':
      return 'the disk quota is used up';
    case 'ENOENT':
      return 'the file or folder does not exist';
    case 'ENOTDIR':
      return 'a part of the path is not a folder';
    case 'EISDIR':
      return 'the path is a folder';
    case 'EEXIST':
      return 'a file of that name already exists';
    case 'EMFILE':
    case 'ENFILE':
      return 'too many files are open';
    case 'EIO':
      return 'an input/output error occurred on the disk';
    case 'ENAMETOOLONG':
      return 'the file name is too long';
    default:
      return code ? `the system reported ${code}` : 'an unexpected error occurred';
  }
}
