// Fault scenarios for saving: a file system that fails at one step of the atomic replace (as a
// read-only folder, a full disk or a failing device would), or "crashes" there (the call never
// returns and no cleanup runs). runSaveFaultScenarios drives each against a real file in a real
// folder and checks that the old file survived and the user was told; used by the tests and by
// the reliability figures.
import { readdir, readFile, writeFile } from 'node:fs/promises';
import { join } from 'node:path';
import { atomicWrite, type WriteStep } from './atomic-write';
import { nodeFs, type FileHandleLike, type FsLayer } from './fs-layer';

export interface Fault {
  step: WriteStep;
  /** errno code thrown at that step, or 'crash' for a call that never returns. */
  code: string | 'crash';
}

function errno(code: string, step: string): NodeJS.ErrnoException {
  return Object.assign(new Error(`${code}: simulated failure at ${step}`), { code });
}

const never = (): Promise<never> => new Promise<never>(() => undefined);

/** `base` with `fault` injected into the save of a temporary file (folder handles are left alone). */
export function faultyFs(fault: Fault, base: FsLayer = nodeFs): FsLayer {
  const hit = (step: WriteStep): Promise<never> | null => {
    if (fault.step !== step) return null;
    return fault.code === 'crash' ? never() : Promise.reject(errno(fault.code, step));
  };
  const wrap = (h: FileHandleLike): FileHandleLike => ({
    writeFile: async (d) => {
      if (fault.step === 'write' && fault.code !== 'crash') {
        await h.writeFile(typeof d === 'string' ? d.slice(0, Math.floor(d.length / 2)) : d.subarray(0, d.length >> 1));
      }
      return hit('write') ?? h.writeFile(d);
    },
    sync: () => hit('fsync') ?? h.sync(),
    close: async () => {
      if (fault.step === 'close' && fault.code === 'crash') return never();
      await h.close();
      return hit('close') ?? undefined;
    },
    chmod: (m) => h.chmod(m),
    chown: (u, g) => h.chown(u, g),
  });
  return {
    ...base,
    open: async (p, flags, mode) => {
      if (flags === 'r') return base.open(p, flags, mode);
      if (fault.step === 'open' && fault.code === 'crash') {
        await (await base.open(p, flags, mode)).close(); // the empty temporary exists, then the process dies
        return never();
      }
      return hit('open') ?? wrap(await base.open(p, flags, mode));
    },
    rename: (a, b) => hit('rename') ?? base.rename(a, b),
  };
}

export const SAVE_FAULTS: readonly Fault[] = [
  { step: 'open', code: 'EACCES' }, // a folder the user may not write
  { step: 'open', code: 'EROFS' }, // a read-only file system
  { step: 'open', code: 'ENOSPC' },
  { step: 'write', code: 'ENOSPC' }, // a full disk, after a partial write
  { step: 'write', code: 'EDQUOT' },
  { step: 'write', code: 'EFBIG' }, // a file-size limit (ulimit -f), after a partial write
  { step: 'write', code: 'EIO' },
  { step: 'fsync', code: 'EIO' },
  { step: 'fsync', code: 'ENOSPC' },
  { step: 'close', code: 'EIO' },
  { step: 'rename', code: 'EPERM' },
  { step: 'rename', code: 'EACCES' },
  { step: 'rename', code: 'EXDEV' },
  { step: 'open', code: 'crash' },
  { step: 'write', code: 'crash' },
  { step: 'fsync', code: 'crash' },
  { step: 'close', code: 'crash' },
  { step: 'rename', code: 'crash' }, // the classic: temporary complete, rename not done
];

export interface FaultOutcome {
  fault: Fault;
  /** the old file has its old bytes */
  oldFileIntact: boolean;
  /** a failed save said so in a sentence (for a crash: nothing to tell, the process is gone) */
  userTold: boolean;
  /** no temporary left after the failure, or (crash) after the next clean save */
  noLeftovers: boolean;
  message: string | null;
  survived: boolean;
}

const OLD = '{"format":"torquewise-project","version":1,"note":"the good file"}\n';
const NEW = `{"format":"torquewise-project","version":1,"note":"${'x'.repeat(4096)}"}\n`;

async function settle(dir: string, names: number, rounds = 100): Promise<void> {
  for (let i = 0; i < rounds && (await readdir(dir)).length < names; i++) await new Promise((r) => setTimeout(r, 5));
}

/**
 * Runs every fault in `faults` in its own subfolder of `dir` (which must exist and be empty)
 * against `save` (the atomic replace by default; a test passes a careless writer to show the
 * checks can fail).
 */
export async function runSaveFaultScenarios(dir: string, faults: readonly Fault[] = SAVE_FAULTS, save: typeof atomicWrite = atomicWrite): Promise<{ run: number; survived: number; outcomes: FaultOutcome[] }> {
  const outcomes: FaultOutcome[] = [];
  for (const [i, fault] of faults.entries()) {
    const sub = join(dir, `case-${i}`);
    await nodeFs.mkdir(sub);
    const target = join(sub, 'project.json');
    await writeFile(target, OLD);
    let message: string | null = null;
    let userTold: boolean;
    if (fault.code === 'crash') {
      void save(target, NEW, { fs: faultyFs(fault) }).catch(() => undefined);
      await settle(sub, 2);
      await new Promise((r) => setTimeout(r, 20));
      userTold = true;
    } else {
      const r = await save(target, NEW, { fs: faultyFs(fault) });
      message = r.ok ? null : r.message;
      userTold = !r.ok && r.step === fault.step && /^Could not save "project\.json": .+\. The file on disk is unchanged\.$/.test(r.message);
    }
    const oldFileIntact = (await readFile(target, 'utf8')) === OLD;
    let noLeftovers: boolean;
    if (fault.code === 'crash') {
      // the next save, by a healthy process: the crashed process is gone, so its temporary is stale
      const next = await atomicWrite(target, OLD, { isProcessAlive: () => false });
      noLeftovers = next.ok && (await readdir(sub)).length === 1 && (await readFile(target, 'utf8')) === OLD;
    } else {
      noLeftovers = (await readdir(sub)).length === 1;
    }
    outcomes.push({ fault, oldFileIntact, userTold, noLeftovers, message, survived: oldFileIntact && userTold && noLeftovers });
  }
  return { run: outcomes.length, survived: outcomes.filter((o) => o.survived).length, outcomes };
}
