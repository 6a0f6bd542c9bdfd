import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { atomicWrite } from '../src/node/atomic-write';
import { faultyFs, runSaveFaultScenarios, SAVE_FAULTS } from '../src/node/save-faults';

let dir: string;
beforeEach(() => {
  dir = mkdtempSync(join(tmpdir(), 'tw-faults-'));
});
afterEach(() => rmSync(dir, { recursive: true, force: true }));

describe('save fault scenarios', () => {
  it('every scenario keeps the old file, tells the user and leaves nothing behind', async () => {
    const r = await runSaveFaultScenarios(dir);
    expect(r.run).toBe(SAVE_FAULTS.length);
    expect(r.run).toBe(18);
    expect(r.outcomes.filter((o) => !o.survived)).toEqual([]);
    expect(r.survived).toBe(18);
    const full = r.outcomes.find((o) => o.fault.step === 'write' && o.fault.code === 'ENOSPC')!;
    expect(full.message).toBe('Could not save "project.json": the disk is full (while writing). The file on disk is unchanged.');
  });

  it('the same checks fail a careless save that truncates the file before writing', async () => {
    const careless: typeof atomicWrite = async (target, data, options) => {
      writeFileSync(target, '');
      return atomicWrite(target, data, options);
    };
    const r = await runSaveFaultScenarios(dir, SAVE_FAULTS, careless);
    expect(r.run).toBe(18);
    expect(r.survived).toBe(0);
    expect(r.outcomes.every((o) => !o.oldFileIntact)).toBe(true);
  });

  it('the injected write failure really writes part of the temporary first', async () => {
    const target = join(dir, 'p.json');
    writeFileSync(target, 'old');
    const seen: string[] = [];
    const fs = faultyFs({ step: 'write', code: 'ENOSPC' });
    const spy = { ...fs, unlink: async (p: string) => { seen.push(readFileSync(p, 'utf8')); return fs.unlink(p); } };
    const r = await atomicWrite(target, 'abcdefgh', { fs: spy });
    expect(r.ok).toBe(false);
    expect(seen).toEqual(['abcd']);
    expect(readdirSync(dir)).toEqual(['p.json']);
    expect(readFileSync(target, 'utf8')).toBe('old');
  });
});
