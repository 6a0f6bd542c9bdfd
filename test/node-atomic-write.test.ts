import { mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { atomicWrite, cleanStaleTemps, isTempOf, tempPathFor, type WriteStep } from '../src/node/atomic-write';
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
    expect(r1).toEqual({ ok: true, path: target, cleaned: 0 });
    expect(readFileSync(target, 'utf8')).toBe(OLD);
    const spy = failingFs(null);
    const r2 = await atomicWrite(target, NEW, { fs: spy, platform: 'linux' });
    expect(r2.ok).toBe(true);
    expect(readFileSync(target, 'utf8')).toBe(NEW);
    expect(readdirSync(dir)).toEqual(['p.json']);
    // order of the steps: temp created, written, flushed, closed, renamed, then the folder flushed
    expect(spy.calls).toEqual(['open', 'write', 'fsync', 'close', 'rename', 'dir-open', 'dir-fsync', 'dir-close']);
  });

  it('skips the folder fsync on win32 and tolerates a folder that refuses it', async () => {
    const target = join(dir, 'p.json');
    const win = failingFs(null);
    expect((await atomicWrite(target, OLD, { fs: win, platform: 'win32' })).ok).toBe(true);
    expect(win.calls).not.toContain('dir-open');
    const refusing = failingFs('dir-fsync', 'EINVAL');
    expect((await atomicWrite(target, NEW, { fs: refusing, platform: 'linux' })).ok).toBe(true);
    expect(readFileSync(target, 'utf8')).toBe(NEW);
    expect(refusing.calls).toContain('dir-close');
  });

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
    const r = await atomicWrite(target, NEW);
    expect(r).toEqual({ ok: true, path: target, cleaned: 1 });
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
    expect(await cleanStaleTemps(target)).toBe(1);
    expect(readdirSync(dir).sort()).toEqual(['.a.json.notes', '.b.json.x2.tw-tmp']);
    expect(isTempOf(target, '.a.json..tw-tmp')).toBe(false);
  });
});
