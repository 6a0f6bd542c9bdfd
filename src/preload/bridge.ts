// Builds the TorquewiseBridge over an ipcRenderer-like object. Kept apart from index.ts (the only
// preload file that imports electron) so it is tested under Node with a fake IPC.
import { CHANNELS, type Failure, type MenuEvent, type MenuEventName, type TorquewiseBridge } from '../types/bridge';
import { shapeError } from './validate';

export { CHANNELS };

const MENU_EVENTS: readonly MenuEventName[] = [
  'file:new', 'file:open', 'file:open-recent', 'file:save', 'file:save-as',
  'export:envelope-csv', 'export:traces-csv', 'export:plot-png', 'export:plot-svg', 'export:datasheet',
];

export interface IpcLike {
  invoke(channel: string, ...args: unknown[]): Promise<unknown>;
  on(channel: string, listener: (event: unknown, ...args: unknown[]) => void): unknown;
  removeListener(channel: string, listener: (event: unknown, ...args: unknown[]) => void): unknown;
}

const refuse = (message: string): Promise<Failure> => Promise.resolve({ ok: false, canceled: false, message });

export function createBridge(ipc: IpcLike): TorquewiseBridge {
  // Each wrapper sends exactly one argument (or none) and returns main's answer.
  const call = <T>(channel: string, arg?: unknown): Promise<T> =>
    (arg === undefined ? ipc.invoke(channel) : ipc.invoke(channel, arg)) as Promise<T>;
  const checked = <T>(name: Parameters<typeof shapeError>[0], channel: string, arg: unknown): Promise<T | Failure> => {
    const err = shapeError(name, arg);
    return err ? refuse(err) : call<T>(channel, arg);
  };
  return {
    open: () => call(CHANNELS.open),
    openRecent: (path) => checked('openRecent', CHANNELS.openRecent, path),
    initialFile: () => call(CHANNELS.initialFile),
    save: (request) => checked('save', CHANNELS.save, request),
    saveAs: (request) => checked('saveAs', CHANNELS.saveAs, request),
    export: (request) => checked('export', CHANNELS.export, request),
    recent: () => call(CHANNELS.recent),
    onMenu: (listener) => {
      if (typeof listener !== 'function') throw new TypeError('onMenu(listener): listener must be a function');
      // Pass on only a checked payload: the IPC event object (and its sender) never reaches the page.
      const wrapped = (_event: unknown, payload: unknown): void => {
        const p = payload as Partial<MenuEvent> | null;
        if (!p || typeof p.name !== 'string' || !MENU_EVENTS.includes(p.name)) return;
        const e: MenuEvent = { name: p.name };
        if (typeof p.path === 'string') e.path = p.path;
        listener(e);
      };
      ipc.on(CHANNELS.menu, wrapped);
      return () => {
        ipc.removeListener(CHANNELS.menu, wrapped);
      };
    },
    recovery: {
      check: () => call(CHANNELS.recoveryCheck),
      write: (request) => checked('recovery.write', CHANNELS.recoveryWrite, request),
      discard: () => call<void>(CHANNELS.recoveryDiscard).then(() => undefined),
    },
  };
}
