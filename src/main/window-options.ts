// The one window's options as data. Security settings follow the Electron security checklist:
// isolated and sandboxed renderer without Node, web security on, no webview, no remote module
// (it no longer exists in Electron; the key is simply never set).

export interface SecureWebPreferences {
  preload: string;
  contextIsolation: true;
  sandbox: true;
  nodeIntegration: false;
  nodeIntegrationInWorker: false;
  nodeIntegrationInSubFrames: false;
  webSecurity: true;
  allowRunningInsecureContent: false;
  experimentalFeatures: false;
  webviewTag: false;
  navigateOnDragDrop: false;
  safeDialogs: true;
  spellcheck: false;
  devTools: boolean;
}

export interface WindowOptions {
  width: number;
  height: number;
  minWidth: number;
  minHeight: number;
  title: string;
  show: boolean;
  backgroundColor: string;
  webPreferences: SecureWebPreferences;
}

export const DEFAULT_WINDOW_SIZE = { width: 1440, height: 900, minWidth: 960, minHeight: 600 } as const;

/** Options for the main window. `devTools` is allowed only in development. */
export function windowOptions(preloadPath: string, opts: { dev?: boolean } = {}): WindowOptions {
  return {
    ...DEFAULT_WINDOW_SIZE,
    title: 'Torquewise',
    show: false, // shown on ready-to-show, so no blank frame flashes
    backgroundColor: '#f7f8fa',
    webPreferences: {
      preload: preloadPath,
      contextIsolation: true,
      sandbox: true,
      nodeIntegration: false,
      nodeIntegrationInWorker: false,
      nodeIntegrationInSubFrames: false,
      webSecurity: true,
      allowRunningInsecureContent: false,
      experimentalFeatures: false,
      webviewTag: false,
      navigateOnDragDrop: false,
      safeDialogs: true,
      spellcheck: false,
      devTools: opts.dev === true,
    },
  };
}
