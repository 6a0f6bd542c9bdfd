// The renderer is served from a custom privileged scheme, app://torquewise/, instead of file://:
// the page gets a real origin (so 'self' in the Content-Security-Policy means the app's own
// files and nothing else on the disk), every response carries the CSP header, and only files
// inside the built renderer folder are ever served. URL -> file resolution and the response are
// plain logic here, tested under Node; index.ts registers the scheme and hands requests to it.
import { promises as fsp } from 'node:fs';
import { extname, isAbsolute, relative, resolve, sep } from 'node:path';

export const APP_SCHEME = 'app';
export const APP_HOST = 'torquewise';
/** The page main loads. */
export const APP_PAGE_URL = `${APP_SCHEME}://${APP_HOST}/index.html`;

/**
 * For protocol.registerSchemesAsPrivileged: a standard, secure scheme (an origin of its own,
 * treated like https), allowed to be fetched (the simulation worker's module); no CORS bypass,
 * no service workers.
 */
export const APP_SCHEME_PRIVILEGES = { standard: true, secure: true, supportFetchAPI: true, corsEnabled: false, bypassCSP: false, allowServiceWorkers: false, stream: false } as const;

export type AppPath = { ok: true; path: string } | { ok: false; status: 400 | 403 | 404; why: string };

const PREFIX = `${APP_SCHEME}://${APP_HOST}/`;

/**
 * The file of the build output `root` that `url` names, or a refusal. The raw text of the URL is
 * judged (not a parser's normalised form): any `.` or `..` segment, literal or percent-encoded, a
 * backslash, a NUL, an absolute or drive path, another host, or user info is refused, and the
 * resolved path must lie inside `root`.
 */
export function resolveAppPath(url: string, root: string): AppPath {
  if (typeof url !== 'string' || !url.toLowerCase().startsWith(PREFIX)) return { ok: false, status: 403, why: 'not the app origin' };
  let raw = url.slice(PREFIX.length);
  const cut = raw.search(/[?#]/);
  if (cut >= 0) raw = raw.slice(0, cut);
  let path: string;
  try {
    path = decodeURIComponent(raw);
  } catch {
    return { ok: false, status: 400, why: 'malformed percent-encoding' };
  }
  if (path === '') path = 'index.html';
  if (/[\\\0]/.test(path) || /[\\\0]/.test(raw)) return { ok: false, status: 403, why: 'backslash or NUL in the path' };
  if (path.startsWith('/') || /^[a-zA-Z]:/.test(path)) return { ok: false, status: 403, why: 'absolute path' };
  if (path.split('/').some((s) => s === '..' || s === '.' || s === '')) return { ok: false, status: 403, why: 'dot or empty segment' };
  const base = resolve(root);
  const file = resolve(base, path);
  const rel = relative(base, file);
  if (rel === '' || rel.startsWith('..') || isAbsolute(rel)) return { ok: false, status: 403, why: 'outside the build output' };
  return { ok: true, path: file };
}

const TYPES: Record<string, string> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.mjs': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.json': 'application/json',
  '.svg': 'image/svg+xml',
  '.png': 'image/png',
  '.ico': 'image/x-icon',
  '.woff2': 'font/woff2',
  '.wasm': 'application/wasm',
  '.map': 'application/json',
};

export interface AppResponse {
  status: number;
  headers: Record<string, string>;
  body: Uint8Array<ArrayBuffer> | null;
}

/**
 * The response to one request of the page: the file's bytes with its type and the CSP header, or
 * an empty refusal. Symbolic links are followed only when their target is inside the build output.
 */
export async function serveAppRequest(req: { url: string; method: string }, root: string, csp: string): Promise<AppResponse> {
  const headers = { 'content-security-policy': csp, 'x-content-type-options': 'nosniff', 'cache-control': 'no-store' };
  if (req.method !== 'GET' && req.method !== 'HEAD') return { status: 405, headers, body: null };
  const r = resolveAppPath(req.url, root);
  if (!r.ok) return { status: r.status, headers, body: null };
  try {
    const realRoot = await fsp.realpath(root);
    const real = await fsp.realpath(r.path);
    if (!real.startsWith(realRoot + sep)) return { status: 403, headers, body: null };
    const st = await fsp.stat(real);
    if (!st.isFile()) return { status: 404, headers, body: null };
    const body = req.method === 'HEAD' ? null : new Uint8Array(await fsp.readFile(real));
    return { status: 200, headers: { ...headers, 'content-type': TYPES[extname(real).toLowerCase()] ?? 'application/octet-stream' }, body };
  } catch {
    return { status: 404, headers, body: null };
  }
}
