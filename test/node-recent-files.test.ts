import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { nodeFs, type FsLayer } from '../src/node/fs-layer';
import { addRecent, readRecent, RECENT_FILE_NAME, removeRecent } from '../src/node/recent-files';

let dir: string;
beforeEach(() => {
  dir = mkdtempSync(join(tmpdir(), 'tw-recent-'));
});
afterEach(() => rmSync(dir, { recursive: true, force: true }));

describe('recent files', () => {
  it('starts empty, puts the newest first, keeps each path once', async () => {
    const ud = join(dir, 'user-data'); // created on first write
    expect(await readRecent(ud)).toEqual([]);
    await addRecent(ud, join(dir, 'a.json'));
    await addRecent(ud, join(dir, 'b.json'));
    expect(await addRecent(ud, join(dir, 'a.json'))).toEqual([join(dir, 'a.json'), join(dir, 'b.json')]);
    expect(await readRecent(ud)).toEqual([join(dir, 'a.json'), join(dir, 'b.json')]);
    expect(JSON.parse(readFileSync(join(ud, RECENT_FILE_NAME), 'utf8'))).toEqual({ files: [join(dir, 'a.json'), join(dir, 'b.json')] });
  });

  it('is bounded: the oldest entries drop off', async () => {
    for (let i = 0; i < 7; i++) await addRecent(dir, join(dir, `${i}.json`), { max: 3 });
    expect(await readRecent(dir)).toEqual([6, 5, 4].map((i) => join(dir, `${i}.json`)));
  });

  it('removes an entry', async () => {
    await addRecent(dir, join(dir, 'a.json'));
    await addRecent(dir, join(dir, 'b.json'));
    expect(await removeRecent(dir, join(dir, 'b.json'))).toEqual([join(dir, 'a.json')]);
  });

  it('reads a damaged or odd list as empty or filtered, never throwing', async () => {
    writeFileSync(join(dir, RECENT_FILE_NAME), '{"files": [1, "', 'utf8');
    expect(await readRecent(dir)).toEqual([]);
    writeFileSync(join(dir, RECENT_FILE_NAME), JSON.stringify({ files: ['/a.json', 3, '', '/a.json', null, '/b.json'] }));
    expect(await readRecent(dir)).toEqual(['/a.json', '/b.json']);
    writeFileSync(join(dir, RECENT_FILE_NAME), 'null');
    expect(await readRecent(dir)).toEqual([]);
  });

  it('a failing store does not throw: the list is a convenience', async () => {
    const fs: FsLayer = { ...nodeFs, open: async () => { throw Object.assign(new Error('full'), { code: 'ENOSPC' }); } };
    await expect(addRecent(dir, join(dir, 'a.json'), { fs })).resolves.toEqual([join(dir, 'a.json')]);
    expect(await readRecent(dir)).toEqual([]);
  });
});
