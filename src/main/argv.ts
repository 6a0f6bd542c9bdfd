// The project file named on the command line, if any: `torquewise motor.json`, or in
// development `npm start -- motor.json`. Flags (Chromium's and ours) are skipped.
import { isAbsolute, resolve } from 'node:path';

/**
 * argv is process.argv: [executable, (app path when not packaged), ...arguments].
 * Returns the absolute path of the first argument ending in .json, or null.
 */
export function projectPathFromArgv(argv: readonly string[], opts: { packaged: boolean; cwd: string }): string | null {
  const args = argv.slice(opts.packaged ? 1 : 2);
  for (const a of args) {
    if (a.startsWith('-')) continue;
    if (!/\.json$/i.test(a)) continue;
    return isAbsolute(a) ? a : resolve(opts.cwd, a);
  }
  return null;
}
