import { mkdtempSync, readFileSync, readdirSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { InputError } from '../src/core/base/errors';
import { nodeFs, type FsLayer } from '../src/node/fs-layer';
import { openProjectFile, ProjectReadError, projectHeader, PROJECT_VERSION, readProjectText, saveProjectFile } from '../src/node/project-file';
import { MAX_PROJECT_BYTES } from '../src/core/project/schema';

let dir: string;
beforeEach(() => {
  dir = mkdtempSync(join(tmpdir(), 'tw-project-'));
});
afterEach(() => rmSync(dir, { recursive: true, force: true }));

// a full, valid project: the invented traction demo
const GOOD = readFileSync(join(__dirname, '../resources/demo-ipm-traction.json'), 'utf8');
const HEADER_ONLY = JSON.stringify({ format: 'torquewise-project', version: 1, motor: { polePairs: 4 } });

/** A file system that records every call that could change something. */
function watchingFs(): FsLayer & { writes: string[] } {
  const writes: string[] = [];
  return {
    ...nodeFs,
    writes,
    open: (p, f, m) => {
      if (f !== 'r') writes.push(`open ${f} ${p}`);
      return nodeFs.open(p, f, m);
    },
    rename: (a, b) => (writes.push(`rename ${a}`), nodeFs.rename(a, b)),
    unlink: (p) => (writes.push(`unlink ${p}`), nodeFs.unlink(p)),
    mkdir: (p) => (writes.push(`mkdir ${p}`), nodeFs.mkdir(p)),
  };
}

describe('projectHeader', () => {
  it('accepts our format at the current version and flags a newer one', () => {
    expect(projectHeader(GOOD)).toEqual({ kind: 'ok' });
    expect(projectHeader(HEADER_ONLY)).toEqual({ kind: 'ok' });
    expect(projectHeader('{"format":"torquewise-project","version":7}')).toEqual({ kind: 'newer', version: 7 });
    expect(PROJECT_VERSION).toBe(1);
  });
  it('names what is wrong with a foreign or broken header', () => {
    expect(projectHeader('{"format":"something-else","version":1}')).toEqual({ kind: 'bad', message: 'format must be "torquewise-project"' });
    expect(projectHeader('{"format":"torquewise-project","version":1.5}')).toEqual({ kind: 'bad', message: 'version must be a whole number >= 1' });
    expect(projectHeader('{"format":"torquewise-project","version":"1"}').kind).toBe('bad');
    expect(projectHeader('[1,2]')).toEqual({ kind: 'bad', message: 'it is not a JSON object' });
    const r = projectHeader('{"format": ');
    expect(r.kind).toBe('bad');
    if (r.kind === 'bad') expect(r.message).toMatch(/^it is not valid JSON/);
  });
});

describe('openProjectFile', () => {
  it('reads a good project (a UTF-8 byte-order mark is dropped)', async () => {
    const p = join(dir, 'motor.json');
    writeFileSync(p, `\ufeff${GOOD}`);
    expect(await openProjectFile(p)).toEqual({ ok: true, path: p, text: GOOD, readOnly: false });
  });

  const broken: Array<[string, string | Buffer, RegExp]> = [
    ['truncated JSON', '{"format": ', /^Could not open "x\.json": file is not valid JSON: .* at line 1 column 12\.$/],
    ['another format', '{"format":"other","version":1}', /: format must be "torquewise-project" \(this is not a Torquewise project file\)\.$/],
    ['no version', '{"format":"torquewise-project"}', /: version must be 1\.$/],
    ['a section missing a required key', HEADER_ONLY, /: motor\.Rs is required \(stator resistance per phase .* in ohm\); motor\.Ld is required .*\.$/],
    ['a negative inductance', GOOD.replace('"Ld": { "value": 0.0003', '"Ld": { "value": -0.0003'), /: nameplate\.Ld\.value must be >= 1e-9 H/],
    ['binary bytes', Buffer.from([0xff, 0xfe, 0x00, 0x81, 0x7b]), /it is not UTF-8 text \(an invalid byte sequence at byte offset 0, starting with 0xFF\)\.$/],
  ];
  for (const [what, content, re] of broken) {
    it(`a broken file (${what}) opens with a clear message and nothing is written`, async () => {
      const p = join(dir, 'x.json');
      writeFileSync(p, content);
      const before = readFileSync(p);
      const fs = watchingFs();
      const r = await openProjectFile(p, { fs });
      expect(r.ok).toBe(false);
      if (!r.ok) {
        expect(r.canceled).toBe(false);
        expect(r.message).toMatch(re);
        expect(r.message).not.toMatch(/\n\s+at /); // no stack
      }
      expect(fs.writes).toEqual([]);
      expect(readFileSync(p)).toEqual(before);
      expect(readdirSync(dir)).toEqual(['x.json']);
    });
  }

  it('a newer format version opens read-only with a message, touching nothing', async () => {
    const p = join(dir, 'future.json');
    const text = '{"format":"torquewise-project","version":3,"motor":{}}';
    writeFileSync(p, text);
    const mtime = statSync(p).mtimeMs;
    const fs = watchingFs();
    const r = await openProjectFile(p, { fs });
    expect(r).toMatchObject({ ok: true, path: p, text, readOnly: true });
    if (r.ok) expect(r.message).toMatch(/format version 3; this version of Torquewise reads up to version 1\. It is open read-only/);
    expect(fs.writes).toEqual([]);
    expect(statSync(p).mtimeMs).toBe(mtime);
  });

  it('passes the InputError of the project check through as the message', async () => {
    const p = join(dir, 'bad-ld.json');
    writeFileSync(p, GOOD);
    const r = await openProjectFile(p, {
      check: () => {
        throw new InputError('motor.Ld', 'must be > 0 H');
      },
    });
    expect(r).toEqual({ ok: false, canceled: false, message: 'Could not open "bad-ld.json": motor.Ld must be > 0 H.' });
    const r2 = await openProjectFile(p, {
      check: () => {
        throw new RangeError('internal');
      },
    });
    expect(r2).toEqual({ ok: false, canceled: false, message: 'Could not open "bad-ld.json": its content could not be read as a project.' });
  });

  it('refuses a missing file, a folder and an oversized file', async () => {
    expect(await openProjectFile(join(dir, 'nope.json'))).toEqual({ ok: false, canceled: false, message: 'Could not open "nope.json": it does not exist.' });
    expect((await openProjectFile(dir)).ok).toBe(false);
    const p = join(dir, 'big.json');
    writeFileSync(p, GOOD);
    const r = await openProjectFile(p, { maxBytes: 10 });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toBe(`Could not open "big.json": it is ${Buffer.byteLength(GOOD)} bytes, more than the 10 bytes a project file may have.`);
  });

  it('reports a read error by its reason', async () => {
    const p = join(dir, 'p.json');
    writeFileSync(p, GOOD);
    const fs: FsLayer = {
      ...nodeFs,
      readFile: async () => {
        throw Object.assign(new Error('x'), { code: 'EACCES' });
      },
    };
    expect(await openProjectFile(p, { fs })).toEqual({ ok: false, canceled: false, message: 'Could not open "p.json": it cannot be read: permission denied.' });
  });
});

describe('readProjectText (the one reader of a project file: app and CLI)', () => {
  const fault = async (path: string, options: Parameters<typeof readProjectText>[1] = {}): Promise<ProjectReadError> => {
    try {
      await readProjectText(path, options);
    } catch (e) {
      expect(e).toBeInstanceOf(ProjectReadError);
      return e as ProjectReadError;
    }
    throw new Error('read');
  };

  it('the limit is the schema\'s MAX_PROJECT_BYTES, 16 MiB: a file one byte above it is refused unread', async () => {
    const p = join(dir, 'huge.json');
    writeFileSync(p, '');
    const fs: FsLayer = { ...nodeFs, stat: async (q) => ({ ...(await nodeFs.stat(q))!, size: MAX_PROJECT_BYTES + 1 }), readFile: async () => { throw new Error('read'); } };
    const e = await fault(p, { fs });
    expect([e.kind, e.why]).toEqual(['too-large', 'is 16777217 bytes, more than the 16777216 bytes a project file may have']);
  });

  it('names each fault by its kind, with the phrase that follows the file name', async () => {
    const missing = await fault(join(dir, 'nope.json'));
    expect([missing.kind, missing.why]).toEqual(['missing', 'does not exist']);
    const folder = await fault(dir);
    expect([folder.kind, folder.why]).toEqual(['not-a-file', 'is not a regular file']);
    const p = join(dir, 'latin1.json');
    writeFileSync(p, Buffer.from([0x7b, 0x22, 0xe9, 0x22, 0x7d])); // {"é"} in Latin-1
    const bad = await fault(p);
    expect([bad.kind, bad.why]).toEqual(['not-utf8', 'is not UTF-8 text (an invalid byte sequence at byte offset 2, starting with 0xE9)']);
    expect(await readProjectText(join(__dirname, '../resources/demo-ipm-traction.json'))).toBe(GOOD);
  });
});

describe('saveProjectFile', () => {
  it('saves atomically with a final newline, then reopens the same text', async () => {
    const p = join(dir, 's.json');
    expect(await saveProjectFile(p, GOOD)).toEqual({ ok: true, path: p });
    expect(readFileSync(p, 'utf8')).toBe(GOOD.endsWith('\n') ? GOOD : `${GOOD}\n`);
    const r = await openProjectFile(p);
    expect(r.ok && r.text).toBe(GOOD.endsWith('\n') ? GOOD : `${GOOD}\n`);
  });

  it('refuses to write text that is not a project, leaving the file as it was', async () => {
    const p = join(dir, 's.json');
    writeFileSync(p, GOOD);
    const r = await saveProjectFile(p, '{"format":"torquewise-project"');
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toMatch(/^Not saved: the project text is not a valid project \(it is not valid JSON.*The file on disk is unchanged\.$/);
    expect(readFileSync(p, 'utf8')).toBe(GOOD);
  });

  it('a folder that cannot be flushed after the rename (injected EIO): saved, and the result carries a warning for the user', async () => {
    const p = join(dir, 's.json');
    writeFileSync(p, GOOD);
    const fs: FsLayer = {
      ...nodeFs,
      open: async (path, flags, mode) => {
        const h = await nodeFs.open(path, flags, mode);
        if (flags !== 'r') return h;
        return { writeFile: (d) => h.writeFile(d), sync: async () => { throw Object.assign(new Error('io'), { code: 'EIO' }); }, close: () => h.close(), chmod: (m) => h.chmod(m), chown: (u, g) => h.chown(u, g) };
      },
    };
    const next = GOOD.replace('350 V bus', '400 V bus');
    const r = await saveProjectFile(p, next, { fs, platform: 'linux' });
    expect(r).toEqual({
      ok: true,
      path: p,
      warning: 'Saved "s.json", but the system did not confirm that the folder was written to disk (an input/output error occurred on the disk): if the power fails soon, the save may be lost. Save again, or check the disk.',
    });
    expect(readFileSync(p, 'utf8')).toBe(next.endsWith('\n') ? next : `${next}\n`);
  });

  it('a read-only folder (injected EROFS) fails with a message and keeps the old file', async () => {
    const p = join(dir, 's.json');
    writeFileSync(p, GOOD);
    const fs: FsLayer = {
      ...nodeFs,
      open: async (path, flags, mode) => {
        if (flags !== 'r') throw Object.assign(new Error('ro'), { code: 'EROFS' });
        return nodeFs.open(path, flags, mode);
      },
    };
    const r = await saveProjectFile(p, GOOD.replace('350 V bus', '400 V bus'), { fs });
    expect(r).toEqual({
      ok: false,
      canceled: false,
      message: 'Could not save "s.json": the folder is on a read-only file system (while creating the temporary file). The file on disk is unchanged.',
    });
    expect(readFileSync(p, 'utf8')).toBe(GOOD);
  });
});
