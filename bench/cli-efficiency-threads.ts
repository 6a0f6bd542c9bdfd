/**
 * CLI efficiency map across threads: `efficiency` on the traction demo (100 x 100, least current,
 * hot corner) spawned as a user runs it (`node out/cli/torquewise.mjs`, the built bin) with
 * --threads 1 and --threads 2, interleaved in the same run; the map's own time (its `wall_s`: from
 * the grid to the joined result; the workers start at the process's entry, so what is left of their
 * start after the main thread's own is included) and the whole command's: medians and ranges.
 * Target: 2 threads at least 1.7 x faster than 1 (on two cores; other work on the cores shows as
 * wide ranges and a lower ratio: two threads need both cores).
 */
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { CLI_BUNDLE, ROOT, ensureBundle } from '../scripts/cli-bundle.mjs';
import type { BenchSection } from './index';

const REPS = 9;
const N = 100;
const TARGET_RATIO = 1.7;

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m]! : (s[m - 1]! + s[m]!) / 2;
}

/** The map's time and the command's, ms (`pinned`: the process held to one core); throws when the command fails. */
function run(threads: number, n: number, pinned = false): { map: number; command: number } {
  const demo = join(ROOT, 'resources', 'demo-ipm-traction.json');
  const t0 = performance.now();
  const r = spawnSync(pinned ? 'taskset' : process.execPath, [...(pinned ? ['-c', '0', process.execPath] : []), CLI_BUNDLE, 'efficiency', demo, '--speed-points', String(n), '--torque-points', String(n), '--threads', String(threads), '--json'], { cwd: ROOT, encoding: 'utf8', timeout: 300_000, maxBuffer: 1 << 28 });
  const command = performance.now() - t0;
  if (r.status !== 0) throw new Error(`efficiency --threads ${threads} exited ${r.status}: ${(r.stderr ?? '').trim().split('\n')[0]}`);
  return { map: 1e3 * JSON.parse(r.stdout).summary.wall_s, command };
}

export const cliEfficiencyThreadsBench: BenchSection = {
  name: 'cli efficiency map across threads (100 x 100, traction demo)',
  run() {
    const failed = ensureBundle();
    if (failed !== '') throw new Error(`the command line could not be built: ${failed}`);
    for (const n of [N, 2 * N]) {
      run(1, n);
      run(2, n); // warm the file cache
      const one: Array<{ map: number; command: number }> = [], two: typeof one = [];
      for (let k = 0; k < REPS; k++) {
        one.push(run(1, n));
        two.push(run(2, n));
      }
      const m1 = median(one.map((x) => x.map)), m2 = median(two.map((x) => x.map));
      const c1 = median(one.map((x) => x.command)), c2 = median(two.map((x) => x.command));
      const ratio = m1 / m2;
      const range = (xs: number[]): string => `${Math.min(...xs).toFixed(0)}-${Math.max(...xs).toFixed(0)}`;
      console.log(`${n} x ${n}: map ${m1.toFixed(0)} ms on 1 thread (${range(one.map((x) => x.map))}), ${m2.toFixed(0)} ms on 2 (${range(two.map((x) => x.map))}): ${ratio.toFixed(2)} x` +
        `${n === N ? ` (target >= ${TARGET_RATIO} x: ${ratio >= TARGET_RATIO ? 'met' : 'NOT met'})` : ''}; whole command ${c1.toFixed(0)} / ${c2.toFixed(0)} ms = ${(c1 / c2).toFixed(2)} x`);
    }
    // the bound on two cores: the work of each run held to one core (Linux taskset), halved for two
    if (spawnSync('taskset', ['-c', '0', 'true']).status === 0) {
      const p1: number[] = [], p2: number[] = [], f1: number[] = [];
      for (let k = 0; k < 5; k++) {
        f1.push(run(1, N).map);
        p1.push(run(1, N, true).map);
        p2.push(run(2, N, true).map);
      }
      const [a, b, c] = [median(f1), median(p1), median(p2)];
      console.log(`${N} x ${N} held to one core: ${b.toFixed(0)} ms on 1 thread (${a.toFixed(0)} ms on two cores: it uses ${(b / a).toFixed(2)} cores), ${c.toFixed(0)} ms on 2;` +
        ` so on two cores 2 threads take at least ${(c / 2).toFixed(0)} ms: at best ${(a / (c / 2)).toFixed(2)} x`);
    }
  },
};
