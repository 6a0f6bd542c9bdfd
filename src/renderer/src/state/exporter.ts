// Exports that say how they went: each writes through the window's file bridge and tells the status
// line the file written, the reason it was not, or why the data could not be made. One exporter per
// app instance (made by App with its own status line), handed to the views by context.
import { createContext, useContext } from 'react';
import type { ExportKind } from '../../../types/bridge';
import type { FileBridge } from './file-bridge';

/** `done`: a success (a passing notice); otherwise a failure that stays until replaced */
export type Notifier = (message: string, done: boolean) => void;

export interface Exporter {
  /** Say something on the window's status line. */
  tell(message: string): void;
  /**
   * Export through the bridge and say how it went: the file written, the reason it was not (a
   * folder that refuses, a full disk), or why the image or text could not be made. A cancelled save
   * dialog says nothing. `make` builds the data; its failure is reported the same way.
   */
  exportAndTell(kind: ExportKind, make: () => string | Uint8Array | Promise<string | Uint8Array>, suggestedName: string): Promise<boolean>;
}

export function createExporter(bridge: FileBridge, notify: Notifier): Exporter {
  return {
    tell: (message) => notify(message, false),
    async exportAndTell(kind, make, suggestedName) {
      try {
        const data = await make();
        const r = await bridge.export(kind, data, suggestedName);
        if (r.ok) notify(r.warning ?? `Exported ${r.path.replace(/^.*[\\/]/, '')}.`, true);
        else if (!r.canceled) notify(r.message, false);
        return r.ok;
      } catch (e) {
        notify(`The export of ${suggestedName} failed: ${e instanceof Error ? e.message : String(e)}. Nothing was written.`, false);
        return false;
      }
    },
  };
}

export const ExporterContext = createContext<Exporter | null>(null);

/** The app's exporter (inside App's provider). */
export function useExporter(): Exporter {
  const e = useContext(ExporterContext);
  if (!e) throw new Error('useExporter outside the app: no exporter provided');
  return e;
}
