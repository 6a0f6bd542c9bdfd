// The one place that knows where files come from and go to: the Electron preload bridge
// (window.torquewise) when present, otherwise browser upload/download. Everything else in the
// renderer calls this module and takes the same code path in both.
import { MAX_PROJECT_BYTES } from '../../../core/project/schema';
import { webRecovery } from './web-recovery';
import type {
  ExportKind,
  MenuEvent,
  OpenResult,
  RecoveryOffer,
  SaveResult,
  TorquewiseBridge,
} from '../../../types/bridge';

export interface FileBridge {
  readonly kind: 'electron' | 'browser';
  /** Let the user pick a project file and read it. */
  open(): Promise<OpenResult>;
  /** Open a file of the recent list (desktop; the menu, or a second launch of the app naming a file). */
  openRecent(path: string): Promise<OpenResult>;
  /** The project given at start (Electron command line), or null. */
  initialFile(): Promise<OpenResult | null>;
  /** Save to `path` when one was granted (opened or saved before), otherwise ask (Save As). */
  save(text: string, path: string | null, suggestedName: string): Promise<SaveResult>;
  saveAs(text: string, suggestedName: string): Promise<SaveResult>;
  export(kind: ExportKind, data: string | Uint8Array, suggestedName: string): Promise<SaveResult>;
  onMenu(listener: (event: MenuEvent) => void): () => void;
  recoveryCheck(): Promise<RecoveryOffer | null>;
  recoveryWrite(text: string, documentPath: string | null): Promise<void>;
  recoveryDiscard(): Promise<void>;
}

const MIME: Record<ExportKind, string> = {
  'envelope-csv': 'text/csv',
  'traces-csv': 'text/csv',
  'plot-png': 'image/png',
  'plot-svg': 'image/svg+xml',
  datasheet: 'text/html',
  'efficiency-csv': 'text/csv',
  'duty-cycle-csv': 'text/csv',
  'switching-csv': 'text/csv',
  'current-table-header': 'text/x-c',
  'tolerance-csv': 'text/csv',
};

function download(data: string | Uint8Array, name: string, mime: string): void {
  const part: BlobPart = typeof data === 'string' ? data : new Uint8Array(data);
  const url = URL.createObjectURL(new Blob([part], { type: mime }));
  const a = document.createElement('a');
  a.href = url;
  a.download = name;
  a.style.display = 'none';
  document.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}

/** What readUpload needs of a picked File. */
export interface UploadLike {
  readonly name: string;
  readonly size: number;
  text(): Promise<string>;
}

/**
 * A picked file's text, or a refusal. Its size is checked first, against the limit the desktop
 * app applies (MAX_PROJECT_BYTES): a larger file is never read, so it cannot stall or crash the tab.
 */
export async function readUpload(file: UploadLike, maxBytes: number = MAX_PROJECT_BYTES): Promise<OpenResult> {
  if (!(file.size <= maxBytes)) {
    return { ok: false, canceled: false, message: `Could not open "${file.name}": it is ${file.size} bytes, more than the ${maxBytes} bytes a project may have.` };
  }
  try {
    return { ok: true, path: file.name, text: await file.text(), readOnly: false };
  } catch {
    return { ok: false, canceled: false, message: `Could not read ${file.name}.` };
  }
}

function pickFile(): Promise<OpenResult> {
  return new Promise((resolve) => {
    const input = document.createElement('input');
    input.type = 'file';
    input.accept = '.json,application/json';
    input.style.display = 'none';
    let settled = false;
    const finish = (r: OpenResult) => {
      if (settled) return;
      settled = true;
      input.remove();
      resolve(r);
    };
    input.addEventListener('change', () => {
      const file = input.files?.[0];
      if (!file) return finish({ ok: false, canceled: true, message: '' });
      void readUpload(file).then(finish);
    });
    input.addEventListener('cancel', () => finish({ ok: false, canceled: true, message: '' }));
    document.body.appendChild(input);
    input.click();
  });
}

function browserBridge(): FileBridge {
  return {
    kind: 'browser',
    open: pickFile,
    openRecent: async () => ({ ok: false, canceled: false, message: 'Recent files are opened in the desktop app only.' }),
    initialFile: async () => null,
    async save(text, _path, suggestedName) {
      download(text, suggestedName, 'application/json');
      return { ok: true, path: suggestedName };
    },
    async saveAs(text, suggestedName) {
      download(text, suggestedName, 'application/json');
      return { ok: true, path: suggestedName };
    },
    async export(kind, data, suggestedName) {
      download(data, suggestedName, MIME[kind]);
      return { ok: true, path: suggestedName };
    },
    onMenu: () => () => {},
    recoveryCheck: async () => browserRecovery.check(),
    recoveryWrite: async (text, documentPath) => browserRecovery.write(text, documentPath),
    recoveryDiscard: async () => browserRecovery.discard(),
  };
}

/** Recovery of unsaved edits in a plain browser, in the page's local storage (see web-recovery.ts). */
export const browserRecovery = webRecovery(() => globalThis.localStorage);

function electronBridge(b: TorquewiseBridge): FileBridge {
  return {
    kind: 'electron',
    open: () => b.open(),
    openRecent: (path) => b.openRecent(path),
    initialFile: () => b.initialFile(),
    save: (text, path, suggestedName) => (path ? b.save({ path, text }) : b.saveAs({ text, suggestedName })),
    saveAs: (text, suggestedName) => b.saveAs({ text, suggestedName }),
    export: (kind, data, suggestedName) => b.export({ kind, data, suggestedName }),
    onMenu: (listener) => b.onMenu(listener),
    recoveryCheck: () => b.recovery.check(),
    recoveryWrite: async (text, documentPath) => {
      await b.recovery.write({ text, documentPath });
    },
    recoveryDiscard: () => b.recovery.discard(),
  };
}

/** A bridge for this window: Electron's when the preload exposed it, the browser's otherwise (the app makes one and keeps it). */
export function createFileBridge(): FileBridge {
  const b = typeof window !== 'undefined' ? window.torquewise : undefined;
  return b ? electronBridge(b) : browserBridge();
}

/** PNG data URL (from plotly's image API) to bytes. */
export function dataUrlToBytes(url: string): Uint8Array {
  const b64 = url.slice(url.indexOf(',') + 1);
  const bin = atob(b64);
  const out = new Uint8Array(bin.length);
  for (let i = 0; i < bin.length; i++) out[i] = bin.charCodeAt(i);
  return out;
}

/** SVG data URL to text (plotly returns it URI-encoded). */
export function svgDataUrlToText(url: string): string {
  const comma = url.indexOf(',');
  const head = url.slice(0, comma);
  const body = url.slice(comma + 1);
  return head.includes('base64') ? atob(body) : decodeURIComponent(body);
}
