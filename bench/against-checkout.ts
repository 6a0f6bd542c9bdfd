/**
 * `npm run bench -- --against DIR`: this tree's envelope and simulation timed against another
 * checkout of Torquewise (DIR, e.g. a `git worktree` of an earlier commit). Each measurement runs in
 * a fresh child process (one engine per process: two engines in one process would share the
 * integrator library's compiled code and slow each other), ours and theirs alternating, so that
 * machine load falls on both alike. Prints the medians and the ratio theirs/ours (above 1: this tree
 * is faster). The other checkout's modules are found under the layouts the engine has had (flat
 * src/core, or src/core by area).
 */
import { execFileSync } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import type { BenchSection } from './index';

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
async function child(root: string, demo: string): Promise<void> {
  type P = { hot: unknown; peak: unknown };
  const load = (await pick(root, ['src/core/project/project.ts', 'src/core/project.ts'], 'loadProjectText')) as unknown as (t: string) => P;
  const envelope = (await pick(root, ['src/core/steady-state/envelope.ts', 'src/core/envelope.ts'], 'computeEnvelope')) as unknown as (m: unknown, l: unknown, o: unknown) => void;
  const setup = (await pick(root, ['src/core/project/simulation-from-project.ts', 'src/core/simulation/simulate.ts', 'src/core/simulate.ts'], 'simulationFromProject')) as unknown as (p: P) => unknown;
  const run = (await pick(root, ['src/core/simulation/simulate.ts', 'src/core/simulate.ts'], 'runSimulation')) as unknown as (s: unknown, o: unknown) => void;
  const p = load(readFileSync(join(root, 'resources', `${demo}.json`), 'utf8'));
  const s = setup(p);
  const envelope_ms = timeIt(() => envelope(p.hot, p.peak, { points: 400 }), 20, 15, 40);
  const simulation_ms = timeIt(() => run(s, { wallBudget_s: 600 }), 1, 15, 8);
  process.stdout.write(JSON.stringify({ envelope_ms, simulation_ms }));
}

export function againstCheckout(dir: string): BenchSection {
  return {
    name: `against checkout ${dir}`,
    run() {
      const here = resolve(import.meta.dirname, '..');
      const there = resolve(dir);
      const self = join(here, 'bench', 'against-checkout.ts');
      const tsx = join(here, 'node_modules', 'tsx', 'dist', 'cli.mjs');
      for (const demo of DEMOS) {
        const got: Record<'ours' | 'theirs', Array<{ envelope_ms: number; simulation_ms: number }>> = { ours: [], theirs: [] };
        for (let k = 0; k < PROCESSES; k++) {
          const order: Array<['ours' | 'theirs', string]> = k % 2 ? [['theirs', there], ['ours', here]] : [['ours', here], ['theirs', there]];
          for (const [who, root] of order) got[who].push(JSON.parse(execFileSync(process.execPath, [tsx, self, '--child', root, demo], { encoding: 'utf8' })));
        }
        console.log(`${demo} (median of ${PROCESSES} processes each, alternating):`);
        for (const key of ['envelope_ms', 'simulation_ms'] as const) {
          const a = median(got.ours.map((g) => g[key])), b = median(got.theirs.map((g) => g[key]));
          console.log(`  ${key === 'envelope_ms' ? 'envelope, 400 points, hot corner' : 'simulation of the demo scenario'}: ours ${a.toFixed(3)} ms, theirs ${b.toFixed(3)} ms, ratio theirs/ours ${(b / a).toFixed(3)}`);
        }
      }
    },
  };
}

const ci = process.argv.indexOf('--child');
if (ci >= 0) await child(process.argv[ci + 1]!, process.argv[ci + 2]!);
