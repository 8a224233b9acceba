import { resolve } from 'node:path';
import { defineConfig } from 'vite';

// The page and the browser benchmark page are built together; the engine .wasm is always
// emitted as a file (never inlined) so page and workers share one compiled asset.
export default defineConfig({
  root: '.',
  base: './',
  build: {
    outDir: 'dist',
    target: 'es2022',
    assetsInlineLimit: (file: string) => (file.endsWith('.wasm') ? false : undefined),
    rollupOptions: {
      input: {
        main: resolve(import.meta.dirname, 'index.html'),
        bench: resolve(import.meta.dirname, 'bench.html'),
      },
    },
  },
  worker: { format: 'es' },
  server: { host: '127.0.0.1', port: 5173 },
  preview: { host: '127.0.0.1', port: 4173 },
});
