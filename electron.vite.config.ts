import { resolve } from 'node:path';
import { defineConfig } from 'electron-vite';
import react from '@vitejs/plugin-react';

// Three builds, one per runtime: main (Node + Electron), preload (sandboxed, CommonJS), renderer (browser).
export default defineConfig({
  main: {
    build: {
      outDir: 'out/main',
      lib: { entry: resolve('src/main/index.ts'), formats: ['es'], fileName: () => 'index.js' },
    },
  },
  preload: {
    build: {
      outDir: 'out/preload',
      // A sandboxed preload cannot load ES modules: emit one self-contained CommonJS file.
      externalizeDeps: false,
      lib: { entry: resolve('src/preload/index.ts'), formats: ['cjs'], fileName: () => 'index.cjs' },
    },
  },
  renderer: {
    root: 'src/renderer',
    base: './',
    plugins: [react()],
    build: {
      outDir: 'out/renderer',
      rollupOptions: { input: resolve('src/renderer/index.html') },
    },
    worker: { format: 'es' },
  },
});
