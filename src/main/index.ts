// Electron main: thin wiring of the plain modules beside it. All logic (window options, CSP,
// navigation policy, menu, argument checks, file handling) lives in those modules and is tested
// under Node; this file only connects them to Electron.
import { app, BrowserWindow, dialog, ipcMain, Menu, protocol, session, type IpcMainInvokeEvent, type MenuItemConstructorOptions } from 'electron';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { APP_PAGE_URL, APP_SCHEME, APP_SCHEME_PRIVILEGES, serveAppRequest } from './app-protocol';
import { projectPathFromArgv } from './argv';
import { changedOnDiskPrompt, overwriteAllowed } from './changed-on-disk';
import { cspHeader } from './csp';
import { FileService, type Dialogs } from './file-service';
import { CHANNELS, EXPORT_FORMATS } from './ipc';
import { menuTemplate, type MenuItemData } from './menu';
import { isAppPage, isLoopbackDevServer, navigationDecision, permissionDecision, windowOpenDecision } from './navigation';
import { PRELOAD_FROM_MAIN, RENDERER_FROM_MAIN } from './paths';
import { secondLaunch } from './single-instance';
import { windowOptions } from './window-options';
import { closeAllowed, unsavedPrompt } from './unsaved-prompt';

const here = fileURLToPath(new URL('.', import.meta.url));
// Only an unpackaged app (electron-vite dev) may load from the development server, and only on
// loopback; a packaged app ignores the variable and always loads its own files.
const devEnv = process.env['ELECTRON_RENDERER_URL'];
const devServerUrl = !app.isPackaged && devEnv && isLoopbackDevServer(devEnv) ? devEnv : undefined;
const dev = devServerUrl !== undefined;
const rendererFile = join(here, RENDERER_FROM_MAIN);
// The built renderer is served from app://torquewise/ (src/main/app-protocol.ts), never file://.
const rendererRoot = dirname(rendererFile);
const appUrl = devServerUrl ?? APP_PAGE_URL;
// before the app is ready: the scheme is standard and secure (an origin of its own)
protocol.registerSchemesAsPrivileged([{ scheme: APP_SCHEME, privileges: { ...APP_SCHEME_PRIVILEGES } }]);

let win: BrowserWindow | null = null;

const PROJECT_FILTER = { name: 'Torquewise project', extensions: ['json'] };

const dialogs: Dialogs = {
  async showOpen() {
    const opts = { properties: ['openFile' as const], filters: [PROJECT_FILTER] };
    const r = win ? await dialog.showOpenDialog(win, opts) : await dialog.showOpenDialog(opts);
    return r.canceled || r.filePaths.length === 0 ? null : r.filePaths[0]!;
  },
  async showSave({ kind, defaultName }) {
    const filter = kind === 'project' ? PROJECT_FILTER : { name: EXPORT_FORMATS[kind].filterName, extensions: [EXPORT_FORMATS[kind].extension] };
    const opts = { defaultPath: join(app.getPath('documents'), defaultName), filters: [filter] };
    const r = win ? await dialog.showSaveDialog(win, opts) : await dialog.showSaveDialog(opts);
    return r.canceled || !r.filePath ? null : r.filePath;
  },
  async confirmOverwrite(changed) {
    const prompt = changedOnDiskPrompt(changed);
    const r = win ? await dialog.showMessageBox(win, prompt) : await dialog.showMessageBox(prompt);
    return overwriteAllowed(r.response);
  },
};

// Opening checks the header, then the full project (src/core/project.ts loadProjectText).
const files = new FileService({
  userDataDir: app.getPath('userData'),
  dialogs,
  // npm runs `npm start` in the package folder; INIT_CWD is where the user typed it.
  initialPath: projectPathFromArgv(process.argv, { packaged: app.isPackaged, cwd: (!app.isPackaged && process.env['INIT_CWD']) || process.cwd() }),
  onRecentChanged: (recent) => buildMenu(recent),
});

function toElectron(items: MenuItemData[]): MenuItemConstructorOptions[] {
  return items.map((i) => {
    const o: MenuItemConstructorOptions = { id: i.id };
    if (i.label !== undefined) o.label = i.label;
    if (i.accelerator !== undefined) o.accelerator = i.accelerator;
    if (i.role !== undefined) o.role = i.role;
    if (i.type !== undefined) o.type = i.type;
    if (i.enabled !== undefined) o.enabled = i.enabled;
    if (i.submenu) o.submenu = toElectron(i.submenu);
    const event = i.event;
    if (event) o.click = () => win?.webContents.send(CHANNELS.menu, i.path === undefined ? { name: event } : { name: event, path: i.path });
    return o;
  });
}

function buildMenu(recent: string[]): void {
  Menu.setApplicationMenu(Menu.buildFromTemplate(toElectron(menuTemplate({ recent, platform: process.platform, dev }))));
}

