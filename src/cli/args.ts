import { InputError } from '../core/base/errors';

/** Parsed command line: `<command> <project.json> [--flag value | --switch]...` */
export interface ParsedArgs {
  command: string;
  file: string | undefined;
  /** positional words after the file (no command takes any) */
  extra: string[];
  flags: Map<string, string | true>;
}

export function parseArgs(argv: readonly string[]): ParsedArgs {
  const flags = new Map<string, string | true>();
  const positional: string[] = [];
  // an option given twice is refused: which one was meant (the first, the last) is a guess
  const set = (name: string, value: string | true): void => {
    if (flags.has(name)) throw new InputError(`--${name}`, 'is given more than once; give each option once');
    flags.set(name, value);
  };
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i]!;
    if (a.startsWith('--')) {
      const eq = a.indexOf('=');
      if (eq > 0) set(a.slice(2, eq), a.slice(eq + 1));
      else {
        const next = argv[i + 1];
        if (next !== undefined && !next.startsWith('--')) {
          set(a.slice(2), next);
          i++;
        } else set(a.slice(2), true);
      }
    } else positional.push(a);
  }
  return { command: positional[0] ?? '', file: positional[1], extra: positional.slice(2), flags };
}

/**
 * The flags a command knows: name -> 'switch' (no value), 'number', 'string', or 'output' (a file
 * the CLI writes: never empty, never the project file itself; see src/cli/output-files.ts).
 */
export type FlagSpec = Record<string, 'switch' | 'number' | 'string' | 'output'>;

export function checkFlags(args: ParsedArgs, spec: FlagSpec): void {
  // a switch followed by a positional was read as a value: give the value back as positional-less error
  for (const [name, value] of args.flags) {
    const kind = spec[name];
    if (!kind) {
      const known = Object.keys(spec).map((k) => `--${k}`).join(', ');
      throw new InputError(`--${name}`, `is not an option of '${args.command}' (options: ${known || 'none'})`);
    }
    if (kind === 'switch' && value !== true) {
      throw new InputError(`--${name}`, `takes no value (got '${value}')`);
    }
    if (kind !== 'switch' && value === true) throw new InputError(`--${name}`, `needs a value`);
    if ((kind === 'string' || kind === 'output') && value === '') throw new InputError(`--${name}`, kind === 'output' ? 'needs a file name (got an empty one)' : 'needs a value (got an empty one)');
  }
}

const DECIMAL = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

export function numberFlag(args: ParsedArgs, name: string, range: { min?: number; max?: number; integer?: boolean; unit?: string } = {}): number | undefined {
  const v = args.flags.get(name);
  if (v === undefined) return undefined;
  // a decimal number only: Number('') is 0 and Number('0x10') is 16, neither is what was meant
  const x = typeof v === 'string' && DECIMAL.test(v.trim()) ? Number(v) : NaN;
  const unit = range.unit ? ` ${range.unit}` : '';
  if (!Number.isFinite(x)) throw new InputError(`--${name}`, `must be a number${unit} (got '${String(v)}')`);
  if (range.integer && !Number.isInteger(x)) throw new InputError(`--${name}`, `must be a whole number (got ${x})`);
  if (range.min !== undefined && x < range.min) throw new InputError(`--${name}`, `must be >= ${range.min}${unit} (got ${x})`);
  if (range.max !== undefined && x > range.max) throw new InputError(`--${name}`, `must be <= ${range.max}${unit} (got ${x})`);
  return x;
}

export function stringFlag(args: ParsedArgs, name: string): string | undefined {
  const v = args.flags.get(name);
  return typeof v === 'string' ? v : undefined;
}
