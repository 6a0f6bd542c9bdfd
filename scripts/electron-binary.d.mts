// Types of scripts/electron-binary.mjs (plain Node, run without a TypeScript loader).
export declare const ELECTRON_NODE: string;
export declare function atLeast(version: string, least: string): boolean;
export declare function electronPackageDir(from?: string): string;
export declare function findElectron(opts?: { env?: Record<string, string | undefined>; dir?: string; nodeVersion?: string }): { ok: true; path: string } | { ok: false; message: string };
