// The web page's upload: a file above the project size limit is refused before it is read.
import { describe, expect, it } from 'vitest';
import { MAX_PROJECT_BYTES } from '../src/core/project/schema';
import { DEFAULT_PROJECT_FILE_OPTIONS } from '../src/node/project-file';
import { readUpload } from '../src/renderer/src/state/file-bridge';

function upload(name: string, size: number, text: string) {
  const calls = { text: 0 };
  return { calls, file: { name, size, text: async () => { calls.text++; return text; } } };
}

describe('readUpload', () => {
  it('uses the same limit as the desktop app', () => {
    expect(DEFAULT_PROJECT_FILE_OPTIONS.maxBytes).toBe(MAX_PROJECT_BYTES);
  });
  it('refuses a file above the limit without reading it', async () => {
    const u = upload('huge.json', MAX_PROJECT_BYTES + 1, '{}');
    expect(await readUpload(u.file)).toEqual({ ok: false, canceled: false, message: `Could not open "huge.json": it is ${MAX_PROJECT_BYTES + 1} bytes, more than the ${MAX_PROJECT_BYTES} bytes a project may have.` });
    expect(u.calls.text).toBe(0);
  });
  it('reads a file at the limit', async () => {
    const u = upload('p.json', MAX_PROJECT_BYTES, '{"a":1}');
    expect(await readUpload(u.file)).toEqual({ ok: true, path: 'p.json', text: '{"a":1}', readOnly: false });
    expect(u.calls.text).toBe(1);
  });
  it('a read that fails says so', async () => {
    const file = { name: 'x.json', size: 3, text: () => Promise.reject(new Error('gone')) };
    expect(await readUpload(file)).toEqual({ ok: false, canceled: false, message: 'Could not read x.json.' });
  });
});
