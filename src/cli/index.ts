#!/usr/bin/env node
// Torquewise command line: `npm run -s cli -- <command> <project.json> [options]`.
// Exit codes: 0 ok, 2 bad input (one line naming the field), 1 internal error.
import { readFileSync, writeFileSync } from 'node:fs';
import { parseArgs, checkFlags } from './args';
import type { Command } from './command';
import { isInputError, InputError } from '../core/errors';
import { loadProjectText } from '../core/project';
import { COMMANDS } from './commands/registry';

function usage(): string {
  const lines = ['usage: npm run -s cli -- <command> <project.json> [options] [--json]', '', 'commands:'];
  for (const c of COMMANDS) lines.push(`  ${c.usage.padEnd(58)} ${c.summary}`);
  return lines.join('\n');
}

/** The sinks main writes to (process.stdout and process.stderr, or a test's collector). */
export interface TextSink {
  write(s: string): unknown;
}

export async function main(argv: readonly string[], out: TextSink = process.stdout, err: TextSink = process.stderr): Promise<number> {
  try {
    const args = parseArgs(argv);
    if (args.command === '' || args.command === 'help' || args.flags.has('help')) {
      out.write(usage() + '\n');
      return args.command === '' && !args.flags.has('help') ? 2 : 0;
    }
    const cmd: Command | undefined = COMMANDS.find((c) => c.name === args.command);
    if (!cmd) throw new InputError('command', `'${args.command}' is unknown; use one of: ${COMMANDS.map((c) => c.name).join(', ')}`);
    checkFlags(args, { ...cmd.flags, json: 'switch' });
    if (!args.file) throw new InputError('project file', `is missing: ${cmd.usage}`);
    let text: string;
    try {
      text = readFileSync(args.file, 'utf8');
    } catch (e) {
      const code = (e as NodeJS.ErrnoException).code ?? 'unreadable';
      throw new InputError('project file', `'${args.file}' cannot be read (${code})`);
    }
    const project = loadProjectText(text);
    const result = await cmd.run(project, args);
    for (const f of result.files ?? []) {
      try {
        writeFileSync(f.path, f.contents);
      } catch (e) {
        throw new InputError(`output file`, `'${f.path}' cannot be written (${(e as NodeJS.ErrnoException).code ?? 'error'})`);
      }
    }
    out.write(args.flags.has('json') ? JSON.stringify(result.json) + '\n' : result.text.replace(/\n?$/, '\n'));
    return 0;
  } catch (e) {
    if (isInputError(e)) {
      err.write(`torquewise: ${e.message}\n`);
      return 2;
    }
    err.write(`torquewise: internal error: ${e instanceof Error ? e.message : String(e)}\n`);
    return 1;
  }
}

const isEntry = process.argv[1] !== undefined && /cli[\\/]index\.(ts|js)$/.test(process.argv[1]);
if (isEntry) {
  // `... | head` closes the pipe early: that is the reader's choice, not an error.
  process.stdout.on('error', (e: NodeJS.ErrnoException) => {
    if (e.code === 'EPIPE') process.exit(0);
    throw e;
  });
  void main(process.argv.slice(2)).then((code) => {
    process.exitCode = code;
  });
}
