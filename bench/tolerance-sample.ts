/**
 * Monte Carlo over the tolerance bands across threads: `tolerance-sample` on the traction demo
 * (10 000 samples of its invented bands, each sized hot and cold for the verdicts) spawned as a user
 * runs it (`node out/cli/torquewise.mjs`, the built bin) with --threads 1 and --threads 2,
 * interleaved in the same run; the samples' own time (the document's `wall_s`: from the first chunk
 * to the joined result; the workers start at the process's entry, src/cli/tolerance-prestart.ts, so
 * what is left of their start after the main thread's own is included) and the whole command's, with
 * the machine's load average before and after (other work on the two cores lowers the ratio).
 * Targets: 10 000 samples under 30 s; 2 threads at least 1.7 x faster than 1 (on two cores; other
 * work on the cores shows as wide ranges and a lower ratio). Where Linux taskset exists, the same
 * runs held to one core give the bound on two cores (the work of two threads on one core, halved).
 */
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { loadavg } from 'node:os';
import { CLI_BUNDLE, ROOT, ensureBundle } from '../scripts/cli-bundle.mjs';
import type { BenchSection } from './index';

const SAMPLES = 10_000;
const TARGET_S = 30;
const TARGET_RATIO = 1.7;
const REPS = Number(process.env.TW_BENCH_TOLERANCE_REPS ?? 3);

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m]! : (s[m - 1]! + s[m]!) / 2;
}

/** The samples' time, their CPU time (every thread of the process) and the command's, s (`cpus`: the cores it is held to, by taskset). */
function run(threads: number, samples: number, cpus?: string): { samples: number; cpu: number; command: number } {
  const demo = join(ROOT, 'resources', 'demo-ipm-traction.json');
  const argv = [CLI_BUNDLE, 'tolerance-sample', demo, '--samples', String(samples), '--threads', String(threads), '--json'];
  const t0 = performance.now();
  const r = spawnSync(cpus !== undefined ? 'taskset' : process.execPath, cpus !== undefined ? ['-c', cpus, process.execPath, ...argv] : argv, { cwd: ROOT, encoding: 'utf8', timeout: 900_000, maxBuffer: 1 << 26 });
  const command = (performance.now() - t0) / 1e3;
  if (r.status !== 0) throw new Error(`tolerance-sample --threads ${threads} exited ${r.status}: ${(r.stderr ?? '').trim().split('\n')[0]}`);
  const d = JSON.parse(r.stdout);
  return { samples: d.wall_s, cpu: d.cpu_s, command };
}

const range = (xs: number[]): string => `${Math.min(...xs).toFixed(1)}-${Math.max(...xs).toFixed(1)}`;

export const toleranceSampleBench: BenchSection = {
  name: 'tolerance Monte Carlo across threads (10 000 samples, traction demo)',
  run() {
    const failed = ensureBundle();
    if (failed !== '') throw new Error(`the command line could not be built: ${failed}`);
    run(1, 200);
    const load = (): string => loadavg().map((x) => x.toFixed(2)).join(' ');
    const loadBefore = load();
    const one: Array<{ samples: number; cpu: number; command: number }> = [], two: typeof one = [];
    for (let k = 0; k < REPS; k++) {
      one.push(run(1, SAMPLES));
      two.push(run(2, SAMPLES));
    }
    const m1 = median(one.map((x) => x.samples)), m2 = median(two.map((x) => x.samples));
    console.log(`${SAMPLES} samples: ${m1.toFixed(1)} s on 1 thread (${range(one.map((x) => x.samples))}), ${m2.toFixed(1)} s on 2 (${range(two.map((x) => x.samples))}): ` +
      `${(m1 / m2).toFixed(2)} x (targets: under ${TARGET_S} s: ${Math.min(m1, m2) < TARGET_S ? 'met' : 'NOT met'}; ${TARGET_RATIO} x: ${m1 / m2 >= TARGET_RATIO ? 'met' : 'NOT met'}); ` +
      `whole command ${median(one.map((x) => x.command)).toFixed(1)} / ${median(two.map((x) => x.command)).toFixed(1)} s; load average (1, 5, 15 min) ${loadBefore} before, ${load()} after`);
    // what the cores' other work cannot hide: the CPU time of the samples; two threads on two free cores take at least half of theirs
    const c1 = median(one.map((x) => x.cpu)), c2 = median(two.map((x) => x.cpu));
    console.log(`CPU time of the samples: ${c1.toFixed(1)} s on 1 thread, ${c2.toFixed(1)} s on 2 (the second thread's start and compilation: +${(c2 - c1).toFixed(1)} s); ` +
      `on two free cores, at best ${(c1 / (c2 / 2)).toFixed(2)} x`);
    if (spawnSync('taskset', ['-c', '0', 'true']).status === 0) {
      const n = SAMPLES / 5;
      const p1 = run(1, n, '0').samples, p2 = run(2, n, '0').samples;
      console.log(`${n} samples held to one core (shared with whatever else runs there): ${p1.toFixed(2)} s on 1 thread, ${p2.toFixed(2)} s on 2; ` +
        `so on two cores 2 threads take at least ${(p2 / 2).toFixed(2)} s: at best ${(p1 / (p2 / 2)).toFixed(2)} x`);
    }
  },
};
