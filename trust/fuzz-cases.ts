/**
 * Fuzzed project files through the code paths of the CLI commands, and the oracle every case must
 * satisfy. Shared by the fixed-seed fuzz tests (test/fuzz-*.test.ts) and `npm run trust`.
 *
 * A case is a seed project (a demo file or a random machine), a list of mutations (wrong types,
 * NaN, Infinity, zero and negative values, huge and tiny magnitudes, missing sections, unknown
 * keys, deep nesting, very long strings, text damage) and one command. It passes when the command
 * either returns a document whose every number is finite (null where the document says "none") and
 * whose text shows no NaN/Infinity, or throws exactly one InputError whose one-line message starts
 * with the field path. Any other exception, or a NaN, fails the case.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import fc from 'fast-check';
import { loadProjectText, resolveProject, type ResolvedProject } from '../src/core/project/project';
import { parseProject } from '../src/core/project/schema';
import { InputError, problemLines } from '../src/core/base/errors';
import { COMMANDS } from '../src/cli/commands/registry';
import { parseArgs } from '../src/cli/args';
import { checkFlags } from '../src/cli/args';
import { runSimulation } from '../src/core/simulation/simulate';
import { simulationFromProject } from '../src/core/project/simulation-from-project';
import { simulationReport } from '../src/cli/commands/simulate';
import { terminalText } from '../src/cli/terminal';

export const DEMO_NAMES = ['demo-spm-48v', 'demo-ipm-traction', 'demo-servo-axis'] as const;

const root = join(import.meta.dirname ?? __dirname, '..');
export const DEMOS: Record<string, unknown> = Object.fromEntries(
  DEMO_NAMES.map((n) => [n, JSON.parse(readFileSync(join(root, 'resources', `${n}.json`), 'utf8'))]),
);

/** Control periods a fuzzed simulation may run (the CLI's own bound is the 2 000 000-period budget and the wall budget). */
export const FUZZ_SIM_MAX_STEPS = 400;

export type CommandName = 'params' | 'envelope' | 'point' | 'size' | 'simulate' | 'tune';
export const COMMAND_NAMES: CommandName[] = ['params', 'envelope', 'point', 'size', 'simulate', 'tune'];

export interface FuzzCase {
  /** the project as text (through loadProjectText) or as a value (through parseProject + resolveProject, as the app does) */
  input: { text: string } | { value: unknown };
  command: CommandName;
  /** command-line arguments after the file, e.g. ['--speed', '1000', '--torque', '2'] */
  flags: string[];
}

export type Outcome =
  | { kind: 'ok' }
  | { kind: 'input-error'; field: string; message: string; /** every problem, one line each (the CLI prints these) */ lines: string[] }
  | { kind: 'failure'; why: string };

// ---------------------------------------------------------------- values

const NASTY_NUMBERS = [0, -0, -1, -1e-300, 1e-300, 5e-324, 1e-310, 2.2e-308, 1e-12, 1e300, 1.7e308, -1.7e308, 1e6, 1e9, 2 ** 53 + 1, 0.5, 3, NaN, Infinity, -Infinity];

/** A value that may replace any node: wrong types, non-finite and extreme numbers, long text, deep nesting. */
export const nastyValue: fc.Arbitrary<unknown> = fc.oneof(
  { weight: 6, arbitrary: fc.constantFrom(...NASTY_NUMBERS) },
  { weight: 3, arbitrary: fc.double({ noDefaultInfinity: false, noNaN: false }) },
  { weight: 2, arbitrary: fc.integer({ min: -1000, max: 1000 }) },
  { weight: 1, arbitrary: fc.constantFrom('', '12', 'NaN', 'phase', 'rms', 'svpwm', 'x'.repeat(100_000), '\u0000', '../../etc/passwd', 'https://example.invalid/a.js', 'line\nfake line', 'a\u2028b\u2029c', '\u202eevil\u202c \u2066x\u2069', '\u001b[2J\r') },
  { weight: 1, arbitrary: fc.string({ maxLength: 40 }) },
  { weight: 1, arbitrary: fc.constantFrom(null, true, false) },
  { weight: 1, arbitrary: fc.constantFrom([], {}, [1, 2, 3], { value: 1 }, { value: 1, basis: 'phase' }) },
  { weight: 1, arbitrary: fc.integer({ min: 10, max: 600 }).map((d) => nest(d)) },
);

