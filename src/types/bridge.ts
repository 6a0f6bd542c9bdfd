// The typed surface the preload script exposes to the renderer as `window.torquewise`.
// Types only: the preload implements it, the renderer consumes it, main serves its channels.

/** What an Export menu item produces; the renderer supplies the content, main writes it. */
export type ExportKind = 'envelope-csv' | 'traces-csv' | 'plot-png' | 'plot-svg' | 'datasheet' | 'efficiency-csv' | 'duty-cycle-csv' | 'switching-csv' | 'current-table-header' | 'tolerance-csv';

/** Events the application menu sends to the renderer (the renderer decides what to do). */
export type MenuEventName =
  | 'file:new'
  | 'file:open'
  | 'file:open-recent'
  | 'file:save'
  | 'file:save-as'
  | 'export:envelope-csv'
  | 'export:traces-csv'
  | 'export:plot-png'
  | 'export:plot-svg'
  | 'export:datasheet';

/** A menu event; `path` is set for `file:open-recent` only. */
export interface MenuEvent {
  name: MenuEventName;
  path?: string;
}

/** The outcome of anything that did not work: a sentence for the user, never a stack. */
export interface Failure {
  ok: false;
  /** true when the user closed the dialog: show nothing. */
  canceled: boolean;
  message: string;
}

/** A project file that was read. `readOnly` is set when it comes from a newer format version. */
export interface OpenedProject {
  ok: true;
  path: string;
  text: string;
  readOnly: boolean;
  /** Set with readOnly: why the file cannot be saved back. */
  message?: string;
}
export type OpenResult = OpenedProject | Failure;

export interface Saved {
  ok: true;
  path: string;
  /** Set when the new content is in place but could not be made durable (the folder was not flushed): tell the user. */
  warning?: string;
}
export type SaveResult = Saved | Failure;

/** Unsaved edits found from a previous run, offered back on start. */
export interface RecoveryOffer {
  /** The project text as it was when last autosaved. */
  text: string;
  /** The file the edits belonged to, or null for a never-saved project. */
  documentPath: string | null;
  /** ISO 8601 time of the autosave. */
  savedAt: string;
}

export interface SaveRequest {
  /** A path the user picked in a dialog (or opened) during this session. */
  path: string;
  text: string;
}
export interface SaveAsRequest {
  text: string;
  /** File name proposed in the dialog, e.g. "traction.json". */
  suggestedName?: string;
}
export interface ExportRequest {
  kind: ExportKind;
  /** Text for CSV/SVG/datasheet (HTML), bytes for PNG. */
  data: string | Uint8Array;
  suggestedName?: string;
}
export interface RecoveryWriteRequest {
  text: string;
  documentPath: string | null;
}

export interface TorquewiseBridge {
  /** Open dialog, then read and check the chosen project. */
  open(): Promise<OpenResult>;
  /** Open one of the entries of `recent()`; any other path is refused. */
  openRecent(path: string): Promise<OpenResult>;
  /** The project given on the command line, or null: the renderer then loads its demo. */
  initialFile(): Promise<OpenResult | null>;
  /** Save to a path already granted in this session (picked in a dialog or opened). */
  save(request: SaveRequest): Promise<SaveResult>;
  /** Save dialog, then save there. */
  saveAs(request: SaveAsRequest): Promise<SaveResult>;
  /** Save dialog filtered by kind, then write the content. */
  export(request: ExportRequest): Promise<SaveResult>;
  /** Recently opened or saved project files, newest first. */
  recent(): Promise<string[]>;
  /** Subscribe to menu events; returns the unsubscribe function. */
  onMenu(listener: (event: MenuEvent) => void): () => void;
  recovery: {
    /** Unsaved edits from a previous run, or null. If they belong to a recent file, save() may write back to it. */
    check(): Promise<RecoveryOffer | null>;
    /** Autosave the current unsaved edits (call debounced while the project is dirty). */
    write(request: RecoveryWriteRequest): Promise<SaveResult>;
    /** Drop the recovery file (the user declined the offer, or discarded the edits). */
    discard(): Promise<void>;
  };
}

/** IPC channel names: the one table main and preload both use. */
export const CHANNELS = {
  open: 'tw:open',
  openRecent: 'tw:open-recent',
  initialFile: 'tw:initial-file',
  save: 'tw:save',
  saveAs: 'tw:save-as',
  export: 'tw:export',
  recent: 'tw:recent',
  recoveryCheck: 'tw:recovery-check',
  recoveryWrite: 'tw:recovery-write',
  recoveryDiscard: 'tw:recovery-discard',
  menu: 'tw:menu',
} as const;

export type BridgeChannel = (typeof CHANNELS)[keyof typeof CHANNELS];

declare global {
  interface Window {
    torquewise?: TorquewiseBridge;
  }
}
