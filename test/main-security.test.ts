// The Electron security settings as data: window options, Content-Security-Policy, navigation,
// new windows and permissions. Expected values follow the Electron security checklist
// (common practice (no source) beyond the Electron documentation's checklist itself).
import { describe, expect, it } from 'vitest';
import { CSP_DIRECTIVES, cspHeader, cspMeta, parseCsp, serializeCsp } from '../src/main/csp';
import { isAppPage, isLoopbackDevServer, navigationDecision, permissionDecision, windowOpenDecision } from '../src/main/navigation';
import { windowOptions } from '../src/main/window-options';

describe('window options', () => {
  const o = windowOptions('/app/out/preload/index.cjs');
  it('isolate and sandbox the renderer, without Node', () => {
    expect(o.webPreferences).toEqual({
      preload: '/app/out/preload/index.cjs',
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
      devTools: false,
    });
  });
  it('never set the remote module or any other Node door', () => {
    const keys = Object.keys(o.webPreferences);
    expect(keys).not.toContain('enableRemoteModule');
    expect(JSON.stringify(o)).not.toMatch(/remote/i);
  });
  it('open one 1440x900 window, hidden until ready; devTools only in development', () => {
    expect([o.width, o.height, o.show, o.title]).toEqual([1440, 900, false, 'Torquewise']);
    expect(windowOptions('p', { dev: true }).webPreferences.devTools).toBe(true);
    expect(windowOptions('p', { dev: true }).webPreferences.sandbox).toBe(true);
  });
});

describe('Content-Security-Policy', () => {
  const header = parseCsp(cspHeader());
  it('allows only the app itself', () => {
    expect(header['default-src']).toEqual(["'self'"]);
    expect(header['script-src']).toEqual(["'self'"]);
    expect(header['style-src']).toEqual(["'self'", "'unsafe-inline'"]);
    expect(header['img-src']).toEqual(["'self'", 'data:', 'blob:']);
    expect(header['worker-src']).toEqual(["'self'", 'blob:']);
    expect(header['connect-src']).toEqual(["'self'"]);
    expect(header['object-src']).toEqual(["'none'"]);
    expect(header['base-uri']).toEqual(["'none'"]);
    expect(header['form-action']).toEqual(["'none'"]);
    expect(header['frame-ancestors']).toEqual(["'none'"]);
    expect(header['frame-src']).toEqual(["'none'"]);
  });
  it('names no remote origin, no wildcard, no eval and no inline script', () => {
    const s = cspHeader();
    expect(s).not.toMatch(/https?:|wss?:|\*/);
    expect(s).not.toContain('unsafe-eval');
    expect(header['script-src']).not.toContain("'unsafe-inline'");
  });
  it('round-trips through parse and serialize', () => {
    expect(parseCsp(serializeCsp(CSP_DIRECTIVES))).toEqual(CSP_DIRECTIVES);
    expect(cspHeader()).toBe(
      "default-src 'self'; script-src 'self'; style-src 'self' 'unsafe-inline'; img-src 'self' data: blob:; font-src 'self'; connect-src 'self'; worker-src 'self' blob:; frame-src 'none'; object-src 'none'; base-uri 'none'; form-action 'none'; frame-ancestors 'none'",
    );
  });
  it('the meta-tag form leaves out what a meta tag cannot carry, and nothing else', () => {
    const meta = parseCsp(cspMeta());
    expect(meta['frame-ancestors']).toBeUndefined();
    const { 'frame-ancestors': _fa, ...rest } = header;
    expect(meta).toEqual(rest);
  });
  it('in development adds only the dev server origin and its websocket', () => {
    const d = parseCsp(cspHeader({ devServerUrl: 'http://localhost:5173/' }));
    expect(d['script-src']).toEqual(["'self'", 'http://localhost:5173']);
    expect(d['connect-src']).toEqual(["'self'", 'http://localhost:5173', 'ws://localhost:5173']);
    expect(d['default-src']).toEqual(["'self'"]);
    expect(d['object-src']).toEqual(["'none'"]);
  });
});

describe('navigation and windows', () => {
  const fileApp = 'file:///opt/torquewise/out/renderer/index.html';
  const devApp = 'http://localhost:5173/';
  it('allow only the app page itself (reload, hash or query changes)', () => {
    expect(navigationDecision(fileApp, fileApp)).toBe('allow');
    expect(navigationDecision(`${fileApp}#/envelope`, fileApp)).toBe('allow');
    expect(navigationDecision(`${fileApp}?x=1`, fileApp)).toBe('allow');
    expect(navigationDecision('http://localhost:5173/index.html', devApp)).toBe('allow');
    expect(navigationDecision('http://localhost:5173/', devApp)).toBe('allow');
  });
  const denied: Array<[string, string]> = [
    ['https://example.com/', fileApp],
    ['file:///etc/passwd', fileApp],
    ['file:///opt/torquewise/out/renderer/other.html', fileApp],
    ['file://remotehost/opt/torquewise/out/renderer/index.html', fileApp],
    ['http://localhost:5174/', devApp],
    ['http://user:pw@localhost:5173/', devApp],
    ['http://localhost:5173/evil/page.html', devApp],
    ['https://localhost:5173/', devApp],
    ['javascript:alert(1)', fileApp],
    ['data:text/html,<script>1</script>', fileApp],
    ['not a url', fileApp],
    ['about:blank', fileApp],
  ];
  for (const [url, app] of denied) {
    it(`deny ${url}`, () => {
      expect(navigationDecision(url, app)).toBe('deny');
      expect(isAppPage(url, app)).toBe(false);
    });
  }
  it('never open a new window, whatever the URL', () => {
    for (const url of [fileApp, 'https://example.com', 'about:blank']) expect(windowOpenDecision(url)).toEqual({ action: 'deny' });
  });
  it('grant no permission', () => {
    for (const p of ['media', 'geolocation', 'notifications', 'openExternal', 'clipboard-read', 'fullscreen']) expect(permissionDecision(p)).toBe(false);
  });
});

describe('development server', () => {
  it('is used only on loopback over http(s)', () => {
    expect(isLoopbackDevServer('http://localhost:5173')).toBe(true);
    expect(isLoopbackDevServer('http://127.0.0.1:5173/')).toBe(true);
    expect(isLoopbackDevServer('http://[::1]:5173/')).toBe(true);
    expect(isLoopbackDevServer('https://example.com/')).toBe(false);
    expect(isLoopbackDevServer('http://localhost.example.com:5173/')).toBe(false);
    expect(isLoopbackDevServer('file:///etc/passwd')).toBe(false);
    expect(isLoopbackDevServer('')).toBe(false);
  });
});
