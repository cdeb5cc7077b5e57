/// <reference types="vitest/config" />
import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';
import { antdStaticStyles } from './build/antdStaticStyles';
import { fontPreload } from './build/fontPreload';

const sharedSource = fileURLToPath(new URL('../shared/src/index.ts', import.meta.url));

export default defineConfig({
  plugins: [react(), antdStaticStyles(), fontPreload()],
  resolve: {
    // The engine is bundled from source, so the browser runs exactly the code the tests check.
    alias: { '@fieldbound/shared': sharedSource },
  },
  worker: { format: 'es' },
  optimizeDeps: { include: ['d3-contour', 'comlink'] },
  server: {
    host: '127.0.0.1',
    port: 5173,
    proxy: { '/api': 'http://127.0.0.1:3000' },
  },
  build: { outDir: 'dist', sourcemap: true, chunkSizeWarningLimit: 2000 },
  test: {
    environment: 'happy-dom',
    include: ['src/**/*.test.{ts,tsx}'],
    setupFiles: ['src/test-setup.ts'],
  },
});