function nest(depth: number): unknown {
  let x: unknown = 1;
  for (let i = 0; i < depth; i++) x = i % 2 ? [x] : { a: x };
  return x;
}

// ---------------------------------------------------------------- mutations

type Path = Array<string | number>;

function paths(x: unknown, prefix: Path = [], out: Path[] = [], depth = 0): Path[] {
  if (depth > 6 || x === null || typeof x !== 'object') return out;
  for (const k of Array.isArray(x) ? x.map((_, i) => i) : Object.keys(x)) {
    const p = [...prefix, k];
    out.push(p);
    paths((x as Record<string | number, unknown>)[k], p, out, depth + 1);
  }
  return out;
}

function getAt(x: unknown, p: Path): unknown {
  let v = x;
  for (const s of p) v = v !== null && typeof v === 'object' ? (v as Record<string | number, unknown>)[s] : undefined;
  return v;
}

export type Mutation =
  | { op: 'set'; pick: number; value: unknown }
  | { op: 'scale'; pick: number; factor: number }
  | { op: 'delete'; pick: number }
  | { op: 'unknown-key'; pick: number; key: string; value: unknown }
  | { op: 'drop-section'; section: string };

export const mutation: fc.Arbitrary<Mutation> = fc.oneof(
  { weight: 5, arbitrary: fc.record({ op: fc.constant('set' as const), pick: fc.nat(), value: nastyValue }) },
  { weight: 4, arbitrary: fc.record({ op: fc.constant('scale' as const), pick: fc.nat(), factor: fc.constantFrom(0, -1, 5e-324, 1e-300, 1e-9, 1e-3, 0.1, 0.5, 2, 10, 1e3, 1e9, 1e300) }) },
  { weight: 2, arbitrary: fc.record({ op: fc.constant('delete' as const), pick: fc.nat() }) },
  { weight: 1, arbitrary: fc.record({ op: fc.constant('unknown-key' as const), pick: fc.nat(), key: fc.oneof(fc.string({ maxLength: 12 }), fc.constant('__proto__'), fc.constant('constructor'), fc.constant('k'.repeat(50_000))), value: nastyValue }) },
  { weight: 1, arbitrary: fc.record({ op: fc.constant('drop-section' as const), section: fc.constantFrom('motor', 'nameplate', 'inverter', 'conditions', 'requirements', 'control', 'scenario', 'format', 'version') }) },
);

/** Apply mutations to a deep copy. `pick` chooses among the paths present at that moment. */
export function mutate(seed: unknown, muts: readonly Mutation[]): unknown {
  const root = structuredClone(seed) as Record<string, unknown>;
  for (const m of muts) {
    if (m.op === 'drop-section') {
      delete root[m.section];
      continue;
    }
    const all = paths(root);
    if (all.length === 0) continue;
    const p = all[m.pick % all.length]!;
    const parent = getAt(root, p.slice(0, -1)) as Record<string | number, unknown>;
    const key = p[p.length - 1]!;
    if (parent === null || typeof parent !== 'object') continue;
    // values are cloned: one generated value may stand in two mutations (a shared object would
    // otherwise be grafted into itself and make the project circular)
    if (m.op === 'set') parent[key] = structuredClone(m.value);
    else if (m.op === 'scale') {
      const v = parent[key];
      if (typeof v === 'number') parent[key] = v * m.factor;
      else parent[key] = m.factor;
    } else if (m.op === 'delete') {
      if (Array.isArray(parent)) parent.splice(Number(key), 1);
      else delete parent[key];
    } else if (m.op === 'unknown-key') {
      const target = parent[key];
      if (target !== null && typeof target === 'object' && !Array.isArray(target)) Object.defineProperty(target, m.key, { value: structuredClone(m.value), enumerable: true, configurable: true, writable: true });
    }
  }
  return root;
}

