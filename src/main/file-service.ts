// What each IPC handler does, without Electron: dialogs come in as functions, the file system as
// a layer, so the whole flow (validate, check the grant, save atomically, update recent files,
// drop the recovery file) is tested under Node. Every handler returns a result; none throws.
import { atomicWrite } from '../node/atomic-write';
import { nodeFs, type FsLayer } from '../node/fs-layer';
import { openProjectFile, saveProjectFile, type ProjectChecker } from '../node/project-file';
import { addRecent, readRecent, removeRecent } from '../node/recent-files';
import { clearRecovery, readRecovery, writeRecovery } from '../node/recovery';
import type { ExportKind, Failure, OpenResult, RecoveryOffer, SaveResult } from '../types/bridge';
import { checkExportRequest, checkPath, checkRecoveryWrite, checkSaveAsRequest, checkSaveRequest, EXPORT_FORMATS } from './ipc';
import { changedOnDisk, keptMessage, type ChangedOnDisk, type KnownVersion } from './changed-on-disk';
import { PathGrants } from './path-grants';

export interface SaveDialogRequest {
  /** 'project' or an export kind: decides the filter. */
  kind: 'project' | ExportKind;
  defaultName: string;
}

export interface Dialogs {
  /** The project file the user picked, or null when canceled. */
  showOpen(): Promise<string | null>;
  /** The path the user picked to save to, or null when canceled. */
  showSave(request: SaveDialogRequest): Promise<string | null>;
  /**
   * The file changed on disk since it was opened or saved here: may Save replace it? (main asks
   * with changedOnDiskPrompt). Without it such a save is refused.
   */
  confirmOverwrite?(changed: ChangedOnDisk): Promise<boolean>;
}

export interface FileServiceDeps {
  userDataDir: string;
  dialogs: Dialogs;
  /** The project named on the command line, or null. */
  initialPath: string | null;
  fs?: FsLayer;
  platform?: string;
  check?: ProjectChecker;
  /** Called after the recent list changed (main rebuilds the menu). */
  onRecentChanged?: (files: string[]) => void;
  /** The clock (when a file was opened or saved here). Default: () => new Date(). */
  now?: () => Date;
}

const refused = (message: string): Failure => ({ ok: false, canceled: false, message });
const canceled: Failure = { ok: false, canceled: true, message: 'Canceled.' };

export class FileService {
  readonly grants: PathGrants;
  private readonly fs: FsLayer;
  /** The document whose recovery file was offered at start (dropped when the user declines it). */
  private offered: { documentPath: string | null } | null = null;
  /** A file named by a second launch of the app, handed to the window as its next file. */
  private launched: string | null = null;
  /** Per file, the version this session last read or wrote: Save compares the disk against it. */
  private readonly known = new Map<string, KnownVersion>();

  constructor(private readonly deps: FileServiceDeps) {
    this.fs = deps.fs ?? nodeFs;
    this.grants = new PathGrants(deps.platform);
  }

  private async remember(path: string): Promise<void> {
    const files = await addRecent(this.deps.userDataDir, path, { fs: this.fs });
    this.deps.onRecentChanged?.(files);
  }

  private async openAt(path: string): Promise<OpenResult> {
    const r = await openProjectFile(path, { fs: this.fs, check: this.deps.check });
    if (r.ok) {
      if (!r.readOnly) this.grants.grant(path);
      this.known.set(path, { text: r.text, at: this.now(), how: 'opened' });
      // the window moved on to another document: a later discard must not drop the offered edits
      this.offered = null;
      await this.remember(path);
    }
    return r;
  }

  private now(): Date {
    return (this.deps.now ?? (() => new Date()))();
  }

  /** Writes the project and records what was written, so the next Save knows its own version. */
  private async write(path: string, text: string, saveAs: boolean): Promise<SaveResult> {
    const r = await saveProjectFile(path, text, { fs: this.fs, platform: this.deps.platform });
    if (r.ok) {
      this.known.set(path, { text: text.endsWith('\n') ? text : `${text}\n`, at: this.now(), how: 'saved' });
      await this.afterCleanSave(r.path, saveAs);
    }
    return r;
  }

  async open(): Promise<OpenResult> {
    const path = await this.deps.dialogs.showOpen();
    if (path === null) return canceled;
    return this.openAt(path);
  }

  async openRecent(arg: unknown): Promise<OpenResult> {
    const p = checkPath(arg, 'openRecent.path');
    if (!p.ok) return refused(`Not opened: ${p.message}.`);
    const list = await readRecent(this.deps.userDataDir, { fs: this.fs });
    if (!list.includes(p.value)) return refused('Not opened: that file is not in the recent list.');
    if (p.value === this.launched) this.launched = null;
    const r = await this.openAt(p.value);
    if (!r.ok && / does not exist\.$/.test(r.message)) this.deps.onRecentChanged?.(await removeRecent(this.deps.userDataDir, p.value, { fs: this.fs }));
    return r;
  }

