import { resolve } from 'node:path';
import { chmodSync } from 'node:fs';
import { defineConfig } from 'vite';

// The command line as one self-contained ES module for Node 20 (zod and the solvers bundled in), so a
// command starts with one file read instead of a TypeScript loader compiling a hundred modules.
export default defineConfig({
  build: {
    ssr: resolve('src/cli/bin.ts'),
    outDir: process.env.TORQUEWISE_CLI_OUT ?? 'out/cli',
    emptyOutDir: false,
    target: 'node20',
    minify: false,
    sourcemap: false,
    reportCompressedSize: false,
    rollupOptions: { output: { format: 'es', entryFileNames: 'torquewise.mjs' } },
  },
  ssr: { target: 'node', noExternal: true },
  logLevel: 'warn',
  plugins: [
    {
      name: 'torquewise-cli-executable',
      writeBundle(options, bundle) {
        for (const name of Object.keys(bundle)) chmodSync(resolve(options.dir ?? '', name), 0o755);
      },
    },
  ],
});
