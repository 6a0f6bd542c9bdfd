import type { ParsedArgs, FlagSpec } from './args';
import type { ResolvedProject } from '../core/project';

/** What a command gives back: one JSON document for --json, a human text otherwise, and files to write. */
export interface CommandResult {
  json: unknown;
  text: string;
  /** path -> contents, written by the CLI after the command succeeds (e.g. --csv FILE) */
  files?: Array<{ path: string; contents: string }>;
}

export interface Command {
  name: string;
  summary: string;
  usage: string;
  flags: FlagSpec;
  run(project: ResolvedProject, args: ParsedArgs): CommandResult | Promise<CommandResult>;
}
