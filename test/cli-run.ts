// The CLI's main() run in this process with its output captured (not a test file itself).
import { main } from '../src/cli/index';

/** Runs `torquewise ...argv` in-process: the exit code and everything written to stdout and stderr. */
export async function runCli(...argv: string[]): Promise<{ code: number; out: string; err: string }> {
  let out = '';
  let err = '';
  const code = await main(argv, { write: (s: string) => ((out += s), true) }, { write: (s: string) => ((err += s), true) });
  return { code, out, err };
}
