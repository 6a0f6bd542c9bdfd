import { describe, expect, it } from 'vitest';
import { flattenMenu, menuTemplate, recentLabel } from '../src/main/menu';

describe('application menu as data', () => {
  const linux = menuTemplate({ recent: ['/p/traction.json', '/q/servo.json'], platform: 'linux' });
  const file = linux.find((m) => m.id === 'file')!;
  it('File holds New, Open, Open Recent, Save, Save As, Export, Exit in that order', () => {
    expect(file.submenu!.filter((i) => i.type !== 'separator').map((i) => i.id)).toEqual([
      'file.new', 'file.open', 'file.recent', 'file.save', 'file.save-as', 'file.export', 'file.quit',
    ]);
  });
  it('each project item names the renderer event it sends, with its shortcut', () => {
    const byId = Object.fromEntries(flattenMenu(linux).map((i) => [i.id, i]));
    expect([byId['file.new']!.event, byId['file.new']!.accelerator]).toEqual(['file:new', 'CmdOrCtrl+N']);
    expect([byId['file.open']!.event, byId['file.open']!.accelerator]).toEqual(['file:open', 'CmdOrCtrl+O']);
    expect([byId['file.save']!.event, byId['file.save']!.accelerator]).toEqual(['file:save', 'CmdOrCtrl+S']);
    expect([byId['file.save-as']!.event, byId['file.save-as']!.accelerator]).toEqual(['file:save-as', 'CmdOrCtrl+Shift+S']);
    expect(byId['file.open']!.label).toBe('&Open…');
  });
  it('Export offers envelope CSV, traces CSV, plot PNG, plot SVG and the datasheet', () => {
    const exp = file.submenu!.find((i) => i.id === 'file.export')!;
    expect(exp.submenu!.map((i) => i.event)).toEqual(['export:envelope-csv', 'export:traces-csv', 'export:plot-png', 'export:plot-svg', 'export:datasheet']);
    expect(exp.submenu!.every((i) => i.label!.endsWith('…'))).toBe(true);
  });
  it('Open Recent lists the files newest first, each sending its path', () => {
    const rec = file.submenu!.find((i) => i.id === 'file.recent')!.submenu!;
    expect(rec.map((i) => [i.event, i.path])).toEqual([
      ['file:open-recent', '/p/traction.json'],
      ['file:open-recent', '/q/servo.json'],
    ]);
    expect(rec[0]!.label).toBe('traction.json — /p');
    expect(recentLabel('/a/b/c.json')).toBe('c.json — /a/b');
    const empty = menuTemplate({ recent: [], platform: 'linux' }).find((m) => m.id === 'file')!.submenu!.find((i) => i.id === 'file.recent')!.submenu!;
    expect(empty).toEqual([{ id: 'file.recent.none', label: 'No Recent Projects', enabled: false }]);
  });
  it('ids are unique; only File items send events; Edit uses the platform roles', () => {
    const all = flattenMenu(linux);
    expect(new Set(all.map((i) => i.id)).size).toBe(all.length);
    expect(all.filter((i) => i.event).every((i) => i.id.startsWith('file.'))).toBe(true);
    expect(linux.find((m) => m.id === 'edit')!.submenu!.map((i) => i.role).filter(Boolean)).toEqual(['undo', 'redo', 'cut', 'copy', 'paste', 'selectAll']);
  });
  it('macOS gets the app and window menus and Close instead of Exit; devtools only in development', () => {
    const mac = menuTemplate({ recent: [], platform: 'darwin' });
    expect(mac.map((m) => m.id)).toEqual(['app', 'file', 'edit', 'view', 'window']);
    expect(flattenMenu(mac).some((i) => i.role === 'close')).toBe(true);
    expect(flattenMenu(mac).some((i) => i.role === 'quit')).toBe(false);
    expect(flattenMenu(linux).some((i) => i.role === 'toggleDevTools' || i.role === 'reload')).toBe(false);
    expect(flattenMenu(menuTemplate({ recent: [], platform: 'linux', dev: true })).some((i) => i.role === 'toggleDevTools')).toBe(true);
  });
});
