// End-to-end harness: build the renderer once into a temporary folder, serve it from a tiny
// static server on 127.0.0.1 (random port), and drive Debian's Chromium through playwright-core.
import { createServer, type Server } from 'node:http';
import { mkdtempSync, readFileSync, rmSync, statSync, mkdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { extname, join, normalize, resolve, sep } from 'node:path';
import type { AddressInfo } from 'node:net';
import { build } from 'vite';
import { chromium, type Browser, type Page } from 'playwright-core';

export const ROOT = resolve(__dirname, '..', '..');
export const SHOTS = join(ROOT, 'test-results');

export const CHROMIUM_ARGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  '--no-first-run',
];

const TYPES: Record<string, string> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.mjs': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.json': 'application/json',
  '.svg': 'image/svg+xml',
  '.png': 'image/png',
  '.woff2': 'font/woff2',
};

export async function buildRenderer(): Promise<string> {
  const outDir = mkdtempSync(join(tmpdir(), 'torquewise-e2e-'));
  // vitest sets NODE_ENV=test, and Vite would then bundle React's development build: test what ships
  const env = process.env.NODE_ENV;
  process.env.NODE_ENV = 'production';
  try {
    await build({
      configFile: join(ROOT, 'vite.web.config.ts'),
      root: join(ROOT, 'src', 'renderer'),
      mode: 'production',
      logLevel: 'warn',
      build: { outDir, emptyOutDir: true, minify: process.env.TW_E2E_NO_MINIFY ? false : undefined },
    });
  } finally {
    process.env.NODE_ENV = env;
  }
  return outDir;
}

export function serve(dir: string): Promise<{ server: Server; url: string }> {
  const base = resolve(dir);
  const server = createServer((req, res) => {
    const u = new URL(req.url ?? '/', 'http://127.0.0.1');
    let rel = decodeURIComponent(u.pathname);
    if (rel.endsWith('/')) rel += 'index.html';
    const file = normalize(join(base, rel));
    if (!file.startsWith(base + sep)) {
      res.writeHead(403).end();
      return;
    }
    try {
      if (!statSync(file).isFile()) throw new Error('not a file');
      res.writeHead(200, { 'content-type': TYPES[extname(file)] ?? 'application/octet-stream', 'cache-control': 'no-store' });
      res.end(readFileSync(file));
    } catch {
      res.writeHead(404).end('not found');
    }
  });
  return new Promise((ok) => {
    server.listen(0, '127.0.0.1', () => {
      const port = (server.address() as AddressInfo).port;
      ok({ server, url: `http://127.0.0.1:${port}/` });
    });
  });
}

export function launch(): Promise<Browser> {
  return chromium.launch({ executablePath: '/usr/bin/chromium', args: CHROMIUM_ARGS });
}

export function shotPath(name: string): string {
  mkdirSync(SHOTS, { recursive: true });
  return join(SHOTS, `${name}.png`);
}

export function cleanup(dir: string): void {
  rmSync(dir, { recursive: true, force: true });
}

/** A built renderer served on 127.0.0.1, a browser and one page on it at 1440 x 900, ready (envelope drawn). */
export interface AppSession {
  dir: string;
  server: Server;
  url: string;
  browser: Browser;
  page: Page;
  /** the page's errors (and, with `consoleErrors`, its console errors), for a test to assert empty */
  errors: string[];
}

export async function openApp(opts: { acceptDownloads?: boolean; consoleErrors?: boolean } = {}): Promise<AppSession> {
  const dir = await buildRenderer();
  const { server, url } = await serve(dir);
  const browser = await launch();
  const ctx = await browser.newContext({ viewport: { width: 1440, height: 900 }, ...(opts.acceptDownloads ? { acceptDownloads: true } : {}) });
  const page = await ctx.newPage();
  const errors: string[] = [];
  if (opts.consoleErrors) {
    page.on('console', (m) => {
      if (m.type() === 'error') errors.push(m.text());
    });
  }
  page.on('pageerror', (e) => errors.push(opts.consoleErrors ? `pageerror: ${e.message}` : e.message));
  await page.goto(url);
  await page.waitForSelector('[data-testid="envelope-plot"] .scatterlayer .trace');
  return { dir, server, url, browser, page, errors };
}

export async function closeApp(app: AppSession | undefined): Promise<void> {
  if (!app) return;
  await app.browser.close();
  app.server.close();
  cleanup(app.dir);
}