// ---------------------------------------------------------------- random legal machines

/** A random but legal motor section: SPM, IPM (Lq > Ld), inverse saliency (Ld > Lq), Rs >= 0, psiM >= 0. */
export const motorSection = fc
  .record({
    polePairs: fc.integer({ min: 1, max: 12 }),
    Rs: fc.oneof(fc.constant(0), fc.double({ min: 1e-4, max: 2, noNaN: true })),
    Ld: fc.double({ min: 1e-5, max: 5e-2, noNaN: true }),
    saliency: fc.oneof(fc.constant(1), fc.double({ min: 0.3, max: 6, noNaN: true })),
    psiM: fc.oneof(fc.constant(0), fc.double({ min: 1e-3, max: 1, noNaN: true })),
    inertia: fc.double({ min: 1e-6, max: 1, noNaN: true }),
    coulombFriction: fc.oneof(fc.constant(0), fc.double({ min: 0, max: 50, noNaN: true })),
  })
  .map((m) => ({ polePairs: m.polePairs, Rs: m.Rs, Ld: m.Ld, Lq: m.Ld * (m.psiM === 0 && m.saliency === 1 ? 3 : m.saliency), psiM: m.psiM, inertia: m.inertia, viscousFriction: 1e-5, coulombFriction: m.coulombFriction }));

/** A random legal project built around a random motor, a random bus (from tiny to generous) and requirements. */
export const randomProject = fc
  .record({
    motor: motorSection,
    Vdc: fc.double({ min: 1, max: 800, noNaN: true }),
    Imax: fc.double({ min: 0.5, max: 500, noNaN: true }),
    modulation: fc.constantFrom('sinusoidal', 'svpwm', 'six-step'),
    reqs: fc.array(fc.record({ speed: fc.double({ min: 0, max: 20000, noNaN: true }), torque: fc.double({ min: -50, max: 50, noNaN: true }) }), { maxLength: 4 }),
    mode: fc.constantFrom('speed', 'torque', 'current-step'),
    fCtrl: fc.constantFrom(2000, 10000, 20000),
    step: fc.double({ min: -5000, max: 5000, noNaN: true }),
  })
  .map((r) => ({
    format: 'torquewise-project',
    version: 1,
    name: 'fuzz',
    motor: r.motor,
    inverter: { Vdc: r.Vdc, Imax: r.Imax, Icont: r.Imax / 2, modulation: r.modulation },
    conditions: { windingTemp_C: 80 },
    requirements: r.reqs.map((q, i) => ({ label: `r${i}`, speed_rpm: q.speed, torque_Nm: q.torque })),
    control: { mode: r.mode, fCtrl_Hz: r.fCtrl },
    scenario: {
      duration_s: 0.02,
      speedSteps: r.mode === 'speed' ? [{ t_s: 0.001, speed_rpm: r.step }] : [],
      torqueSteps: r.mode === 'torque' ? [{ t_s: 0.001, torque_Nm: r.step / 1000 }] : [],
      ...(r.mode === 'current-step' ? { currentStep: { id_A: 0, iq_A: Math.min(r.Imax, Math.abs(r.step) / 50), t_s: 0.001 } } : {}),
    },
  }));

