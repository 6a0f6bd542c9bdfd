// The application menu as data. Items that act on the project name the renderer event they send;
// the renderer decides (it knows about unsaved edits) and calls the bridge. Platform items use
// Electron roles. index.ts turns this into an Electron Menu.
import { basename, dirname } from 'node:path';
import type { MenuEventName } from '../types/bridge';

export type MenuRole =
  | 'appMenu' | 'quit' | 'close' | 'undo' | 'redo' | 'cut' | 'copy' | 'paste' | 'selectAll'
  | 'resetZoom' | 'zoomIn' | 'zoomOut' | 'togglefullscreen' | 'reload' | 'toggleDevTools' | 'windowMenu' | 'minimize';

export interface MenuItemData {
  id: string;
  label?: string;
  accelerator?: string;
  /** The renderer event a click sends. */
  event?: MenuEventName;
  /** For file:open-recent: the path sent with the event. */
  path?: string;
  role?: MenuRole;
  type?: 'separator';
  enabled?: boolean;
  submenu?: MenuItemData[];
}

export interface MenuOptions {
  recent: string[];
  platform?: string;
  dev?: boolean;
}

export const EXPORT_ITEMS: Array<{ event: MenuEventName; label: string }> = [
  { event: 'export:envelope-csv', label: 'Envelope as CSV…' },
  { event: 'export:traces-csv', label: 'Time Traces as CSV…' },
  { event: 'export:plot-png', label: 'Plot as PNG…' },
  { event: 'export:plot-svg', label: 'Plot as SVG…' },
  { event: 'export:datasheet', label: 'Datasheet…' },
];

const sep = (id: string): MenuItemData => ({ id, type: 'separator' });

export function recentLabel(path: string): string {
  return `${basename(path)} — ${dirname(path)}`;
}

export function menuTemplate(opts: MenuOptions): MenuItemData[] {
  const mac = (opts.platform ?? process.platform) === 'darwin';
  const recent: MenuItemData[] = opts.recent.length
    ? opts.recent.map((p, i) => ({ id: `file.recent.${i}`, label: recentLabel(p), event: 'file:open-recent', path: p }))
    : [{ id: 'file.recent.none', label: 'No Recent Projects', enabled: false }];
  const file: MenuItemData = {
    id: 'file',
    label: '&File',
    submenu: [
      { id: 'file.new', label: '&New Project', accelerator: 'CmdOrCtrl+N', event: 'file:new' },
      { id: 'file.open', label: '&Open…', accelerator: 'CmdOrCtrl+O', event: 'file:open' },
      { id: 'file.recent', label: 'Open &Recent', submenu: recent },
      sep('file.sep1'),
      { id: 'file.save', label: '&Save', accelerator: 'CmdOrCtrl+S', event: 'file:save' },
      { id: 'file.save-as', label: 'Save &As…', accelerator: 'CmdOrCtrl+Shift+S', event: 'file:save-as' },
      sep('file.sep2'),
      { id: 'file.export', label: '&Export', submenu: EXPORT_ITEMS.map((e) => ({ id: `file.${e.event.replace(':', '.')}`, label: e.label, event: e.event })) },
      sep('file.sep3'),
      mac ? { id: 'file.close', role: 'close' } : { id: 'file.quit', role: 'quit', label: 'E&xit' },
    ],
  };
  const edit: MenuItemData = {
    id: 'edit',
    label: '&Edit',
    submenu: [
      { id: 'edit.undo', role: 'undo' },
      { id: 'edit.redo', role: 'redo' },
      sep('edit.sep1'),
      { id: 'edit.cut', role: 'cut' },
      { id: 'edit.copy', role: 'copy' },
      { id: 'edit.paste', role: 'paste' },
      { id: 'edit.select-all', role: 'selectAll' },
    ],
  };
  const view: MenuItemData = {
    id: 'view',
    label: '&View',
    submenu: [
      { id: 'view.reset-zoom', role: 'resetZoom' },
      { id: 'view.zoom-in', role: 'zoomIn' },
      { id: 'view.zoom-out', role: 'zoomOut' },
      sep('view.sep1'),
      { id: 'view.fullscreen', role: 'togglefullscreen' },
      ...(opts.dev ? [sep('view.sep2'), { id: 'view.reload', role: 'reload' as const }, { id: 'view.devtools', role: 'toggleDevTools' as const }] : []),
    ],
  };
  const menus = [file, edit, view];
  if (mac) menus.unshift({ id: 'app', role: 'appMenu' });
  if (mac) menus.push({ id: 'window', role: 'windowMenu' });
  return menus;
}

/** Every item of a template, depth first (for tests and lookups). */
export function flattenMenu(items: MenuItemData[]): MenuItemData[] {
  return items.flatMap((i) => [i, ...flattenMenu(i.submenu ?? [])]);
}
