// What the window may load: its own page, nothing else. Links, redirects, drag-and-drop and
// window.open to anywhere else are refused; there is no second window.

/**
 * True when `url` is the app's own page `appUrl` (the built index.html under the app's scheme or
 * as a file: URL, or the development server root). Query and hash are ignored; anything else is not the app.
 */
export function isAppPage(url: string, appUrl: string): boolean {
  let u: URL;
  let a: URL;
  try {
    u = new URL(url);
    a = new URL(appUrl);
  } catch {
    return false;
  }
  if (u.protocol !== a.protocol) return false;
  if (u.username || u.password) return false;
  if (a.protocol === 'file:') return u.host === a.host && decodeURIComponent(u.pathname) === decodeURIComponent(a.pathname);
  // the app's own scheme (app://torquewise/index.html): same host, the page itself
  if (a.protocol === 'app:') return u.host === a.host && u.port === '' && (u.pathname === a.pathname || u.pathname === '/');
  if (a.protocol === 'http:' || a.protocol === 'https:') {
    if (u.origin !== a.origin) return false;
    const p = u.pathname;
    return p === a.pathname || p === '/' || p === '/index.html';
  }
  return false;
}

export type NavigationDecision = 'allow' | 'deny';

/** For will-navigate / will-redirect / will-frame-navigate: only a reload of the app page. */
export function navigationDecision(url: string, appUrl: string): NavigationDecision {
  return isAppPage(url, appUrl) ? 'allow' : 'deny';
}

/** For setWindowOpenHandler: never a new window (target=_blank, window.open, middle click). */
export function windowOpenDecision(_url: string): { action: 'deny' } {
  return { action: 'deny' };
}

/** Permissions the page may get (session.setPermissionRequestHandler): none. */
export function permissionDecision(_permission: string): boolean {
  return false;
}

/** A development server URL is used only when it is http(s) on this machine's loopback. */
export function isLoopbackDevServer(url: string): boolean {
  try {
    const u = new URL(url);
    return (u.protocol === 'http:' || u.protocol === 'https:') && ['localhost', '127.0.0.1', '[::1]'].includes(u.hostname) && !u.username && !u.password;
  } catch {
    return false;
  }
}
