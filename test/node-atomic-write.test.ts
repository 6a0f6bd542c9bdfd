import { chmodSync, chownSync, linkSync, mkdtempSync, readFileSync, readdirSync, rmSync, statSync, mkdirSync, symlinkSync, utimesSync, writeFileSync, lstatSync, readlinkSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { basename, join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { atomicWrite, cleanStaleTemps, DEFAULT_ATOMIC_WRITE_OPTIONS, isStaleTemp, isTempOf, tempPathFor, type WriteStep } from '../src/node/atomic-write';
import { nodeFs, type FileHandleLike, type FsLayer } from '../src/node/fs-layer';

function errno(code: string): NodeJS.ErrnoException {
  const e = new Error(`${code}: simulated`) as NodeJS.ErrnoException;
  e.code = code;
  return e;
}

/** The real file system with one step made to fail the way a full disk or a read-only folder does. */
function failingFs(at: WriteStep | 'dir-fsync' | null, code = 'EIO'): FsLayer & { calls: string[] } {
  const calls: string[] = [];
  const wrap = (h: FileHandleLike, isDir: boolean): FileHandleLike => ({
    writeFile: async (d) => {
      calls.push('write');
      if (at === 'write') {
        await h.writeFile(typeof d === 'string' ? d.slice(0, 3) : d.subarray(0, 3)); // a partial write, then the error
        throw errno(code);
      }
      return h.writeFile(d);
    },
    sync: async () => {
      calls.push(isDir ? 'dir-fsync' : 'fsync');
      if (at === (isDir ? 'dir-fsync' : 'fsync')) throw errno(code);
      return h.sync();
    },
    close: async () => {
      calls.push(isDir ? 'dir-close' : 'close');
      await h.close();
      if (at === 'close' && !isDir) throw errno(code);
    },
    chmod: (m) => h.chmod(m),
    chown: (u, g) => h.chown(u, g),
  });
  return {
    ...nodeFs,
    calls,
    open: async (p, flags, mode) => {
      const isDir = flags === 'r';
      calls.push(isDir ? 'dir-open' : 'open');
      if (at === 'open' && !isDir) throw errno(code);
      return wrap(await nodeFs.open(p, flags, mode), isDir);
    },
    rename: async (a, b) => {
      calls.push('rename');
      if (at === 'rename') throw errno(code);
      return nodeFs.rename(a, b);
    },
  };
}

let dir: string;
beforeEach(() => {
  dir = mkdtempSync(join(tmpdir(), 'tw-atomic-'));
});
afterEach(() => rmSync(dir, { recursive: true, force: true }));

const OLD = '{"format":"torquewise-project","version":1,"name":"old"}\n';
const NEW = '{"format":"torquewise-project","version":1,"name":"new, longer than the old one"}\n';

describe('atomicWrite', () => {
  it('writes a new file and replaces an existing one, leaving no temporary behind', async () => {
    const target = join(dir, 'p.json');
    const r1 = await atomicWrite(target, OLD, { fs: failingFs(null) });
    expect(r1).toEqual({ ok: true, path: target, cleaned: 0, durable: true });
    expect(readFileSync(target, 'utf8')).toBe(OLD);
    const spy = failingFs(null);
    const r2 = await atomicWrite(target, NEW, { fs: spy, platform: 'linux' });
    expect(r2.ok).toBe(true);
    expect(readFileSync(target, 'utf8')).toBe(NEW);
    expect(readdirSync(dir)).toEqual(['p.json']);
    // order of the steps: temp created, written, flushed, closed, renamed, then the folder flushed
    expect(spy.calls).toEqual(['open', 'write', 'fsync', 'close', 'rename', 'dir-open', 'dir-fsync', 'dir-close']);
  });

  it('skips the folder fsync on win32', async () => {
    const target = join(dir, 'p.json');
    const win = failingFs(null);
    expect(await atomicWrite(target, OLD, { fs: win, platform: 'win32' })).toEqual({ ok: true, path: target, cleaned: 0, durable: true });
    expect(win.calls).not.toContain('dir-open');
  });

  for (const [at, code] of [['dir-fsync', 'EIO'], ['dir-fsync', 'EINVAL'], ['dir-open', 'EACCES']] as const) {
    it(`a failed flush of the folder after the rename (${at} ${code}) is reported: saved, not durable, with a sentence`, async () => {
      const target = join(dir, 'p.json');
      writeFileSync(target, OLD);
      const fs = failingFs(null);
      const failing: FsLayer = {
        ...fs,
        open: async (p, flags, mode) => {
          if (flags === 'r' && at === 'dir-open') throw errno(code);
          const h = await fs.open(p, flags, mode);
          return flags === 'r' ? { ...h, sync: async () => { throw errno(code); } } : h;
        },
      };
      const r = await atomicWrite(target, NEW, { fs: failing, platform: 'linux' });
      expect(r.ok).toBe(true);
      if (!r.ok) return;
      expect(r.durable).toBe(false);
      expect(r.warning).toMatch(/^Saved "p\.json", but the system did not confirm that the folder was written to disk \(.+\): if the power fails soon, the save may be lost\./);
      expect(readFileSync(target, 'utf8')).toBe(NEW); // the rename happened
      expect(readdirSync(dir)).toEqual(['p.json']);
    });
  }

  const cases: Array<[WriteStep, string, RegExp]> = [
    ['open', 'EACCES', /permission denied \(while creating the temporary file\)/],
    ['open', 'EROFS', /read-only file system/],
    ['write', 'ENOSPC', /the disk is full \(while writing\)/],
    ['fsync', 'EIO', /input\/output error .*while flushing to disk/],
    ['close', 'EIO', /while closing the temporary file/],
    ['rename', 'EPERM', /permission denied \(while replacing the file\)/],
  ];
  for (const [step, code, re] of cases) {
    it(`a failure at ${step} (${code}) keeps the old file intact, removes the temporary and says so`, async () => {
      const target = join(dir, 'p.json');
      writeFileSync(target, OLD);
      const r = await atomicWrite(target, NEW, { fs: failingFs(step, code) });
      expect(r.ok).toBe(false);
      if (r.ok) return;
      expect(r.step).toBe(step);
      expect(r.code).toBe(code);
      expect(r.message).toMatch(re);
      expect(r.message).toMatch(/^Could not save "p\.json": .*The file on disk is unchanged\.$/);
      expect(readFileSync(target, 'utf8')).toBe(OLD);
      expect(readdirSync(dir)).toEqual(['p.json']);
    });
  }

  it('a failure saving a new file says nothing was written and leaves nothing', async () => {
    const target = join(dir, 'fresh.json');
    const r = await atomicWrite(target, NEW, { fs: failingFs('write', 'ENOSPC') });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toMatch(/Nothing was written\.$/);
    expect(readdirSync(dir)).toEqual([]);
  });

  it('a crash between write and rename leaves the old file intact; the next save cleans the temporary', async () => {
    const target = join(dir, 'p.json');
    writeFileSync(target, OLD);
    // the process "dies" at rename: the rename never completes and no cleanup code runs
    // (the test waits for the rename to be reached, not for the temporary to appear: the file
    // exists from open onwards, before its bytes are written)
    let reached!: () => void;
    const atRename = new Promise<void>((r) => (reached = r));
    const crashing: FsLayer = {
      ...nodeFs,
      rename: () => {
        reached();
        return new Promise<void>(() => undefined);
      },
    };
    void atomicWrite(target, NEW, { fs: crashing });
    await atRename;
    const left = readdirSync(dir).filter((n) => n !== 'p.json');
    expect(left).toHaveLength(1);
    expect(isTempOf(target, left[0]!)).toBe(true);
    expect(readFileSync(join(dir, left[0]!), 'utf8')).toBe(NEW); // the temp was complete, the target untouched
    expect(readFileSync(target, 'utf8')).toBe(OLD);
    // a save by the restarted app: the crashed process is gone, so its temporary is stale
    const r = await atomicWrite(target, NEW, { isProcessAlive: () => false });
    expect(r).toEqual({ ok: true, path: target, cleaned: 1, durable: true });
    expect(readdirSync(dir)).toEqual(['p.json']);
    expect(readFileSync(target, 'utf8')).toBe(NEW);
  });

  it('keeps the permission bits of the file it replaces', async () => {
    const target = join(dir, 'p.json');
    writeFileSync(target, OLD, { mode: 0o600 });
    await atomicWrite(target, NEW);
    const { statSync } = await import('node:fs');
    expect(statSync(target).mode & 0o777).toBe(0o600);
  });

  it('refuses a folder as target without touching it', async () => {
    const r = await atomicWrite(dir, NEW);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toMatch(/the path is a folder/);
  });

  it('names temporaries so only those of the same target are cleaned', async () => {
    const target = join(dir, 'a.json');
    writeFileSync(tempPathFor(target, 'x1'), 'stale');
    writeFileSync(tempPathFor(join(dir, 'b.json'), 'x2'), 'other');
    writeFileSync(join(dir, '.a.json.notes'), 'user file');
    const hourAgo = (Date.now() - 3600_000) / 1000;
    for (const n of readdirSync(dir)) utimesSync(join(dir, n), hourAgo, hourAgo);
    expect(await cleanStaleTemps(target)).toBe(1);
    expect(readdirSync(dir).sort()).toEqual(['.a.json.notes', '.b.json.x2.tw-tmp']);
    expect(isTempOf(target, '.a.json..tw-tmp')).toBe(false);
  });
});

describe('atomicWrite keeps what makes the file the user\'s', () => {
  it('through a symbolic link: writes the link\'s target and keeps the link', async () => {
    const real = join(dir, 'real');
    mkdirSync(real);
    const file = join(real, 'p.json');
    writeFileSync(file, OLD);
    const link = join(dir, 'link.json');
    symlinkSync(join('real', 'p.json'), link);
    const r = await atomicWrite(link, NEW);
    expect(r.ok).toBe(true);
    expect(lstatSync(link).isSymbolicLink()).toBe(true);
    expect(readlinkSync(link)).toBe(join('real', 'p.json'));
    expect(readFileSync(file, 'utf8')).toBe(NEW);
    expect(readdirSync(dir).sort()).toEqual(['link.json', 'real']);
    expect(readdirSync(real)).toEqual(['p.json']);
  });

  it('keeps group-writable bits and setgid, whatever the umask', async () => {
    const target = join(dir, 'p.json');
    writeFileSync(target, OLD);
    chmodSync(target, 0o2664);
    const before = process.umask(0o022);
    try {
      expect((await atomicWrite(target, NEW)).ok).toBe(true);
    } finally {
      process.umask(before);
    }
    expect(statSync(target).mode & 0o7777).toBe(0o2664);
    expect(readFileSync(target, 'utf8')).toBe(NEW);
  });

  it.runIf(process.getuid?.() === 0)('keeps the owner and the group (where permitted: here as root)', async () => {
    const target = join(dir, 'p.json');
    writeFileSync(target, OLD);
    chownSync(target, 1234, 4321);
    expect((await atomicWrite(target, NEW)).ok).toBe(true);
    const st = statSync(target);
    expect([st.uid, st.gid]).toEqual([1234, 4321]);
  });

  it('refuses a read-only file with a sentence, touching nothing', async () => {
    const target = join(dir, 'p.json');
    writeFileSync(target, OLD);
    chmodSync(target, 0o444);
    const r = await atomicWrite(target, NEW);
    expect(r).toMatchObject({ ok: false, step: 'check', code: 'EACCES' });
    if (!r.ok) expect(r.message).toBe('Could not save "p.json": the file is read-only. Make it writable, or save under another name. The file on disk is unchanged.');
    expect(readFileSync(target, 'utf8')).toBe(OLD);
    expect(statSync(target).mode & 0o777).toBe(0o444);
    expect(readdirSync(dir)).toEqual(['p.json']);
  });

  it('refuses a file with another hard link instead of splitting the two names', async () => {
    const target = join(dir, 'p.json');
    writeFileSync(target, OLD);
    linkSync(target, join(dir, 'same.json'));
    const r = await atomicWrite(target, NEW);
    expect(r).toMatchObject({ ok: false, step: 'check', code: 'EMLINK' });
    if (!r.ok) expect(r.message).toMatch(/^Could not save "p\.json": the file has 2 hard links \(other names for the same file\), and replacing it would leave the other names with the old content\. .* The file on disk is unchanged\.$/);
    expect(readFileSync(target, 'utf8')).toBe(OLD);
    expect(statSync(target).ino).toBe(statSync(join(dir, 'same.json')).ino);
    expect(readdirSync(dir).sort()).toEqual(['p.json', 'same.json']);
  });
});

describe('concurrent saves', () => {
  it('two saves of one file interleaved: neither removes the other\'s temporary, both succeed', async () => {
    const target = join(dir, 'p.json');
    writeFileSync(target, OLD);
    // save A stops after creating its temporary, until save B has run from start to end
    let release!: () => void;
    const gate = new Promise<void>((r) => (release = r));
    let reached!: () => void;
    const atWrite = new Promise<void>((r) => (reached = r));
    const slow: FsLayer = {
      ...nodeFs,
      open: async (p, flags, mode) => {
        const h = await nodeFs.open(p, flags, mode);
        if (flags === 'r') return h;
        return {
          writeFile: async (d) => {
            reached();
            await gate;
            return h.writeFile(d);
          },
          sync: () => h.sync(),
          close: () => h.close(),
          chmod: (m) => h.chmod(m),
          chown: (u, g) => h.chown(u, g),
        };
      },
    };
    const a = atomicWrite(target, 'A\n', { fs: slow });
    await atWrite;
    expect(readdirSync(dir).filter((n) => isTempOf(target, n))).toHaveLength(1);
    const b = await atomicWrite(target, 'B\n');
    expect(b).toEqual({ ok: true, path: target, cleaned: 0, durable: true });
    expect(readFileSync(target, 'utf8')).toBe('B\n');
    release();
    expect(await a).toEqual({ ok: true, path: target, cleaned: 0, durable: true });
    expect(readFileSync(target, 'utf8')).toBe('A\n');
    expect(readdirSync(dir)).toEqual(['p.json']);
  });

  it('a temporary is stale when its writer is gone or it is older than the bound, never while its writer runs', () => {
    const target = join(dir, 'p.json');
    const mine = basename(tempPathFor(target));
    const now = Date.now();
    expect(isStaleTemp(target, mine, now - 1000, now)).toBe(false); // this process runs
    expect(isStaleTemp(target, mine, now - 1000, now, { isProcessAlive: () => false })).toBe(true);
    expect(isStaleTemp(target, mine, now - DEFAULT_ATOMIC_WRITE_OPTIONS.staleAfterMs - 1, now)).toBe(true);
    // a temporary of another machine or of an older naming: only the age tells
    const foreign = basename(tempPathFor(target, '123@elsewhere.abcd'));
    expect(isStaleTemp(target, foreign, now - 1000, now, { isProcessAlive: () => false })).toBe(false);
    expect(isStaleTemp(target, foreign, now - DEFAULT_ATOMIC_WRITE_OPTIONS.staleAfterMs - 1, now)).toBe(true);
    expect(isStaleTemp(target, '.q.json.1@h.ab.tw-tmp', 0, now)).toBe(false); // another file's
  });
});
