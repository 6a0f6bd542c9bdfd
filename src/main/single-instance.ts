// One running app: the first launch holds Electron's single-instance lock, and a later launch
// hands its command line to it and quits (so two instances never share the recovery files or
// write one project over the other). What the running app does with that command line is here,
// without Electron, so it is tested under Node; index.ts only connects it.
import { projectPathFromArgv } from './argv';

export interface SecondLaunch {
  /** bring the window to the front (restore it when minimised) */
  focus: true;
  /** the project the second launch named, absolute, or null */
  open: string | null;
}

/**
 * From Electron's 'second-instance' event: the second launch's argv and working directory. A
 * relative path is taken from where that launch was started, not from where the first one was.
 */
export function secondLaunch(argv: readonly string[], workingDirectory: string, opts: { packaged: boolean }): SecondLaunch {
  return { focus: true, open: projectPathFromArgv(argv, { packaged: opts.packaged, cwd: workingDirectory }) };
}