/** A random legal project in datasheet terms (the nameplate section), around a random bus. */
export const randomNameplateProject = fc
  .record({
    poles: fc.integer({ min: 1, max: 10 }).map((k) => 2 * k),
    byPairs: fc.boolean(),
    R: fc.record({ value: fc.double({ min: 1e-3, max: 5, noNaN: true }), basis: fc.constantFrom('phase', 'line-to-line'), temp_C: fc.integer({ min: -20, max: 150 }) }),
    L: fc.oneof(
      fc.record({ L: fc.record({ value: fc.double({ min: 1e-5, max: 2e-2, noNaN: true }), basis: fc.constantFrom('phase', 'line-to-line') }) }),
      fc.record({ Ld: fc.record({ value: fc.double({ min: 1e-5, max: 2e-2, noNaN: true }), basis: fc.constantFrom('phase', 'line-to-line') }), Lq: fc.record({ value: fc.double({ min: 1e-5, max: 5e-2, noNaN: true }), basis: fc.constantFrom('phase', 'line-to-line') }) }),
    ),
    K: fc.oneof(
      fc.record({ Ke: fc.record({ value: fc.double({ min: 0.5, max: 200, noNaN: true }), unit: fc.constantFrom('V_LL_rms/krpm', 'V_LL_peak/krpm') }) }),
      fc.record({ Kt: fc.record({ value: fc.double({ min: 0.01, max: 5, noNaN: true }), unit: fc.constantFrom('Nm/A_rms', 'Nm/A_peak') }) }),
      fc.record({ Ke: fc.record({ value: fc.double({ min: 1e-3, max: 1, noNaN: true }), unit: fc.constant('V_ph_peak*s/rad') }), Kt: fc.record({ value: fc.double({ min: 0.01, max: 5, noNaN: true }), unit: fc.constantFrom('Nm/A_rms', 'Nm/A_peak') }) }),
    ),
    rated: fc.option(fc.record({ I: fc.double({ min: 1, max: 300, noNaN: true }), n: fc.double({ min: 100, max: 20000, noNaN: true }), T: fc.double({ min: 0.1, max: 300, noNaN: true }) })),
    Vdc: fc.double({ min: 5, max: 800, noNaN: true }),
    Imax: fc.double({ min: 1, max: 600, noNaN: true }),
    inertia: fc.double({ min: 1e-6, max: 0.5, noNaN: true }),
  })
  .map((r) => ({
    format: 'torquewise-project',
    version: 1,
    name: 'fuzz nameplate',
    nameplate: {
      ...(r.byPairs ? { polePairs: r.poles / 2 } : { poles: r.poles }),
      R: r.R,
      ...r.L,
      ...r.K,
      ...(r.rated ? { ratedCurrent: { value: r.rated.I, basis: 'rms' }, ratedSpeed_rpm: r.rated.n, ratedTorque_Nm: r.rated.T } : {}),
      inertia: r.inertia,
    },
    inverter: { Vdc: r.Vdc, Imax: r.Imax, Icont: r.Imax / 2, modulation: 'svpwm' },
    conditions: { windingTemp_C: 100, magnetTemp_C: 80, coldTemp_C: -20 },
    requirements: [{ label: 'a', speed_rpm: 1000, torque_Nm: 1 }],
    control: { mode: 'speed', fCtrl_Hz: 10000 },
    scenario: { duration_s: 0.02, speedSteps: [{ t_s: 0.001, speed_rpm: 1000 }] },
  }));

const flagsFor = (cmd: CommandName): fc.Arbitrary<string[]> => {
  const num = fc.oneof(fc.constantFrom('0', '-1', '1e9', 'NaN', 'Infinity', '1e-300', '', 'abc', '2.5', '100000', '100001'), fc.double({ noNaN: true, min: -2e4, max: 2e4 }).map(String));
  if (cmd === 'point') return fc.tuple(num, num).map(([s, t]) => ['--speed', s, '--torque', t]);
  if (cmd === 'envelope') return fc.oneof(fc.constant<string[]>(['--points', '24']), num.map((n) => ['--points', n]), num.map((n) => ['--speed-max', n, '--points', '16']));
  return fc.constant([]);
};

