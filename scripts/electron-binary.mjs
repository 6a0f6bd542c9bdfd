// Where the desktop app's Electron executable is, or one line saying why it is not there and how to
// get it. Plain Node (run by `npm start` before anything is built); never requires the electron
// package itself, whose entry point starts a download when the binary is missing.
import { existsSync, readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';

/** The Node.js version Electron's installer needs (its package's `engines`). */
export const ELECTRON_NODE = '22.12.0';

/** True when version (e.g. '20.19.1' or 'v22.12.0') is at least least. */
export function atLeast(version, least) {
  const a = version.replace(/^v/, '').split('.').map(Number);
  const b = least.split('.').map(Number);
  for (let k = 0; k < 3; k++) if ((a[k] || 0) !== b[k]) return (a[k] || 0) > b[k];
  return true;
}

/** The folder of the installed electron package, or '' when it is not installed. */
export function electronPackageDir(from = import.meta.url) {
  try {
    return dirname(createRequire(from).resolve('electron/package.json'));
  } catch {
    return '';
  }
}

/**
 * { ok: true, path } when Electron's executable is there, found as the dev server finds it
 * (ELECTRON_EXEC_PATH, else the package's path.txt under its dist folder); else { ok: false, message }
 * with one line: what is missing and how to get it.
 */
export function findElectron({ env = process.env, dir = electronPackageDir(), nodeVersion = process.versions.node } = {}) {
  const how = atLeast(nodeVersion, ELECTRON_NODE)
    ? 'with network access run `npx install-electron`, then `npm start`'
    : `Electron's installer needs Node.js ${ELECTRON_NODE} or newer (this is ${nodeVersion}): with that Node and network access run \`npx install-electron\`, then \`npm start\``;
  const web = '`npm run web` serves the same app to a browser';
  if (env.ELECTRON_EXEC_PATH) {
    if (existsSync(env.ELECTRON_EXEC_PATH)) return { ok: true, path: env.ELECTRON_EXEC_PATH };
    return { ok: false, message: `torquewise: ELECTRON_EXEC_PATH is '${env.ELECTRON_EXEC_PATH}', which does not exist: unset it or point it at Electron's executable.` };
  }
  if (dir === '') return { ok: false, message: 'torquewise: the electron package is not installed, so the desktop app cannot start: run `npm install`.' };
  const pathFile = join(dir, 'path.txt');
  const rel = existsSync(pathFile) ? readFileSync(pathFile, 'utf8').trim() : '';
  const exe = rel === '' ? '' : join(dir, 'dist', rel);
  if (exe !== '' && existsSync(exe)) return { ok: true, path: exe };
  return { ok: false, message: `torquewise: Electron's binary is not installed, so the desktop app cannot start; ${how} (${web}).` };
}