  async initialFile(): Promise<OpenResult | null> {
    // a window made for a second launch's file (no window was open) starts with that file
    const launched = this.launched;
    this.launched = null;
    const path = launched ?? this.deps.initialPath;
    if (path === null) return null;
    return this.openAt(path);
  }

  private async afterCleanSave(path: string, wasUntitled: boolean): Promise<void> {
    await clearRecovery(this.deps.userDataDir, path, { fs: this.fs });
    // Save As gives the window's never-saved project its file: its untitled autosave is done with
    if (wasUntitled) await clearRecovery(this.deps.userDataDir, null, { fs: this.fs });
    await this.remember(path);
  }

  async save(arg: unknown): Promise<SaveResult> {
    const req = checkSaveRequest(arg);
    if (!req.ok) return refused(`Not saved: ${req.message}.`);
    if (!this.grants.has(req.value.path)) return refused('Not saved: this file was not chosen in a dialog in this session. Use Save As… to pick where to save.');
    // another program or window changed the file since we read or wrote it: ask, never drop its edit
    const changed = await changedOnDisk(req.value.path, this.known.get(req.value.path), this.fs);
    if (changed && !(await this.deps.dialogs.confirmOverwrite?.(changed))) return refused(keptMessage(changed));
    return this.write(req.value.path, req.value.text, false);
  }

  async saveAs(arg: unknown): Promise<SaveResult> {
    const req = checkSaveAsRequest(arg);
    if (!req.ok) return refused(`Not saved: ${req.message}.`);
    const path = await this.deps.dialogs.showSave({ kind: 'project', defaultName: req.value.suggestedName ?? 'project.json' });
    if (path === null) return canceled;
    // the save dialog itself asked before replacing an existing file
    this.grants.grant(path);
    return this.write(path, req.value.text, true);
  }

  async export(arg: unknown): Promise<SaveResult> {
    const req = checkExportRequest(arg);
    if (!req.ok) return refused(`Not exported: ${req.message}.`);
    const fmt = EXPORT_FORMATS[req.value.kind];
    const path = await this.deps.dialogs.showSave({ kind: req.value.kind, defaultName: req.value.suggestedName ?? fmt.defaultName });
    if (path === null) return canceled;
    this.grants.grant(path);
    const r = await atomicWrite(path, req.value.data, { fs: this.fs, platform: this.deps.platform });
    if (!r.ok) return refused(r.message);
    return r.warning ? { ok: true, path, warning: r.warning } : { ok: true, path };
  }

  recent(): Promise<string[]> {
    return readRecent(this.deps.userDataDir, { fs: this.fs });
  }

  /**
   * The unsaved edits of an earlier run. When they belong to a file of the recent list (a path
   * the user picked in a dialog before), Save may write back to it, as after Open Recent.
   */
  async recoveryCheck(): Promise<RecoveryOffer | null> {
    const offer = await readRecovery(this.deps.userDataDir, { fs: this.fs });
    this.offered = offer ? { documentPath: offer.documentPath } : null;
    if (offer?.documentPath && (await readRecent(this.deps.userDataDir, { fs: this.fs })).includes(offer.documentPath)) {
      this.grants.grant(offer.documentPath);
      // the edits are from the autosave's time: a file changed after it is asked about on Save
      if (!this.known.has(offer.documentPath)) this.known.set(offer.documentPath, { text: null, at: new Date(offer.savedAt), how: 'autosaved' });
    }
    return offer;
  }

  async recoveryWrite(arg: unknown): Promise<SaveResult> {
    const req = checkRecoveryWrite(arg);
    if (!req.ok) return refused(`Autosave refused: ${req.message}.`);
    return writeRecovery(this.deps.userDataDir, req.value.text, req.value.documentPath, { fs: this.fs });
  }

  /** The offered edits were declined (or saved): drop that document's recovery file, no other. */
  async recoveryDiscard(): Promise<void> {
    if (!this.offered) return;
    await clearRecovery(this.deps.userDataDir, this.offered.documentPath, { fs: this.fs });
    this.offered = null;
  }

  /**
   * A second launch of the app named this file (single-instance lock: it opens here). It joins the
   * recent list, so the window may open it as it opens a recent file.
   */
  async launch(path: string): Promise<void> {
    this.launched = path;
    await this.remember(path);
  }
}