/** One fuzz case: a mutated demo, a mutated random project, or a damaged text. */
export const fuzzCase: fc.Arbitrary<FuzzCase> = fc
  .record({
    seed: fc.oneof(
      { weight: 2, arbitrary: fc.constantFrom(...DEMO_NAMES).map((n) => DEMOS[n]) },
      { weight: 2, arbitrary: randomProject },
      { weight: 1, arbitrary: randomNameplateProject as fc.Arbitrary<unknown> },
    ),
    muts: fc.oneof({ weight: 2, arbitrary: fc.constant([] as Mutation[]) }, { weight: 2, arbitrary: fc.array(mutation.filter((m) => m.op === 'scale'), { minLength: 1, maxLength: 2 }) }, { weight: 5, arbitrary: fc.array(mutation, { minLength: 1, maxLength: 3 }) }),
    asText: fc.boolean(),
    textDamage: fc.option(fc.record({ at: fc.nat(), kind: fc.constantFrom('truncate', 'flip', 'bom', 'nan-token', 'inf-token', 'deep') }), { freq: 6 }),
    command: fc.constantFrom(...COMMAND_NAMES),
  })
  .chain((r) => flagsFor(r.command).map((flags) => ({ ...r, flags })))
  .map((r) => {
    const value = mutate(r.seed, r.muts);
    if (!r.asText && !r.textDamage) return { input: { value }, command: r.command, flags: r.flags };
    // JSON has no NaN/Infinity: write them as the tokens an editor might leave (invalid JSON) or as 1e999 (= Infinity)
    let text = JSON.stringify(value, (_k, v) => (typeof v === 'number' && !Number.isFinite(v) ? (Number.isNaN(v) ? '__NAN__' : v > 0 ? '__INF__' : '__NINF__') : v));
    text = text.replace(/"__NAN__"/g, 'NaN').replace(/"__INF__"/g, '1e999').replace(/"__NINF__"/g, '-1e999');
    const d = r.textDamage;
    if (d) {
      const at = d.at % Math.max(1, text.length);
      if (d.kind === 'truncate') text = text.slice(0, at);
      else if (d.kind === 'flip') text = text.slice(0, at) + String.fromCharCode((text.charCodeAt(at) + 7) % 128) + text.slice(at + 1);
      else if (d.kind === 'bom') text = '\ufeff' + text;
      else if (d.kind === 'nan-token') text = text.replace(/(:\s*)-?\d+(\.\d+)?(e[+-]?\d+)?/, '$1NaN');
      else if (d.kind === 'inf-token') text = text.replace(/(:\s*)-?\d+(\.\d+)?(e[+-]?\d+)?/, '$11e400');
      else text = text.replace(/(:\s*)-?\d+(\.\d+)?(e[+-]?\d+)?/, `$1${'['.repeat(50_000)}1${']'.repeat(50_000)}`);
    }
    return { input: { text }, command: r.command, flags: r.flags };
  });

// ---------------------------------------------------------------- the oracle

/** First non-finite number in a document (path), or null. */
export function nonFinite(x: unknown, path = '$', depth = 0): string | null {
  if (depth > 64) return `${path}: nested deeper than 64`;
  if (typeof x === 'number') return Number.isFinite(x) ? null : `${path} = ${x}`;
  if (x === null || typeof x !== 'object') return null;
  if (ArrayBuffer.isView(x)) {
    const a = x as unknown as ArrayLike<number>;
    for (let i = 0; i < a.length; i++) if (!Number.isFinite(a[i]!)) return `${path}[${i}] = ${a[i]}`;
    return null;
  }
  for (const [k, v] of Object.entries(x)) {
    const bad = nonFinite(v, `${path}.${k}`, depth + 1);
    if (bad) return bad;
  }
  return null;
}

const MAX_MESSAGE = 600;

function projectOf(input: FuzzCase['input']): ResolvedProject {
  return 'text' in input ? loadProjectText(input.text) : resolveProject(parseProject(input.value));
}

