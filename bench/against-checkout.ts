/**
 * `npm run bench -- --against DIR [--only WORD]`: this tree's envelope and simulation timed against another
 * checkout of Torquewise (DIR, e.g. a `git worktree` of an earlier commit). Each measurement runs in
 * a fresh child process (one engine per process: two engines in one process would share the
 * integrator library's compiled code and slow each other), ours and theirs alternating, so that
 * machine load falls on both alike. Prints the medians and the ratio theirs/ours (above 1: this tree
 * is faster). The other checkout's modules are found under the layouts the engine has had (flat
 * src/core, or src/core by area). With `--only WORD` (e.g. `simulat`) only the measurements whose
 * name contains WORD run. The simulation's measurements add its parts (simulation-parts.ts: the
 * controller step and the recorder per control period, the reference table cold and warm) and the
 * built command line's `simulate` on the demo as a user runs it, whole process (each checkout's own
 * out/cli bundle; the other checkout's only when it is current, it is never rebuilt from here).
 */
import { execFileSync } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import type { BenchSection } from './index';
import { partsTiming, tableColdTiming } from './simulation-parts';

const PROCESSES = 5;
const DEMOS = ['demo-ipm-traction', 'demo-spm-48v'] as const;
type Fn = (...a: never[]) => unknown;

async function pick(root: string, candidates: string[], name: string): Promise<Fn> {
  for (const c of candidates) {
    const f = join(root, c);
    if (!existsSync(f)) continue;
    const mod = (await import(pathToFileURL(f).href)) as Record<string, unknown>;
    if (typeof mod[name] === 'function') return mod[name] as Fn;
  }
  throw new Error(`${name} not found in ${root} (looked in ${candidates.join(', ')})`);
}

const median = (xs: number[]): number => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
const range = (xs: number[], d: number): string => `${Math.min(...xs).toFixed(d)}..${Math.max(...xs).toFixed(d)}`;

/** median ms per call over `rounds` rounds of `reps` calls, after `warm` calls (the optimising compiler settles) */
function timeIt(f: () => void, reps: number, rounds: number, warm: number): number {
  for (let i = 0; i < warm; i++) f();
  const t: number[] = [];
  for (let r = 0; r < rounds; r++) {
    const t0 = performance.now();
    for (let i = 0; i < reps; i++) f();
    t.push((performance.now() - t0) / reps);
  }
  return median(t);
}

/** In the child: time one engine (root) on one demo, print {envelope_ms, simulation_ms} as JSON. */
async function child(root: string, demo: string, envelopeToo = true, demoRoot = root): Promise<void> {
  type P = { hot: unknown; peak: unknown };
  const load = (await pick(root, ['src/core/project/project.ts', 'src/core/project.ts'], 'loadProjectText')) as unknown as (t: string) => P;
  const envelope = (await pick(root, ['src/core/steady-state/envelope.ts', 'src/core/envelope.ts'], 'computeEnvelope')) as unknown as (m: unknown, l: unknown, o: unknown) => void;
  const setup = (await pick(root, ['src/core/project/simulation-from-project.ts', 'src/core/simulation/simulate.ts', 'src/core/simulate.ts'], 'simulationFromProject')) as unknown as (p: P) => unknown;
  const run = (await pick(root, ['src/core/simulation/simulate.ts', 'src/core/simulate.ts'], 'runSimulation')) as unknown as (s: unknown, o: unknown) => void;
  const p = load(readFileSync(join(demoRoot, 'resources', `${demo}.json`), 'utf8'));
  const s = setup(p);
  const envelope_ms = envelopeToo ? timeIt(() => envelope(p.hot, p.peak, { points: 400 }), 20, 15, 40) : NaN;
  const simulation_ms = timeIt(() => run(s, { wallBudget_s: 600 }), 1, 15, 8);
  process.stdout.write(JSON.stringify({ envelope_ms: envelopeToo ? envelope_ms : null, simulation_ms }));
}

type Row = Record<string, number>;

/** Whole-process time of the built command line's `simulate` on a demo, and the run's own figures from its JSON. */
function cliSimulate(root: string, demo: string): Row | null {
  const bundle = join(root, 'out', 'cli', 'torquewise.mjs');
  if (!existsSync(bundle)) return null;
  const t0 = performance.now();
  const out = execFileSync(process.execPath, [bundle, 'simulate', join(root, 'resources', `${demo}.json`), '--json'], { encoding: 'utf8', maxBuffer: 1 << 28 });
  const whole_ms = performance.now() - t0;
  const st = (JSON.parse(out) as { stats: { controlSteps: number; wall_s: number; setup_s?: number; run_s?: number; projectSetup_s?: number } }).stats;
  return { whole_ms, run_ms: st.wall_s * 1e3, periods_ms: (st.run_s ?? st.wall_s) * 1e3 };
}

/** The bundle of a checkout is current (built after its last source change); read only, never built here. */
async function bundleCurrent(root: string): Promise<boolean> {
  const mod = (await import(pathToFileURL(join(root, 'scripts', 'cli-bundle.mjs')).href)) as { staleReason?: (b: string, i: string[]) => string; bundleInputs?: (r: string) => string[] };
  if (!mod.staleReason || !mod.bundleInputs) return false;
  return mod.staleReason(join(root, 'out', 'cli', 'torquewise.mjs'), mod.bundleInputs(root)) === '';
}

