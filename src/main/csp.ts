// The Content-Security-Policy of the renderer, as data. Everything comes from the app itself;
// nothing remote is ever loaded.
//   style-src 'unsafe-inline': plotly injects <style> elements and style attributes at run time.
//   img-src data: blob:        plot export renders the figure to a data/blob URL image.
//   worker-src blob:           the simulation worker (and plotly's image export) may start from a blob.

export type CspDirectives = Record<string, string[]>;

export const CSP_DIRECTIVES: CspDirectives = {
  'default-src': ["'self'"],
  'script-src': ["'self'"],
  'style-src': ["'self'", "'unsafe-inline'"],
  'img-src': ["'self'", 'data:', 'blob:'],
  'font-src': ["'self'"],
  'connect-src': ["'self'"],
  'worker-src': ["'self'", 'blob:'],
  'frame-src': ["'none'"],
  'object-src': ["'none'"],
  'base-uri': ["'none'"],
  'form-action': ["'none'"],
  'frame-ancestors': ["'none'"],
};

/** Directives a browser ignores (and warns about) when they come in a <meta> tag. */
export const HEADER_ONLY_DIRECTIVES = ['frame-ancestors', 'report-uri', 'sandbox'];

export function serializeCsp(d: CspDirectives): string {
  return Object.entries(d)
    .map(([k, v]) => `${k} ${v.join(' ')}`)
    .join('; ');
}

/** Parse a policy string back to directives (for tests and for checking the page's meta tag). */
export function parseCsp(policy: string): CspDirectives {
  const out: CspDirectives = {};
  for (const part of policy.split(';')) {
    const [name, ...values] = part.trim().split(/\s+/);
    if (name) out[name.toLowerCase()] = values;
  }
  return out;
}

/**
 * The policy sent as a response header. With a development server URL (electron-vite dev) the
 * server's origin is added for scripts and its websocket for hot reload; nothing else changes.
 */
export function cspHeader(opts: { devServerUrl?: string } = {}): string {
  if (!opts.devServerUrl) return serializeCsp(CSP_DIRECTIVES);
  const u = new URL(opts.devServerUrl);
  const ws = `${u.protocol === 'https:' ? 'wss:' : 'ws:'}//${u.host}`;
  const d: CspDirectives = { ...CSP_DIRECTIVES };
  d['script-src'] = [...CSP_DIRECTIVES['script-src']!, u.origin];
  d['connect-src'] = [...CSP_DIRECTIVES['connect-src']!, u.origin, ws];
  return serializeCsp(d);
}

/** The policy for the <meta http-equiv="Content-Security-Policy"> tag of src/renderer/index.html. */
export function cspMeta(): string {
  const d: CspDirectives = {};
  for (const [k, v] of Object.entries(CSP_DIRECTIVES)) if (!HEADER_ONLY_DIRECTIVES.includes(k)) d[k] = v;
  return serializeCsp(d);
}
