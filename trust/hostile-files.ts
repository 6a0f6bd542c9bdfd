/**
 * Hostile files and command lines through the real CLI (`main`, in process, on real files in a
 * temporary folder), and the oracle each case must satisfy. Shared by `npm run trust` and the
 * fixed-seed test (test/trust-hostile-files.test.ts). Five kinds of case, each a mutated demo:
 *  - alias: `envelope`/`simulate --csv` naming the project file (same path, a symbolic link, a path
 *    through `..`, a hard link): exit 2 naming --csv, the project's bytes unchanged; or a CSV
 *    written over an old one under an injected ENOSPC or EFBIG: exit 2, the old CSV intact.
 *  - terminal: names and requirement labels holding newlines, U+2028/U+2029, bidirectional controls
 *    and other control characters, through every command's text and JSON: no such character
 *    reaches the output raw, and no printed line starts with text from the file.
 *  - duplicate: a key repeated in one object of the file: exit 2 naming the key's path.
 *  - utf8: an invalid byte put into the file: exit 2 naming its byte offset.
 *  - repeated: an option given twice: exit 2 naming it.
 */
import { linkSync, mkdirSync, mkdtempSync, readFileSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import fc from 'fast-check';
import { main, type MainOptions } from '../src/cli/index';
import { faultyFs } from '../src/node/save-faults';
import { DEMO_NAMES, DEMOS } from './fuzz-cases';

export type HostileKind = 'alias' | 'terminal' | 'duplicate' | 'utf8' | 'repeated';
export const HOSTILE_KINDS: HostileKind[] = ['alias', 'terminal', 'duplicate', 'utf8', 'repeated'];

/** Characters a terminal must never receive raw from a file (newline only as our own line ends). */
export const RAW_UNSAFE = /[\u0000-\u0009\u000b-\u001f\u007f-\u009f\u061c\u200e\u200f\u2028\u2029\u202a-\u202e\u2066-\u2069]/;
const INJECTED = ['\n', '\r', '\r\n', '\u2028', '\u2029', '\u202a', '\u202b', '\u202c', '\u202d', '\u202e', '\u2066', '\u2067', '\u2068', '\u2069', '\u061c', '\u200e', '\u200f', '\u001b[2J', '\u001b]0;x\u0007', '\u0085', '\t', '\u0000', '\u007f'];
const MARK = 'INJECTED';

type Json = Record<string, any>;
const COMMANDS: string[][] = [['params'], ['envelope', '--points', '8'], ['point', '--speed', '1000', '--torque', '1'], ['size'], ['simulate'], ['tune']];

/** A demo with its scenario shortened to 20 ms (step times scaled alike), so a case runs quickly. */
function shortDemo(name: string): Json {
  const j = structuredClone(DEMOS[name]) as Json;
  const k = 0.02 / j.scenario.duration_s;
  j.scenario.duration_s = 0.02;
  for (const list of ['speedSteps', 'loadSteps', 'torqueSteps']) for (const s of j.scenario[list] ?? []) s.t_s *= k;
  return j;
}

export interface HostileCase {
  kind: HostileKind;
  demo: string;
  /** which variant (alias way, command, object, byte position, option) */
  pick: number;
  /** text pieces put into names and labels (terminal) */
  pieces: string[];
}

export const hostileCase: fc.Arbitrary<HostileCase> = fc.record({
  kind: fc.constantFrom(...HOSTILE_KINDS),
  demo: fc.constantFrom(...DEMO_NAMES),
  pick: fc.nat(),
  pieces: fc.array(fc.constantFrom(...INJECTED), { minLength: 1, maxLength: 4 }),
});

export type HostileOutcome = { ok: true } | { ok: false; why: string };

async function cli(argv: string[], options: MainOptions = {}): Promise<{ code: number; out: string; err: string }> {
  let out = '';
  let err = '';
  const code = await main(argv, { write: (s: string) => (out += s) }, { write: (s: string) => (err += s) }, options);
  return { code, out, err };
}

const oneLine = (s: string): boolean => s.endsWith('\n') && s.indexOf('\n') === s.length - 1;

/** Every object of a JSON value with its path, in document order. */
function objects(x: unknown, path = '', out: Array<{ path: string; o: Json }> = []): Array<{ path: string; o: Json }> {
  if (Array.isArray(x)) x.forEach((v, i) => objects(v, `${path}[${i}]`, out));
  else if (x !== null && typeof x === 'object') {
    out.push({ path, o: x as Json });
    for (const [k, v] of Object.entries(x)) objects(v, path ? `${path}.${k}` : k, out);
  }
  return out;
}

/** Run one case in `dir` (a fresh empty folder) and judge it. */
export async function runHostileCase(c: HostileCase, dir: string): Promise<HostileOutcome> {
  const j = shortDemo(c.demo);
  const project = join(dir, 'p.json');
  const fail = (why: string): HostileOutcome => ({ ok: false, why: `${c.kind} ${c.demo} #${c.pick}: ${why}` });

  if (c.kind === 'alias') {
    const text = JSON.stringify(j, null, 2);
    writeFileSync(project, text);
    const cmd = c.pick % 2 === 0 ? 'envelope' : 'simulate';
    const way = (c.pick >> 1) % 6;
    if (way >= 4) {
      // a good old CSV and a disk that fails while writing the new one
      const csv = join(dir, 'out.csv');
      writeFileSync(csv, 'the good old table\n');
      const code = way === 4 ? 'ENOSPC' : 'EFBIG';
      const r = await cli([cmd, project, '--csv', csv], { fs: faultyFs({ step: 'write', code }) });
      if (r.code !== 2 || !r.err.startsWith('torquewise: --csv ') || !oneLine(r.err)) return fail(`${code}: expected one line naming --csv and exit 2, got exit ${r.code}: ${r.err.slice(0, 160)}`);
      if (readFileSync(csv, 'utf8') !== 'the good old table\n') return fail(`${code}: the old CSV was not kept`);
      return { ok: true };
    }
    let out = project;
    if (way === 1) symlinkSync(project, (out = join(dir, 'link.csv')));
    if (way === 2) mkdirSync(join(dir, 'sub')), (out = join(dir, 'sub', '..', 'p.json'));
    if (way === 3) linkSync(project, (out = join(dir, 'hard.csv')));
    const r = await cli([cmd, project, '--csv', out]);
    if (r.code !== 2 || !/^torquewise: --csv .* is the project file itself/.test(r.err) || !oneLine(r.err)) return fail(`--csv alias ${way}: exit ${r.code}: ${r.err.slice(0, 160)}`);
    if (readFileSync(project, 'utf8') !== text) return fail(`--csv alias ${way}: the project file changed`);
    return { ok: true };
  }

  if (c.kind === 'terminal') {
    const piece = (k: number): string => `${c.pieces[k % c.pieces.length]}${MARK}${c.pieces[(k + 1) % c.pieces.length]}`;
    j.name = `n${piece(0)}`;
    j.requirements = j.requirements.map((q: Json, i: number) => ({ ...q, label: `r${piece(i + 1)}` }));
    writeFileSync(project, JSON.stringify(j));
    const [cmd, ...opts] = COMMANDS[c.pick % COMMANDS.length]!;
    for (const json of [false, true]) {
      const r = await cli([cmd!, project, ...opts, ...(json ? ['--json'] : [])]);
      if (r.code !== 0) return fail(`${cmd}${json ? ' --json' : ''} exit ${r.code}: ${r.err.slice(0, 160)}`);
      const raw = RAW_UNSAFE.exec(r.out) ?? RAW_UNSAFE.exec(r.err);
      if (raw) return fail(`${cmd}${json ? ' --json' : ''} printed U+${raw[0].charCodeAt(0).toString(16).padStart(4, '0')} raw`);
      if (r.out.split('\n').some((l) => l.startsWith(MARK))) return fail(`${cmd}: a line starts with text from the file`);
      if (json && cmd === 'params' && JSON.parse(r.out).name !== j.name) return fail('params --json does not give the name back');
    }
    return { ok: true };
  }

  if (c.kind === 'duplicate') {
    const all = objects(j).filter((x) => Object.keys(x.o).length > 0);
    const { path, o } = all[c.pick % all.length]!;
    const keys = Object.keys(o);
    const key = keys[(c.pick >> 4) % keys.length]!;
    // the key again, last in its object, with the same value (JSON.parse would keep the last silently)
    const marker = '__dup__';
    o[marker] = 1;
    const text = JSON.stringify(j).replace(`"${marker}":1`, `${JSON.stringify(key)}:${JSON.stringify(o[key])}`);
    writeFileSync(project, text);
    const r = await cli(['params', project]);
    const want = `torquewise: ${path ? `${path}.` : ''}${key} is given twice in one object`;
    if (r.code !== 2 || !r.err.startsWith(want) || !oneLine(r.err)) return fail(`expected "${want}", got exit ${r.code}: ${r.err.slice(0, 160)}`);
    return { ok: true };
  }

  if (c.kind === 'utf8') {
    const bytes = Buffer.from(JSON.stringify(j, null, 1));
    // a position between two ASCII bytes, so the bad byte is the first ill-formed sequence
    const ascii: number[] = [];
    for (let i = 1; i < bytes.length; i++) if (bytes[i]! < 0x80 && bytes[i - 1]! < 0x80) ascii.push(i);
    const at = ascii[c.pick % ascii.length]!;
    const bad = [0xff, 0xc0, 0x80, 0xed, 0xf5][(c.pick >> 3) % 5]!;
    writeFileSync(project, Buffer.concat([bytes.subarray(0, at), Buffer.from([bad]), bytes.subarray(at)]));
    const [cmd] = COMMANDS[(c.pick >> 6) % COMMANDS.length]!;
    const r = await cli([cmd!, project]);
    if (r.code !== 2 || !r.err.includes(`is not UTF-8 text (an invalid byte sequence at byte offset ${at},`) || !oneLine(r.err)) return fail(`byte 0x${bad.toString(16)} at ${at}: exit ${r.code}: ${r.err.slice(0, 160)}`);
    return { ok: true };
  }

  // repeated option
  writeFileSync(project, JSON.stringify(j));
  const twice: string[][] = [
    ['envelope', '--points', '10', '--points', '12'],
    ['envelope', '--speed-max=3000', '--speed-max', '4000'],
    ['point', '--speed', '1', '--torque', '1', '--speed', '2'],
    ['simulate', '--max-points', '100', '--max-points=200'],
    ['tune', '--bode', '--bode'],
    ['params', '--json', '--json'],
    ['envelope', '--csv', join(dir, 'a.csv'), '--csv', join(dir, 'b.csv')],
  ];
  const [cmd, ...opts] = twice[c.pick % twice.length]!;
  const r = await cli([cmd!, project, ...opts]);
  if (r.code !== 2 || !/^torquewise: --[a-z-]+ is given more than once/.test(r.err) || !oneLine(r.err) || r.out !== '') return fail(`${cmd} ${opts.join(' ')}: exit ${r.code}: ${r.err.slice(0, 160)}`);
  return { ok: true };
}

export interface HostileTally {
  run: number;
  passed: number;
  byKind: Record<HostileKind, { run: number; passed: number }>;
  failures: string[];
}

/** Run `n` cases from a fixed seed, each in its own empty folder. */
export async function runHostileFiles(seed: number, n: number): Promise<HostileTally> {
  const cases = fc.sample(hostileCase, { seed, numRuns: n });
  const tally: HostileTally = { run: 0, passed: 0, byKind: Object.fromEntries(HOSTILE_KINDS.map((k) => [k, { run: 0, passed: 0 }])) as HostileTally['byKind'], failures: [] };
  const root = mkdtempSync(join(tmpdir(), 'torquewise-hostile-'));
  try {
    for (const [i, c] of cases.entries()) {
      const dir = join(root, `case-${i}`);
      mkdirSync(dir);
      let out: HostileOutcome;
      try {
        out = await runHostileCase(c, dir);
      } catch (e) {
        out = { ok: false, why: `${c.kind}: threw ${e instanceof Error ? e.message : String(e)}` };
      }
      tally.run++;
      tally.byKind[c.kind].run++;
      if (out.ok) {
        tally.passed++;
        tally.byKind[c.kind].passed++;
      } else tally.failures.push(out.why);
      rmSync(dir, { recursive: true, force: true });
    }
  } finally {
    rmSync(root, { recursive: true, force: true });
  }
  return tally;
}