/**
 * sameDemos: both engines run the other checkout's demo files (like for like: the demos of this tree
 * may carry what the other engine does not have, e.g. an angle sensor)
 */
export function againstCheckout(dir: string, only = '', sameDemos = false): BenchSection {
  const want = (name: string): boolean => only === '' || name.toLowerCase().includes(only);
  return {
    name: `against checkout ${dir}${only ? ` (only ${only})` : ''}${sameDemos ? ', both on its demo files' : ''}`,
    async run() {
      const here = resolve(import.meta.dirname, '..');
      const there = resolve(dir);
      const self = join(here, 'bench', 'against-checkout.ts');
      const tsx = join(here, 'node_modules', 'tsx', 'dist', 'cli.mjs');
      const child = (args: string[]): Row => JSON.parse(execFileSync(process.execPath, [tsx, self, ...args], { encoding: 'utf8', maxBuffer: 1 << 26 })) as Row;
      const sim = want('simulation');
      if (sim && !sameDemos) {
        const { ensureBundle } = (await import(pathToFileURL(join(here, 'scripts', 'cli-bundle.mjs')).href)) as { ensureBundle: () => string };
        const failed = ensureBundle();
        if (failed !== '') throw new Error(`this tree's command line could not be built: ${failed}`);
      }
      const theirCli = sim && !sameDemos && (await bundleCurrent(there));
      for (const demo of DEMOS) {
        const got: Record<'ours' | 'theirs', Row[]> = { ours: [], theirs: [] };
        for (let k = 0; k < PROCESSES; k++) {
          const order: Array<['ours' | 'theirs', string]> = k % 2 ? [['theirs', there], ['ours', here]] : [['ours', here], ['theirs', there]];
          for (const [who, root] of order) {
            const row: Row = {};
            if (want('envelope') || want('simulation')) Object.assign(row, child(['--child', root, demo, want('envelope') ? 'envelope' : 'no-envelope', sameDemos ? there : root]));
            if (sim && !sameDemos) {
              Object.assign(row, child(['--child-parts', root, demo]), child(['--child-table', root, demo]));
              const c = who === 'ours' || theirCli ? cliSimulate(root, demo) : null;
              if (c) { row.cli_whole_ms = c.whole_ms; row.cli_run_ms = c.run_ms; }
            }
            got[who].push(row);
          }
        }
        console.log(`${demo} (median and range of ${PROCESSES} processes each, alternating):`);
        const keys: Array<[string, string, number]> = [
          ['envelope_ms', 'envelope, 400 points, hot corner, ms', 3],
          ['simulation_ms', 'simulation of the demo scenario, steady state, ms', 3],
          ['controller_ns', 'controller step per control period, ns', 1],
          ['recorder_ns', 'recorder and decimator per control period, ns', 1],
          ['tableCold_ms', 'reference table, first build in a process, ms', 1],
          ['tableWarm_ms', 'reference table, warm, ms', 2],
          ['cli_run_ms', 'command line simulate: the run (first in the process), ms', 1],
          ['cli_whole_ms', 'command line simulate: whole process, ms', 0],
        ];
        for (const [key, label, d] of keys) {
          if (!want(key.startsWith('envelope') ? 'envelope' : 'simulation')) continue;
          const a = got.ours.map((g) => g[key]!).filter((x) => typeof x === 'number' && Number.isFinite(x));
          const b = got.theirs.map((g) => g[key]!).filter((x) => typeof x === 'number' && Number.isFinite(x));
          if (a.length === 0) continue;
          const theirs = b.length ? `, theirs ${median(b).toFixed(d)} [${range(b, d)}], ratio theirs/ours ${(median(b) / median(a)).toFixed(2)}` : ', theirs not measured (no current bundle)';
          console.log(`  ${label}: ours ${median(a).toFixed(d)} [${range(a, d)}]${theirs}`);
        }
        if (sim && !sameDemos && demo === 'demo-ipm-traction') {
          const whole = median(got.ours.map((g) => g.cli_whole_ms!));
          const steady = 1000 / median(got.ours.map((g) => g.simulation_ms!));
          const cold = 1000 / median(got.ours.map((g) => g.cli_run_ms!));
          console.log(`  targets: 1 s command-line run, whole process ${whole.toFixed(0)} ms (target < 600: ${whole < 600 ? 'met' : 'NOT met'}); real-time factor steady ${steady.toFixed(0)}x, cold (first run in a fresh process) ${cold.toFixed(0)}x`);
        }
      }
    },
  };
}

const ci = process.argv.indexOf('--child');
if (ci >= 0) await child(process.argv[ci + 1]!, process.argv[ci + 2]!, process.argv[ci + 3] !== 'no-envelope', process.argv[ci + 4] ?? process.argv[ci + 1]!);
const cp = process.argv.indexOf('--child-parts');
if (cp >= 0) {
  const r = await partsTiming(process.argv[cp + 1]!, process.argv[cp + 2]!);
  process.stdout.write(JSON.stringify({ controller_ns: r.controller_ns, recorder_ns: r.recorder_ns, tableWarm_ms: r.tableWarm_ms }));
}
const ct = process.argv.indexOf('--child-table');
if (ct >= 0) process.stdout.write(JSON.stringify({ tableCold_ms: await tableColdTiming(process.argv[ct + 1]!, process.argv[ct + 2]!) }));
