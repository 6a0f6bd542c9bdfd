#!/usr/bin/env node
// `npm run cli`: the built command line, rebuilt first when a source is newer than it (a clean clone,
// an edit, another branch), so what runs is always the code in src.
import { ensureBundle } from './cli-bundle.mjs';

const failed = ensureBundle();
if (failed !== '') {
  process.stderr.write(`torquewise: internal error: the command line could not be built: ${failed.split('\n').filter((l) => l.trim() !== '').slice(-1)[0] ?? ''}\n`);
  process.exit(1);
}
await import('../out/cli/torquewise.mjs');
