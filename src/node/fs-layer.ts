// The few file-system calls the file logic needs, behind an interface so tests can inject faults
// (a read-only folder, a full disk, a crash between write and rename) without root tricks.
import { constants as fsConstants, promises as fsp } from 'node:fs';

export interface FileHandleLike {
  writeFile(data: string | Uint8Array): Promise<void>;
  sync(): Promise<void>;
  close(): Promise<void>;
  /** Permission bits, set exactly (not masked by the umask), setgid and sticky bits included. */
  chmod(mode: number): Promise<void>;
  chown(uid: number, gid: number): Promise<void>;
}

/** What the file logic needs to know of an existing path (symbolic links followed). */
export interface FileStat {
  size: number;
  /** st_mode: type and permission bits */
  mode: number;
  isFile: boolean;
  /** number of hard links (names) of the file */
  nlink: number;
  uid: number;
  gid: number;
  /** device and inode: two paths with the same pair name the same file */
  dev: number;
  ino: number;
  mtimeMs: number;
}

export interface FsLayer {
  /** Like fs.promises.open: flags 'wx' (create, fail if it exists) or 'r'. */
  open(path: string, flags: string, mode?: number): Promise<FileHandleLike>;
  rename(from: string, to: string): Promise<void>;
  unlink(path: string): Promise<void>;
  readFile(path: string): Promise<Buffer>;
  readdir(path: string): Promise<string[]>;
  mkdir(path: string): Promise<void>;
  /** The path's file (symbolic links followed), or null when the path does not exist. */
  stat(path: string): Promise<FileStat | null>;
  /** The path with every symbolic link, `.` and `..` resolved (the path must exist). */
  realpath(path: string): Promise<string>;
  /** True when this process may write to the existing file at `path` (access(2) with W_OK). */
  canWrite(path: string): Promise<boolean>;
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
      return { size: s.size, mode: s.mode, isFile: s.isFile(), nlink: s.nlink, uid: s.uid, gid: s.gid, dev: s.dev, ino: s.ino, mtimeMs: s.mtimeMs };
    } catch (e) {
      if ((e as NodeJS.ErrnoException).code === 'ENOENT') return null;
      throw e;
    }
  },
  realpath: (path) => fsp.realpath(path),
  canWrite: async (path) => {
    try {
      await fsp.access(path, fsConstants.W_OK);
      return true;
    } catch {
      return false;
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
    case 'EFBIG':
      return 'the file would be larger than the system allows';
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
