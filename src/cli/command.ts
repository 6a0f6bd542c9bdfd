import type { ParsedArgs, FlagSpec } from './args';
import type { ResolvedProject } from '../core/project/project';

/** What a command gives back: one JSON document for --json, a human text otherwise, and files to write. */
export interface CommandResult {
  json: unknown;
  /**
   * The human text, one entry per line. The CLI makes each entry visible (src/cli/terminal.ts), so
   * a name from a file that holds a newline or a bidirectional control cannot add or reorder lines.
   */
  lines: string[];
  /**
   * Files to write after the command succeeds: the contents for the file named by an option of
   * kind 'output' (e.g. `{ flag: 'csv' }` for --csv FILE). The CLI writes them atomically and has
   * refused, before running, a path that is the project file itself (src/cli/output-files.ts).
   */
  files?: Array<{ flag: string; contents: string }>;
}

/** What a command may read besides the resolved project: the project file's text, and an input file named by an option. */
export interface CommandInput {
  /** the project file's text as read */
  projectText: string;
  /** the text of the file named by option `flag` (a regular file, at most the project size limit, UTF-8); an InputError naming the option otherwise */
  readFile(flag: string): Promise<string>;
  /** the project file's path as given on the command line */
  projectPath?: string;
  /** a command with `moreFiles`: the further project files named after the first, each path and text as read */
  moreFiles?: Array<{ path: string; text: string }>;
}

export interface Command {
  name: string;
  summary: string;
  usage: string;
  flags: FlagSpec;
  /** the command takes further project files after the first (read as the first is, passed in CommandInput.moreFiles) */
  moreFiles?: boolean;
  run(project: ResolvedProject, args: ParsedArgs, input?: CommandInput): CommandResult | Promise<CommandResult>;
}