/** Run the command as the CLI would (simulation with the fuzz step budget) and judge the outcome. */
export async function runCase(c: FuzzCase): Promise<Outcome> {
  let project: ResolvedProject | undefined;
  try {
    project = projectOf(c.input);
    const cmd = COMMANDS.find((k) => k.name === c.command)!;
    const args = parseArgs([c.command, 'project.json', ...c.flags]);
    checkFlags(args, { ...cmd.flags, json: 'switch' });
    let json: unknown;
    let lines: string[] = [];
    if (c.command === 'simulate') {
      // the simulate command's path with a small step budget (a fuzz case must be short)
      const setup = simulationFromProject(project);
      const rep = simulationReport(project, setup, runSimulation(setup, { maxSteps: FUZZ_SIM_MAX_STEPS }));
      json = rep.json;
      lines = rep.lines;
    } else {
      const r = await cmd.run(project, args);
      json = r.json;
      lines = r.lines;
    }
    const bad = nonFinite(json);
    if (bad) return { kind: 'failure', why: `${c.command}: non-finite number in the document: ${bad}` };
    // what the terminal gets: no control, separator or bidirectional character raw, one line per entry
    const printed = terminalText(lines);
    const raw = /[\u0000-\u0009\u000b-\u001f\u007f-\u009f\u061c\u200e\u200f\u2028\u2029\u202a-\u202e\u2066-\u2069]/.exec(printed);
    if (raw) return { kind: 'failure', why: `${c.command}: the text would print U+${raw[0].charCodeAt(0).toString(16).padStart(4, '0')} raw` };
    if (printed.split('\n').length !== lines.length + 1) return { kind: 'failure', why: `${c.command}: the text would print more lines than it has` };
    let shown = lines.join('\n');
    for (const s of [project.name, ...project.requirements.map((q) => q.label)]) if (s) shown = shown.split(s).join('');
    if (/\bNaN\b|Infinity/.test(shown)) return { kind: 'failure', why: `${c.command}: text shows NaN/Infinity: ${/.{0,60}(NaN|Infinity).{0,20}/.exec(shown)?.[0]}` };
    return { kind: 'ok' };
  } catch (e) {
    if (e instanceof InputError) {
      if (!e.field) return { kind: 'failure', why: 'InputError without a field' };
      if (!e.message.startsWith(e.field)) return { kind: 'failure', why: `InputError message does not start with its field: ${e.message.slice(0, 200)}` };
      if (/[\r\n]/.test(e.message)) return { kind: 'failure', why: `InputError message spans lines: ${JSON.stringify(e.message.slice(0, 200))}` };
      if (e.message.length > MAX_MESSAGE) return { kind: 'failure', why: `InputError message is ${e.message.length} characters long: ${e.message.slice(0, 120)}...` };
      if (/\bNaN\b/.test(e.message.replace(/'[^']*'/g, '').replace(/"[^"]*"/g, ''))) return { kind: 'failure', why: `InputError message shows NaN: ${e.message.slice(0, 200)}` };
      const lines = problemLines(e);
      for (const l of lines) {
        if (/[\r\n]/.test(l) || l.length > MAX_MESSAGE) return { kind: 'failure', why: `InputError problem line spans lines or is too long: ${JSON.stringify(l.slice(0, 200))}` };
        if (/\bNaN\b/.test(l.replace(/'[^']*'/g, '').replace(/"[^"]*"/g, ''))) return { kind: 'failure', why: `InputError problem shows NaN: ${l.slice(0, 200)}` };
      }
      return { kind: 'input-error', field: e.field, message: e.message, lines };
    }
    const what = e instanceof Error ? `${e.name}: ${e.message}\n${(e.stack ?? '').split('\n').slice(1, 4).join('\n')}` : String(e);
    return { kind: 'failure', why: `${c.command} threw ${what.slice(0, 800)}` };
  }
}

export interface FuzzTally {
  run: number;
  passed: number;
  ok: number;
  inputErrors: number;
  failures: Array<{ seed: number; index: number; why: string }>;
  /** slowest case, s (wall time, for the trust report only) */
  slowest_s: number;
}

/** Run `n` cases from a fixed seed. */
export async function runFuzz(seed: number, n: number, clock: () => number = () => performance.now() / 1000): Promise<FuzzTally> {
  const cases = fc.sample(fuzzCase, { seed, numRuns: n });
  const tally: FuzzTally = { run: 0, passed: 0, ok: 0, inputErrors: 0, failures: [], slowest_s: 0 };
  for (let i = 0; i < cases.length; i++) {
    const t0 = clock();
    const out = await runCase(cases[i]!);
    tally.slowest_s = Math.max(tally.slowest_s, clock() - t0);
    tally.run++;
    if (out.kind === 'failure') tally.failures.push({ seed, index: i, why: out.why });
    else {
      tally.passed++;
      if (out.kind === 'ok') tally.ok++;
      else tally.inputErrors++;
    }
  }
  return tally;
}
