/**
 * Command-line start bench: wall time of one `params` command on the traction demo, spawned as a user
 * runs it (`node out/cli/torquewise.mjs`, the built `torquewise` bin), against spawning `node -e 0` in
 * the same run; medians of interleaved spawns, so a busy machine slows both alike. The same command
 * through the TypeScript loader (tsx, the former `npm run cli`) is timed a few times for comparison.
 */
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { CLI_BUNDLE, ROOT, ensureBundle } from '../scripts/cli-bundle.mjs';
import type { BenchSection } from './index';

const SPAWNS = 15;
const LOADER_SPAWNS = 3;
const TARGET_RATIO = 5;

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

/** Milliseconds from spawn to exit; throws when the command fails (a failed run is not a time). */
function timeSpawn(args: string[]): number {
  const t0 = performance.now();
  const r = spawnSync(process.execPath, args, { cwd: ROOT, encoding: 'utf8', timeout: 120_000 });
  const t = performance.now() - t0;
  if (r.status !== 0) throw new Error(`node ${args.join(' ')} exited ${r.status}: ${(r.stderr ?? '').trim().split('\n')[0]}`);
  return t;
}

export const cliStartBench: BenchSection = {
  name: 'cli start',
  run() {
    const failed = ensureBundle();
    if (failed !== '') throw new Error(`the command line could not be built: ${failed}`);
    const demo = join(ROOT, 'resources', 'demo-ipm-traction.json');
    const cli = ['params', demo];
    timeSpawn(['-e', '0']); // warm the file cache for both
    timeSpawn([CLI_BUNDLE, ...cli]);
    const base: number[] = [];
    const built: number[] = [];
    for (let k = 0; k < SPAWNS; k++) {
      base.push(timeSpawn(['-e', '0']));
      built.push(timeSpawn([CLI_BUNDLE, ...cli]));
    }
    const loader: number[] = [];
    const tsx = join(ROOT, 'node_modules', 'tsx', 'dist', 'cli.mjs');
    for (let k = 0; k < LOADER_SPAWNS; k++) loader.push(timeSpawn([tsx, join(ROOT, 'src', 'cli', 'index.ts'), ...cli]));
    const tBase = median(base);
    const tBuilt = median(built);
    const tLoader = median(loader);
    const ratio = tBuilt / tBase;
    console.log(`  node -e 0:                              median ${tBase.toFixed(0)} ms (${SPAWNS} spawns)`);
    console.log(`  params demo-ipm-traction, built bin:    median ${tBuilt.toFixed(0)} ms (${SPAWNS} spawns, interleaved with the above)`);
    console.log(`  params demo-ipm-traction, through tsx:  median ${tLoader.toFixed(0)} ms (${LOADER_SPAWNS} spawns, for comparison)`);
    console.log(`  ratio: built bin ${ratio.toFixed(1)}x node -e 0 (target <= ${TARGET_RATIO}x: ${ratio <= TARGET_RATIO ? 'met' : 'NOT met'}); through tsx ${(tLoader / tBase).toFixed(1)}x`);
  },
};
