// Types of scripts/cli-bundle.mjs (plain Node, run without a TypeScript loader).
export declare const ROOT: string;
export declare const CLI_BUNDLE: string;
export declare function mapWorkerBundle(bundle?: string): string;
export declare function bundleInputs(root?: string): string[];
export declare function staleReason(bundle?: string, inputs?: string[]): string;
export declare function buildBundle(bundle?: string): string;
export declare function ensureBundle(bundle?: string): string;
