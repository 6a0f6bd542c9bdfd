// The built command line (out/cli/torquewise.mjs) and when it must be rebuilt: plain Node, no
// TypeScript loader, so `npm run cli` can check it in a few milliseconds before running it.
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, renameSync, rmSync, statSync, utimesSync, mkdirSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

export const ROOT = resolve(dirname(fileURLToPath(import.meta.url)), '..');
export const CLI_BUNDLE = join(ROOT, 'out', 'cli', 'torquewise.mjs');

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
 * Builds the bundle with vite into a private folder and moves it into place in one rename, so
 * several processes building at once (parallel test files) never see half a file. The bundle's mtime
 * is set to when the build started: a source edited during the build leaves it stale.
 * Returns '' on success, else the build's output.
 */
export function buildBundle(bundle = CLI_BUNDLE) {
  const started = new Date();
  mkdirSync(dirname(bundle), { recursive: true });
  const tmp = mkdtempSync(join(dirname(bundle), '.build-'));
  try {
    const vite = join(ROOT, 'node_modules', 'vite', 'bin', 'vite.js');
    if (!existsSync(vite)) return 'vite is not installed (run npm install)';
    const r = spawnSync(process.execPath, [vite, 'build', '--config', join(ROOT, 'vite.cli.config.ts')], {
      cwd: ROOT,
      env: { ...process.env, TORQUEWISE_CLI_OUT: tmp },
      encoding: 'utf8',
      timeout: 300_000,
    });
    const built = join(tmp, 'torquewise.mjs');
    if (r.status !== 0 || !existsSync(built)) return `${r.stdout ?? ''}${r.stderr ?? ''}${r.error ? String(r.error) : ''}`.trim() || 'vite build failed';
    utimesSync(built, started, started);
    renameSync(built, bundle);
    return '';
  } finally {
    rmSync(tmp, { recursive: true, force: true });
  }
}

/** Builds the bundle when it is missing or stale; '' when it is ready, else why it is not. */
export function ensureBundle(bundle = CLI_BUNDLE) {
  if (staleReason(bundle) === '') return '';
  return buildBundle(bundle);
}