/** Only the app's own page may call main. */
function fromApp(e: IpcMainInvokeEvent): boolean {
  const url = e.senderFrame?.url;
  return typeof url === 'string' && isAppPage(url, appUrl);
}

function handle(channel: string, fn: (arg: unknown) => Promise<unknown>): void {
  ipcMain.handle(channel, async (e, arg: unknown) => {
    if (!fromApp(e)) return { ok: false, canceled: false, message: 'Refused: the request did not come from the Torquewise page.' };
    try {
      return await fn(arg);
    } catch {
      return { ok: false, canceled: false, message: 'An unexpected error occurred; nothing was changed.' };
    }
  });
}

function wireIpc(): void {
  handle(CHANNELS.open, () => files.open());
  handle(CHANNELS.openRecent, (a) => files.openRecent(a));
  handle(CHANNELS.initialFile, () => files.initialFile());
  handle(CHANNELS.save, (a) => files.save(a));
  handle(CHANNELS.saveAs, (a) => files.saveAs(a));
  handle(CHANNELS.export, (a) => files.export(a));
  handle(CHANNELS.recent, () => files.recent());
  handle(CHANNELS.recoveryCheck, () => files.recoveryCheck());
  handle(CHANNELS.recoveryWrite, (a) => files.recoveryWrite(a));
  handle(CHANNELS.recoveryDiscard, () => files.recoveryDiscard());
}

function secureSession(): void {
  const csp = cspHeader(devServerUrl ? { devServerUrl } : {});
  // every response of the app scheme carries the CSP header; only files of the build output are served
  protocol.handle(APP_SCHEME, async (request) => {
    const r = await serveAppRequest({ url: request.url, method: request.method }, rendererRoot, csp);
    return new Response(r.body, { status: r.status, headers: r.headers });
  });
  session.defaultSession.webRequest.onHeadersReceived((details, callback) => {
    const headers = { ...details.responseHeaders };
    for (const k of Object.keys(headers)) if (k.toLowerCase() === 'content-security-policy') delete headers[k];
    headers['Content-Security-Policy'] = [csp];
    callback({ responseHeaders: headers });
  });
  session.defaultSession.setPermissionRequestHandler((_wc, permission, callback) => callback(permissionDecision(permission)));
  session.defaultSession.setPermissionCheckHandler((_wc, permission) => permissionDecision(permission));
}

app.on('web-contents-created', (_e, contents) => {
  const guard = (event: { url: string; preventDefault(): void }): void => {
    if (navigationDecision(event.url, appUrl) === 'deny') event.preventDefault();
  };
  contents.on('will-navigate', guard);
  contents.on('will-redirect', guard);
  contents.on('will-frame-navigate', guard);
  contents.on('will-attach-webview', (event) => event.preventDefault());
  contents.setWindowOpenHandler(({ url }) => windowOpenDecision(url));
});

function createWindow(): void {
  win = new BrowserWindow(windowOptions(join(here, PRELOAD_FROM_MAIN), { dev }));
  win.once('ready-to-show', () => win?.show());
  // the renderer's beforeunload handler refuses while edits are unsaved: ask before closing
  win.webContents.on('will-prevent-unload', (event) => {
    const title = win?.getTitle() ?? '';
    const answer = dialog.showMessageBoxSync(win!, unsavedPrompt(title.replace(/^Torquewise\s*[—-]\s*/, '').replace(/\s*•$/, '') || null));
    if (closeAllowed(answer)) event.preventDefault();
  });
  win.on('closed', () => {
    win = null;
  });
  if (devServerUrl) void win.loadURL(devServerUrl);
  else void win.loadURL(APP_PAGE_URL);
}

/** A second launch of the app: its file opens here, in this window (or a new one when none is open). */
async function onSecondLaunch(argv: string[], workingDirectory: string): Promise<void> {
  const action = secondLaunch(argv, workingDirectory, { packaged: app.isPackaged });
  if (action.open !== null) await files.launch(action.open);
  if (!win) {
    if (app.isReady()) createWindow();
    return;
  }
  if (action.open !== null) win.webContents.send(CHANNELS.menu, { name: 'file:open-recent', path: action.open });
  if (win.isMinimized()) win.restore();
  win.focus();
}

// One instance: a second launch hands its command line to this one and quits.
if (!app.requestSingleInstanceLock()) {
  app.quit();
} else {
  app.on('second-instance', (_event, argv, workingDirectory) => void onSecondLaunch(argv, workingDirectory));
  void app.whenReady().then(async () => {
    secureSession();
    wireIpc();
    buildMenu(await files.recent());
    createWindow();
    app.on('activate', () => {
      if (BrowserWindow.getAllWindows().length === 0) createWindow();
    });
  });
}

app.on('window-all-closed', () => {
  if (process.platform !== 'darwin') app.quit();
});
