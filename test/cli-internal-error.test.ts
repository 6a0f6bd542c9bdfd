// The CLI's third exit code: an unexpected error inside (not bad input) exits 1 with one line and no
// stack. The project loader is replaced here by one that throws, as a defect would.
import { describe, expect, it, vi } from 'vitest';
import { resolve } from 'node:path';

vi.mock('../src/core/project/project', async (importOriginal) => {
  const real = await importOriginal<typeof import('../src/core/project/project')>();
  return {
    ...real,
    loadProjectText: () => {
      throw new TypeError("Cannot read properties of undefined (reading 'x')");
    },
  };
});

describe('cli internal error', () => {
  it('exits 1 with one line naming it an internal error, no stack trace, nothing on stdout', async () => {
    const { main } = await import('../src/cli/index');
    let out = '';
    let err = '';
    const code = await main(['params', resolve(__dirname, '..', 'resources', 'demo-spm-48v.json')], { write: (s: string) => (out += s) }, { write: (s: string) => (err += s) });
    expect(code).toBe(1);
    // its kind only: the text of whatever threw (here the engine's words) never reaches the user
    expect(err).toBe('torquewise: internal error (TypeError): a defect of Torquewise, not of the input; please report the command and the project file\n');
    expect(out).toBe('');
  });
});
