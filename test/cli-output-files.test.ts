// Files the CLI writes (--csv): atomic, through the app's save; never the project file itself.
import { chmodSync, linkSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, statSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { main, type MainOptions } from '../src/cli/index';
import { faultyFs } from '../src/node/save-faults';
import { nodeFs } from '../src/node/fs-layer';

const root = resolve(__dirname, '..');
const DEMO = readFileSync(join(root, 'resources', 'demo-spm-48v.json'));

let dir: string;
let project: string;
beforeEach(() => {
  dir = mkdtempSync(join(tmpdir(), 'tw-cli-out-'));
  project = join(dir, 'p.json');
  writeFileSync(project, DEMO);
});
afterEach(() => rmSync(dir, { recursive: true, force: true }));

async function run(argv: string[], options: MainOptions = {}): Promise<{ code: number; out: string; err: string }> {
  let out = '';
  let err = '';
  const code = await main(argv, { write: (s: string) => (out += s) }, { write: (s: string) => (err += s) }, options);
  return { code, out, err };
}

describe('an output path that is the project file is refused, whatever names it', () => {
  const aliases: Array<[string, () => string]> = [
    ['the same path', () => project],
    ['a symbolic link to it', () => (symlinkSync(project, join(dir, 'link.csv')), join(dir, 'link.csv'))],
    ['a path through ..', () => (mkdirSync(join(dir, 'sub')), join(dir, 'sub', '..', 'p.json'))],
    ['a hard link to it', () => (linkSync(project, join(dir, 'hard.csv')), join(dir, 'hard.csv'))],
  ];
  for (const [what, make] of aliases) {
    for (const cmd of ['envelope', 'simulate']) {
      it(`${cmd} --csv ${what}: exit 2 naming --csv, the project untouched`, async () => {
        const out = make();
        const r = await run([cmd, project, '--csv', out]);
        expect(r.code).toBe(2);
        expect(r.err).toMatch(/^torquewise: --csv '.*' is the project file itself; it is never written over: name another file\n$/);
        expect(r.out).toBe('');
        expect(readFileSync(project)).toEqual(DEMO);
      });
    }
  }

  it('--csv "" and --csv= are refused naming --csv; a folder is refused before any work', async () => {
    for (const argv of [['envelope', project, '--csv', ''], ['envelope', project, '--csv='], ['simulate', project, '--csv', '']]) {
      const r = await run(argv);
      expect(r.code).toBe(2);
      expect(r.err).toBe('torquewise: --csv needs a file name (got an empty one)\n');
    }
    const f = await run(['envelope', project, '--csv', dir]);
    expect(f.code).toBe(2);
    expect(f.err).toMatch(/^torquewise: --csv '.*' is not a regular file \(a folder or a device\); name a file\n$/);
    expect(readdirSync(dir)).toEqual(['p.json']);
  });
});

describe('the CSV is written atomically by the app\'s save', () => {
  it('replaces an existing CSV, keeping its mode, and leaves no temporary', async () => {
    const csv = join(dir, 'env.csv');
    writeFileSync(csv, 'old\n');
    chmodSync(csv, 0o640);
    const r = await run(['envelope', project, '--points', '5', '--csv', csv]);
    expect(r.code).toBe(0);
    expect(readFileSync(csv, 'utf8').split('\r\n').find((l) => !l.startsWith('"#'))).toMatch(/^"speed_rpm","torque_Nm",/);
    expect(readFileSync(csv, 'utf8').trim().split('\n')).toHaveLength(8); // two '#' rows, the header, 5 points
    expect(statSync(csv).mode & 0o777).toBe(0o640);
    expect(readdirSync(dir).sort()).toEqual(['env.csv', 'p.json']);
  });

  for (const code of ['ENOSPC', 'EFBIG']) {
    it(`${code} while writing: exit 2 naming --csv and the reason; the old CSV is intact, nothing left behind`, async () => {
      const csv = join(dir, 'env.csv');
      writeFileSync(csv, 'the good old table\n');
      const r = await run(['envelope', project, '--points', '5', '--csv', csv], { fs: faultyFs({ step: 'write', code }) });
      expect(r.code).toBe(2);
      const reason = code === 'ENOSPC' ? 'the disk is full' : 'the file would be larger than the system allows';
      expect(r.err).toBe(`torquewise: --csv '${csv}' was not written: ${reason} (while writing); any file there is unchanged\n`);
      expect(r.out).toBe('');
      expect(readFileSync(csv, 'utf8')).toBe('the good old table\n');
      expect(readdirSync(dir).sort()).toEqual(['env.csv', 'p.json']);
    });
  }

  it('a folder that cannot be flushed after the rename: the CSV is written, exit 0, and stderr says it may not be durable', async () => {
    const csv = join(dir, 'env.csv');
    const failingDir: MainOptions['fs'] = {
      ...nodeFs,
      open: async (p, flags, mode) => {
        const h = await nodeFs.open(p, flags, mode);
        return flags === 'r' ? { ...h, sync: async () => { throw Object.assign(new Error('io'), { code: 'EIO' }); } } : h;
      },
    };
    const r = await run(['envelope', project, '--points', '5', '--csv', csv], { fs: failingDir, platform: 'linux' });
    expect(r.code).toBe(0);
    expect(r.err).toMatch(/^torquewise: note: Saved "env\.csv", but the system did not confirm that the folder was written to disk/);
    expect(readFileSync(csv, 'utf8')).toMatch(/^"# torquewise envelope;[^\r\n]*\r\n"# drawn at [^\r\n]*\r\n"speed_rpm",/);
  });
});
