import { fileURLToPath } from 'node:url';

import react from '@vitejs/plugin-react';
import { defineConfig } from 'vite';

const repoRoot = fileURLToPath(new URL('..', import.meta.url));
const domain = fileURLToPath(new URL('../api/src/domain', import.meta.url));
const drawings = fileURLToPath(new URL('../api/src/drawings', import.meta.url));
const apiTarget = `http://127.0.0.1:${process.env.API_PORT ?? '3001'}`;

export default defineConfig({
  plugins: [react()],
  resolve: {
    alias: { '@domain': domain, '@drawings': drawings },
  },
  server: {
    proxy: { '/api': { target: apiTarget } },
    // The font files live in the repository's top-level fonts/ folder, shared with the PDF renderer.
    fs: { allow: [repoRoot] },
  },
  preview: {
    proxy: { '/api': { target: apiTarget } },
  },
  build: {
    outDir: 'dist',
    emptyOutDir: true,
    // dist/.vite/manifest.json: which chunks each route module pulls in (read by bench/web-bundle.bench.ts).
    manifest: true,
  },
});
