// The built command line (out/cli/torquewise.mjs, and its efficiency-map worker beside it) and when it must be rebuilt: plain Node, no
// TypeScript loader, so `npm run cli` can check it in a few milliseconds before running it.
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, renameSync, rmSync, statSync, utimesSync, mkdirSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

export const ROOT = resolve(dirname(fileURLToPath(import.meta.url)), '..');
export const CLI_BUNDLE = join(ROOT, 'out', 'cli', 'torquewise.mjs');

/**
 * The efficiency map's worker beside a bundle: a second, lean bundle of src/cli/efficiency-worker.ts
 * (only what the map needs, so a worker thread starts faster; without it the bundle serves as its own worker).
 */
export function mapWorkerBundle(bundle = CLI_BUNDLE) {
  return join(dirname(bundle), 'efficiency-worker.mjs');
}

/** What the bundle is built from: every file under src, the build config and the dependency pins. */
export function bundleInputs(root = ROOT) {
  const files = [join(root, 'vite.cli.config.ts'), join(root, 'package.json'), join(root, 'package-lock.json')];
  const walk = (dir) => {
    for (const e of readdirSync(dir, { withFileTypes: true })) {
      const p = join(dir, e.name);
      if (e.isDirectory()) walk(p);
      else files.push(p);
    }
  };
  walk(join(root, 'src'));
  return files;
}

/**
 * Why the bundle must be (re)built, or '' when it is current: missing, or older than an input (an
 * edit, a checkout of another branch, a dependency change all give the input a newer mtime).
 */
export function staleReason(bundle = CLI_BUNDLE, inputs = bundleInputs()) {
  if (!existsSync(bundle)) return 'not built';
  const built = statSync(bundle).mtimeMs;
  for (const f of inputs) {
    let t;
    try {
      t = statSync(f).mtimeMs;
    } catch {
      continue; // an input that is absent (no lock file) cannot be newer
    }
    if (t > built) return `${f} changed`;
  }
  return '';
}

/**
 * Builds the bundle (and the map's worker beside it, mapWorkerBundle) with vite into private folders
 * and moves each into place in one rename, the worker first, so several processes building at once
 * (parallel test files) never see half a file. Their mtime is set to when the build started: a
 * source edited during the build leaves them stale. Returns '' on success, else the build's output.
 */
export function buildBundle(bundle = CLI_BUNDLE) {
  const started = new Date();
  mkdirSync(dirname(bundle), { recursive: true });
  const vite = join(ROOT, 'node_modules', 'vite', 'bin', 'vite.js');
  if (!existsSync(vite)) return 'vite is not installed (run npm install)';
  const build = (entry, to) => {
    const tmp = mkdtempSync(join(dirname(bundle), '.build-'));
    try {
      const r = spawnSync(process.execPath, [vite, 'build', '--config', join(ROOT, 'vite.cli.config.ts'), ...(entry ? ['--ssr', entry] : [])], {
        cwd: ROOT,
        env: { ...process.env, TORQUEWISE_CLI_OUT: tmp },
        encoding: 'utf8',
        timeout: 300_000,
      });
      const built = join(tmp, 'torquewise.mjs');
      if (r.status !== 0 || !existsSync(built)) return `${r.stdout ?? ''}${r.stderr ?? ''}${r.error ? String(r.error) : ''}`.trim() || 'vite build failed';
      utimesSync(built, started, started);
      renameSync(built, to);
      return '';
    } finally {
      rmSync(tmp, { recursive: true, force: true });
    }
  };
  return build(join(ROOT, 'src', 'cli', 'efficiency-worker.ts'), mapWorkerBundle(bundle)) || build(undefined, bundle);
}

/** Builds the bundle and its map worker when either is missing or stale; '' when they are ready, else why not. */
export function ensureBundle(bundle = CLI_BUNDLE) {
  if (staleReason(bundle) === '' && staleReason(mapWorkerBundle(bundle)) === '') return '';
  return buildBundle(bundle);
}
