#!/usr/bin/env node
// `npm start`: the desktop app through the electron-vite dev server, once Electron's executable is
// known to be there. Without it: one line saying so and how to get it, exit 1 (no server started,
// no link printed for an app that cannot open, no stack trace).
import { spawn } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { findElectron } from './electron-binary.mjs';

const found = findElectron();
if (!found.ok) {
  process.stderr.write(found.message + '\n');
  process.exit(1);
}
// the dev server's command, from its package's `bin` (its `exports` map does not expose the file)
const pkgPath = createRequire(import.meta.url).resolve('electron-vite/package.json');
const bin = JSON.parse(readFileSync(pkgPath, 'utf8')).bin;
const cli = join(dirname(pkgPath), typeof bin === 'string' ? bin : bin['electron-vite']);
const child = spawn(process.execPath, [cli, 'dev', ...process.argv.slice(2)], { stdio: 'inherit' });
for (const signal of ['SIGINT', 'SIGTERM']) process.on(signal, () => child.kill(signal));
child.on('close', (code, signal) => process.exit(code ?? (signal ? 1 : 0)));
