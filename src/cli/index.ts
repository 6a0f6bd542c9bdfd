#!/usr/bin/env node
// Torquewise command line: `npm run -s cli -- <command> <project.json> [options]`.
// Exit codes: 0 ok, 2 bad input (one line per problem, each naming its field), 1 internal error.
import { readFileSync, statSync, writeFileSync } from 'node:fs';
import { parseArgs, checkFlags } from './args';
import type { Command } from './command';
import { isInputError, InputError, problemLines } from '../core/errors';
import { loadProjectText } from '../core/project';
import { COMMANDS } from './commands/registry';

function usage(): string {
  const lines = ['usage: npm run -s cli -- <command> <project.json> [options] [--json]', '', 'commands:'];
  for (const c of COMMANDS) lines.push(`  ${c.usage.padEnd(58)} ${c.summary}`);
  return lines.join('\n');
}

/** Largest project file read, bytes: a project is a few kilobytes; anything near this is not one. */
export const MAX_PROJECT_BYTES = 50 * 1024 * 1024;

/** The project file's text: a regular file only (a device or a pipe could block forever), of bounded size. */
function readProjectFile(path: string): string {
  let size: number;
  try {
    const st = statSync(path);
    if (!st.isFile()) throw new InputError('project file', `'${visible(path)}' is not a regular file`);
    size = st.size;
  } catch (e) {
    if (isInputError(e)) throw e;
    throw new InputError('project file', `'${visible(path)}' cannot be read (${(e as NodeJS.ErrnoException).code ?? 'unreadable'})`);
  }
  if (size > MAX_PROJECT_BYTES) throw new InputError('project file', `'${visible(path)}' is ${(size / 1048576).toFixed(0)} MB; a project file is at most ${MAX_PROJECT_BYTES / 1048576} MB`);
  try {
    return readFileSync(path, 'utf8');
  } catch (e) {
    throw new InputError('project file', `'${visible(path)}' cannot be read (${(e as NodeJS.ErrnoException).code ?? 'unreadable'})`);
  }
}

/**
 * Text for a terminal: control characters other than newline and tab (from names, labels or keys
 * in a file) are written as \u escapes, so a file cannot move the cursor, clear the screen or
 * fake lines of output.
 */
export function visible(s: string): string {
  return s.replace(/[\u0000-\u0008\u000b-\u001f\u007f-\u009f]/g, (c) => `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`);
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
    if (args.extra.length > 0) throw new InputError('arguments', `'${args.extra[0]}' is not expected after the project file: ${cmd.usage}`);
    const text = readProjectFile(args.file);
    const project = loadProjectText(text);
    if (project.readOnly) err.write(`torquewise: note: ${project.findings.find((f) => f.code === 'newer-format')?.message ?? 'the file is of a newer format version and is read here read-only'}\n`);
    const result = await cmd.run(project, args);
    for (const f of result.files ?? []) {
      try {
        writeFileSync(f.path, f.contents);
      } catch (e) {
        throw new InputError(`output file`, `'${f.path}' cannot be written (${(e as NodeJS.ErrnoException).code ?? 'error'})`);
      }
    }
    out.write(args.flags.has('json') ? JSON.stringify(result.json) + '\n' : visible(result.text).replace(/\n?$/, '\n'));
    return 0;
  } catch (e) {
    if (isInputError(e)) {
      // every problem of the file at once, one line each naming its field
      for (const line of problemLines(e)) err.write(`torquewise: ${visible(line)}\n`);
      return 2;
    }
    err.write(`torquewise: internal error: ${visible(e instanceof Error ? e.message : String(e))}\n`);
    return 1;
  }
}

/** Runs main on this process's arguments and sets its exit code (the `torquewise` bin and `tsx src/cli/index.ts`). */
export function runProcess(): void {
  // `... | head` closes the pipe early: that is the reader's choice, not an error.
  process.stdout.on('error', (e: NodeJS.ErrnoException) => {
    if (e.code === 'EPIPE') process.exit(0);
    throw e;
  });
  void main(process.argv.slice(2)).then((code) => {
    process.exitCode = code;
  });
}

if (process.argv[1] !== undefined && /cli[\\/]index\.(ts|js)$/.test(process.argv[1])) runProcess();
