// The demo projects shipped in resources/ (invented data), bundled by Vite at build time.
/// <reference types="vite/client" />

const files = import.meta.glob('../../../../resources/demo-*.json', { eager: true, query: '?raw', import: 'default' }) as Record<string, string>;

export interface Demo {
  /** file name, e.g. demo-ipm-traction.json */
  file: string;
  text: string;
}

export const DEFAULT_DEMO = 'demo-ipm-traction.json';

export const DEMOS: Demo[] = Object.entries(files)
  .map(([path, text]) => ({ file: path.slice(path.lastIndexOf('/') + 1), text }))
  .sort((a, b) => (a.file === DEFAULT_DEMO ? -1 : b.file === DEFAULT_DEMO ? 1 : a.file.localeCompare(b.file)));
