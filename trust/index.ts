/**
 * `npm run trust`: the reliability figures.
 *  - fuzz: cases run and passed (fuzzed project files through every command, see fuzz-cases.ts)
 *  - hostile files: CSV paths aliasing the project and full disks, names with control and bidi
 *    characters through every command, duplicate keys, invalid UTF-8, repeated options (see hostile-files.ts)
 *  - save faults: scenarios survived (a failing or crashing step of the atomic save, see src/node/save-faults.ts)
 *  - memory: peak resident memory of a 60 s simulation at 20 kHz control, in its own process
 *  - cancel: time from raising the abort signal to runSimulation returning (fresh processes, and back to back)
 *  - CSV text and plot text: hostile names through every CSV writer and the plot-text escaper (see text-cases.ts)
 * Options: --cases N (default 10000), --seed S (default a new seed each run, printed), --quick
 * (1000 cases, no long simulation). Exit code 1 when a figure misses its bound.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { spawnSync } from 'node:child_process';
import { runFuzz } from './fuzz-cases';
import { runSaveFaultScenarios } from '../src/node/save-faults';
import { HOSTILE_KINDS, runHostileFiles } from './hostile-files';
import { runCsvTextCases, runPlotTextCases } from './text-cases';

export const BOUNDS = { fuzzCases: 10_000, hostileCases: 1_000, rss_MB: 300, cancel_ms: 100 } as const;

const root = join(import.meta.dirname, '..');
const argv = process.argv.slice(2);
const flag = (name: string): string | undefined => {
  const i = argv.indexOf(`--${name}`);
  return i >= 0 ? argv[i + 1] : undefined;
};
const quick = argv.includes('--quick');
const cases = Number(flag('cases') ?? (quick ? 1000 : BOUNDS.fuzzCases));
const seed = Number(flag('seed') ?? Math.floor(Math.random() * 2 ** 31));
const now = (): number => performance.now() / 1000;
const out: string[] = [];
const say = (s: string): void => {
  out.push(s);
  process.stdout.write(s + '\n');
};
let ok = true;

say('Torquewise reliability figures');
say('');

// ---- fuzz
{
  const t0 = now();
  const t = await runFuzz(seed, cases);
  const wall = now() - t0;
  say(`fuzz: ${t.run} cases run (seed ${seed}), ${t.passed} passed: ${t.ok} gave finite results, ${t.inputErrors} one-line refusals naming the field; ${t.failures.length} failed`);
  say(`      slowest case ${(t.slowest_s * 1e3).toFixed(0)} ms, all ${wall.toFixed(1)} s`);
  for (const f of t.failures.slice(0, 10)) say(`      FAILED #${f.index}: ${f.why.split('\n')[0]}`);
  if (t.failures.length > 0 || t.run < Math.min(cases, BOUNDS.fuzzCases)) ok = false;
}

// ---- hostile files through the real CLI
{
  const n = quick ? 200 : BOUNDS.hostileCases;
  const t0 = now();
  const t = await runHostileFiles(seed, n);
  const kinds = HOSTILE_KINDS.map((k) => `${k} ${t.byKind[k].passed}/${t.byKind[k].run}`).join(', ');
  say(`hostile files: ${t.run} cases run (seed ${seed}), ${t.passed} passed (${kinds}); ${t.failures.length} failed, all ${(now() - t0).toFixed(1)} s`);
  for (const f of t.failures.slice(0, 10)) say(`      FAILED ${f.split('\n')[0]}`);
  if (t.failures.length > 0 || t.run < n) ok = false;
}

// ---- save faults
{
  const dir = mkdtempSync(join(tmpdir(), 'torquewise-trust-'));
  try {
    const r = await runSaveFaultScenarios(dir);
    say(`save faults: ${r.survived} of ${r.run} scenarios survived (old file intact, user told)`);
    if (r.survived !== r.run) ok = false;
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

// ---- text from a file: every CSV writer, and the plot-text escaper
{
  const n = quick ? 1000 : 10_000;
  const csv = runCsvTextCases(seed, n);
  say(`csv text: ${csv.run} hostile names through every CSV writer (app envelope and traces, CLI envelope and simulate), ${csv.passed} passed: every record reads back with its header's cell count, no cell reads as a formula, the name comes back whole`);
  for (const f of csv.failures.slice(0, 10)) say(`      FAILED ${f}`);
  const plot = runPlotTextCases(seed, n);
  say(`plot text: ${plot.run} hostile labels through the plot-text escaper, ${plot.passed} passed: no tag, no %{...} placeholder, shown as written`);
  for (const f of plot.failures.slice(0, 10)) say(`      FAILED ${f}`);
  if (csv.passed !== csv.run || plot.passed !== plot.run) ok = false;
}

// ---- memory of the long simulation (its own process, so the figure is its own)
if (!quick) {
  const tsx = join(root, 'node_modules', 'tsx', 'dist', 'cli.mjs');
  const r = spawnSync(process.execPath, [tsx, join(root, 'trust', 'long-sim.ts')], { encoding: 'utf8', timeout: 1_800_000 });
  const line = r.stdout.trim().split('\n').pop() ?? '';
  try {
    const m = JSON.parse(line) as { periods: number; simulated_s: number; wall_s: number; rssBefore_MB: number; rssPeak_MB: number; traceLength: number; maxPoints: number; diagnostic: string | null };
    say(`memory: 60 s at 20 kHz (${m.periods} control periods, ${m.wall_s} s wall): peak resident ${m.rssPeak_MB} MB (${m.rssBefore_MB} MB before the run), bound ${BOUNDS.rss_MB} MB; traces ${m.traceLength} samples (maxPoints ${m.maxPoints})`);
    if (m.diagnostic) say(`      stopped early: ${m.diagnostic}`);
    if (!(m.rssPeak_MB < BOUNDS.rss_MB) || m.traceLength > m.maxPoints || m.simulated_s < 60) ok = false;
  } catch {
    say(`memory: the long simulation did not report (exit ${r.status}): ${(r.stderr ?? '').split('\n')[0]}`);
    ok = false;
  }
}

// ---- cancel latency: an abort signal whose `aborted` turns true after N ms (trust/cancel.ts)
{
  const tsx = join(root, 'node_modules', 'tsx', 'dist', 'cli.mjs');
  const runs = (after: number, repeats: number): Array<{ after_ms: number; latency_ms: number; periods: number; aborted: boolean }> => {
    const r = spawnSync(process.execPath, [tsx, join(root, 'trust', 'cancel.ts'), String(after), String(repeats)], { encoding: 'utf8', timeout: 600_000 });
    return r.stdout.trim().split('\n').filter(Boolean).map((l) => JSON.parse(l));
  };
  const summary = (xs: Array<{ latency_ms: number; aborted: boolean }>): { n: number; med: number; max: number; allAborted: boolean } => {
    const l = xs.map((x) => x.latency_ms).sort((a, b) => a - b);
    return { n: l.length, med: l[Math.floor(l.length / 2)] ?? NaN, max: l[l.length - 1] ?? NaN, allAborted: xs.every((x) => x.aborted) };
  };
  // the longest run a project may ask (2 million periods) ends in about 1.5 s on a quiet machine:
  // an abort raised later than about 1 s would find it finished
  const afters = quick ? [20, 400] : [20, 100, 400, 700, 1000];
  // one run per fresh process, as a worker that runs one simulation
  const fresh = summary(afters.flatMap((a) => [...runs(a, 1), ...(quick ? [] : runs(a, 1))]));
  // runs back to back in one process (the previous run's garbage still to collect)
  const chained = summary(runs(300, quick ? 3 : 8));
  say(`cancel: one run per process, raised after ${afters[0]}..${afters[afters.length - 1]} ms (${fresh.n} runs): latency median ${fresh.med} ms, worst ${fresh.max} ms (bound ${BOUNDS.cancel_ms} ms)`);
  say(`        ${chained.n} runs back to back in one process, raised after 300 ms: median ${chained.med} ms, worst ${chained.max} ms`);
  if (!(fresh.max < BOUNDS.cancel_ms) || !fresh.allAborted || !chained.allAborted) ok = false;
}

say('');
say(ok ? 'all figures within their bounds' : 'SOME FIGURES MISS THEIR BOUNDS');
process.exitCode = ok ? 0 : 1;
