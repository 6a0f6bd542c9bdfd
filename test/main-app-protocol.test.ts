// The renderer is served from app://torquewise/: every loaded path resolves inside the build
// output, every response carries the CSP header. Traversal cases follow the usual path-traversal
// checklist (common practice (no source)): dot segments, percent-encoded dots and slashes,
// backslashes, absolute and drive paths, NUL, another host.
import { mkdirSync, mkdtempSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, relative, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { APP_PAGE_URL, APP_SCHEME_PRIVILEGES, resolveAppPath, serveAppRequest } from '../src/main/app-protocol';
import { cspHeader } from '../src/main/csp';
import { isAppPage, navigationDecision } from '../src/main/navigation';

let base: string;
let root: string;
beforeAll(() => {
  base = mkdtempSync(join(tmpdir(), 'tw-app-scheme-'));
  root = join(base, 'renderer');
  mkdirSync(join(root, 'assets'), { recursive: true });
  writeFileSync(join(root, 'index.html'), '<!doctype html><title>t</title>');
  writeFileSync(join(root, 'assets', 'index-1.js'), 'export {}');
  writeFileSync(join(base, 'secret.txt'), 'outside');
  symlinkSync(join(base, 'secret.txt'), join(root, 'assets', 'link.txt'));
});
afterAll(() => rmSync(base, { recursive: true, force: true }));

describe('resolveAppPath', () => {
  it('maps the page and its assets into the build output', () => {
    expect(resolveAppPath(APP_PAGE_URL, root)).toEqual({ ok: true, path: join(root, 'index.html') });
    expect(resolveAppPath('app://torquewise/', root)).toEqual({ ok: true, path: join(root, 'index.html') });
    expect(resolveAppPath('app://torquewise/assets/index-1.js?v=2#x', root)).toEqual({ ok: true, path: join(root, 'assets', 'index-1.js') });
    expect(resolveAppPath('app://torquewise/assets/a%20b.js', root)).toEqual({ ok: true, path: join(root, 'assets', 'a b.js') });
  });
  const refused = [
    'app://torquewise/../../etc/passwd',
    'app://torquewise/assets/../../secret.txt',
    'app://torquewise/%2e%2e/%2e%2e/etc/passwd',
    'app://torquewise/%2E%2E%2Fsecret.txt',
    'app://torquewise/assets/..%2f..%2fsecret.txt',
    'app://torquewise/..%5csecret.txt',
    'app://torquewise/assets\\..\\..\\secret.txt',
    'app://torquewise//etc/passwd',
    'app://torquewise/%2fetc%2fpasswd',
    'app://torquewise/C:/Windows/win.ini',
    'app://torquewise/c%3a%5cwindows',
    'app://torquewise/index.html%00.js',
    'app://torquewise/./index.html',
    'app://torquewise/%',
    'app://other/index.html',
    'app://user@torquewise/index.html',
    'file:///etc/passwd',
    'https://torquewise/index.html',
  ];
  for (const url of refused) {
    it(`refuses ${url}`, () => {
      const r = resolveAppPath(url, root);
      expect(r.ok).toBe(false);
    });
  }
  it('whatever it accepts lies inside the build output', () => {
    const tries = ['a', 'a/b', '%2e', '...', 'a..b', '..a', 'x/%2E%2E%2Fy', 'assets/index-1.js', '%c0%ae%c0%ae/x'];
    for (const t of tries) {
      const r = resolveAppPath(`app://torquewise/${t}`, root);
      if (!r.ok) continue;
      const rel = relative(resolve(root), r.path);
      expect(rel.startsWith('..'), t).toBe(false);
      expect(r.path.startsWith(resolve(root)), t).toBe(true);
    }
  });
});

describe('serveAppRequest', () => {
  const csp = cspHeader();
  it('serves the page with its type and the CSP header', async () => {
    const r = await serveAppRequest({ url: APP_PAGE_URL, method: 'GET' }, root, csp);
    expect(r.status).toBe(200);
    expect(r.headers['content-type']).toBe('text/html; charset=utf-8');
    expect(r.headers['content-security-policy']).toBe(csp);
    expect(r.headers['x-content-type-options']).toBe('nosniff');
    expect(new TextDecoder().decode(r.body!)).toBe('<!doctype html><title>t</title>');
    const js = await serveAppRequest({ url: 'app://torquewise/assets/index-1.js', method: 'GET' }, root, csp);
    expect([js.status, js.headers['content-type']]).toEqual([200, 'text/javascript; charset=utf-8']);
  });
  it('refuses traversal, a link out of the build output, a folder, a missing file and other methods, always with the CSP header', async () => {
    const cases: Array<[string, string, number]> = [
      ['app://torquewise/../secret.txt', 'GET', 403],
      ['app://torquewise/%2e%2e/secret.txt', 'GET', 403],
      ['app://torquewise/assets/link.txt', 'GET', 403],
      ['app://torquewise/assets', 'GET', 404],
      ['app://torquewise/nope.js', 'GET', 404],
      [APP_PAGE_URL, 'POST', 405],
    ];
    for (const [url, method, status] of cases) {
      const r = await serveAppRequest({ url, method }, root, csp);
      expect([url, r.status, r.body]).toEqual([url, status, null]);
      expect(r.headers['content-security-policy']).toBe(csp);
    }
  });
});

describe('the app scheme as the page origin', () => {
  it('is a standard secure scheme with no CSP or CORS bypass', () => {
    expect(APP_SCHEME_PRIVILEGES).toMatchObject({ standard: true, secure: true, bypassCSP: false, corsEnabled: false, allowServiceWorkers: false });
  });
  it('navigation allows the page itself only', () => {
    expect(isAppPage(APP_PAGE_URL, APP_PAGE_URL)).toBe(true);
    expect(navigationDecision('app://torquewise/index.html#x', APP_PAGE_URL)).toBe('allow');
    expect(navigationDecision('app://torquewise/', APP_PAGE_URL)).toBe('allow');
    for (const u of ['app://torquewise/other.html', 'app://evil/index.html', 'app://torquewise:81/index.html', 'file:///opt/out/renderer/index.html', 'https://torquewise/index.html']) {
      expect(navigationDecision(u, APP_PAGE_URL), u).toBe('deny');
    }
  });
  it('main loads the page from the app scheme, never file://, and keeps the hardening', async () => {
    const { readFileSync } = await import('node:fs');
    const src = readFileSync(join(__dirname, '../src/main/index.ts'), 'utf8');
    expect(src).not.toMatch(/loadFile\(|pathToFileURL/);
    expect(src).toContain('win.loadURL(APP_PAGE_URL)');
    expect(src).toMatch(/protocol\.registerSchemesAsPrivileged\(\[\{ scheme: APP_SCHEME, privileges: \{ \.\.\.APP_SCHEME_PRIVILEGES \} \}\]\)/);
    expect(src).toContain('protocol.handle(APP_SCHEME');
    expect(src.indexOf('protocol.registerSchemesAsPrivileged')).toBeLessThan(src.indexOf('app.whenReady()'));
    for (const kept of ['setPermissionRequestHandler', 'setPermissionCheckHandler', "'will-navigate'", "'will-redirect'", "'will-frame-navigate'", "'will-attach-webview'", 'setWindowOpenHandler', 'onHeadersReceived']) expect(src).toContain(kept);
  });
});
