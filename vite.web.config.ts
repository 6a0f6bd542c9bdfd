import { resolve } from 'node:path';
import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';

// The renderer alone, as a plain web page (file open/save through browser upload/download).
export default defineConfig({
  root: 'src/renderer',
  base: './',
  plugins: [react()],
  build: { outDir: resolve('out/renderer'), emptyOutDir: true },
  worker: { format: 'es' },
});
