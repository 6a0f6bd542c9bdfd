#!/usr/bin/env node
// Torquewise command line: `npm run -s cli -- <command> <project.json> [options]`.
// Exit codes: 0 ok, 2 bad input (one line per problem, each naming its field), 1 internal error.
import { parseArgs, checkFlags, type FlagSpec, type ParsedArgs } from './args';
import type { Command } from './command';
import { isInputError, InputError, problemLines } from '../core/base/errors';
import { loadProjectText } from '../core/project/project';
import { COMMANDS } from './commands/registry';
import { inFile } from './file-refusal';
import { nodeFs, type FsLayer } from '../node/fs-layer';
import { ProjectReadError, readProjectText } from '../node/project-file';
import { checkOutputPaths, writeOutputs } from './output-files';
import { terminalJson, terminalText, visible } from './terminal';
import { isMainThread } from 'node:worker_threads';

function usage(): string {
  const lines = ['usage: npm run -s cli -- <command> <project.json> [options] [--json]', '', 'commands:'];
  for (const c of COMMANDS) lines.push(`  ${c.usage.padEnd(58)} ${c.summary}`);
  return lines.join('\n');
}

/**
 * The project file's text, read as the app reads it (src/node/project-file.ts: a regular file, at
 * most the schema's MAX_PROJECT_BYTES, strict UTF-8), its reason for a refusal after the file's name.
 */
async function readProjectFile(path: string, fs: FsLayer, field = 'project file'): Promise<string> {
  try {
    return await readProjectText(path, { fs });
  } catch (e) {
    if (e instanceof ProjectReadError) throw new InputError(field, `'${visible(path)}' ${e.why}`);
    throw e;
  }
}

/** The text of the input file named by option `flag` (read as a project file is: a regular file, bounded, UTF-8). */
async function readInputFile(args: ParsedArgs, flag: string, fs: FsLayer): Promise<string> {
  const path = args.flags.get(flag);
  if (typeof path !== 'string' || path === '') throw new InputError(`--${flag}`, 'needs a file name');
  return readProjectFile(path, fs, `--${flag}`);
}

/** The sinks main writes to (process.stdout and process.stderr, or a test's collector). */
export interface TextSink {
  write(s: string): unknown;
}

export interface MainOptions {
  /** the file system (a test injects faults here); node:fs by default */
  fs?: FsLayer;
  platform?: string;
}

export async function main(argv: readonly string[], out: TextSink = process.stdout, err: TextSink = process.stderr, options: MainOptions = {}): Promise<number> {
  const fs = options.fs ?? nodeFs;
  try {
    const args = parseArgs(argv);
    if (args.command === '' || args.command === 'help' || args.flags.has('help')) {
      out.write(usage() + '\n');
      return args.command === '' && !args.flags.has('help') ? 2 : 0;
    }
    const cmd: Command | undefined = COMMANDS.find((c) => c.name === args.command);
    if (!cmd) throw new InputError('command', `'${args.command}' is unknown; use one of: ${COMMANDS.map((c) => c.name).join(', ')}`);
    const spec: FlagSpec = { ...cmd.flags, json: 'switch' };
    checkFlags(args, spec);
    if (!args.file) throw new InputError('project file', `is missing: ${cmd.usage}`);
    if (args.extra.length > 0 && !cmd.moreFiles) throw new InputError('arguments', `'${args.extra[0]}' is not expected after the project file: ${cmd.usage}`);
    const text = await readProjectFile(args.file, fs);
    const moreFiles = cmd.moreFiles ? await Promise.all(args.extra.map(async (path) => ({ path, text: await readProjectFile(path, fs) }))) : undefined;
    // output paths are checked before any work: a long run never ends in a refusal to write
    await checkOutputPaths(args, spec, args.file, fs);
    // a command of several files names the file of a refusal
    const project = cmd.moreFiles ? inFile(args.file, () => loadProjectText(text)) : loadProjectText(text);
    if (project.readOnly) err.write(`torquewise: note: ${visible(project.findings.find((f) => f.code === 'newer-format')?.message ?? 'the file is of a newer format version and is read here read-only')}\n`);
    const result = await cmd.run(project, args, { projectText: text, readFile: (flag) => readInputFile(args, flag, fs), projectPath: args.file, ...(moreFiles ? { moreFiles } : {}) });
    for (const w of await writeOutputs(result.files, args, fs, options.platform)) err.write(`torquewise: note: ${visible(w)}\n`);
    out.write(args.flags.has('json') ? terminalJson(result.json) : terminalText(result.lines));
    return 0;
  } catch (e) {
    if (isInputError(e)) {
      // every problem of the file at once, one line each naming its field
      for (const line of problemLines(e)) err.write(`torquewise: ${visible(line)}\n`);
      return 2;
    }
    // a defect, not bad input: its kind only, never the text of whatever threw (a library's or the engine's own words)
    const kind = e instanceof Error && /^[A-Za-z]{1,40}$/.test(e.name) ? e.name : 'unknown';
    err.write(`torquewise: internal error (${kind}): a defect of Torquewise, not of the input; please report the command and the project file\n`);
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

// (never in a worker thread: process.argv is the main thread's there)
if (isMainThread && process.argv[1] !== undefined && /cli[\\/]index\.(ts|js)$/.test(process.argv[1])) runProcess();
