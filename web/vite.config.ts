import { readdir, readFile, stat, writeFile } from 'node:fs/promises';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { promisify } from 'node:util';
import { brotliCompress, constants, gzip } from 'node:zlib';

import react from '@vitejs/plugin-react';
import { defineConfig, type Plugin } from 'vite';

const repoRoot = fileURLToPath(new URL('..', import.meta.url));
const domain = fileURLToPath(new URL('../api/src/domain', import.meta.url));
const drawings = fileURLToPath(new URL('../api/src/drawings', import.meta.url));
const apiTarget = `http://127.0.0.1:${process.env.API_PORT ?? '3001'}`;

const brotli = promisify(brotliCompress);
const gzipAsync = promisify(gzip);

/** Text files worth compressing; images and fonts (woff2) are compressed already. */
const COMPRESSIBLE = /\.(js|mjs|css|html|svg|json|txt|map|webmanifest)$/;
/** Below this a compressed copy saves less than a packet header costs. */
const MIN_BYTES = 1024;

/**
 * Writes `file.br` (brotli, quality 11) and `file.gz` (gzip, level 9) beside every compressible file
 * of the build, once, at build time: the server (api/src/common/web-app.ts) then sends the smallest
 * copy the browser accepts without compressing anything per request. A copy that is not smaller than
 * the original is not written.
 */
function precompress(): Plugin {
  let outDir = 'dist';
  return {
    name: 'loamline-precompress',
    apply: 'build',
    configResolved(config) {
      outDir = resolve(config.root, config.build.outDir);
    },
    async closeBundle() {
      for (const file of await listFiles(outDir)) {
        if (!COMPRESSIBLE.test(file)) continue;
        const content = await readFile(file);
        if (content.length < MIN_BYTES) continue;
        const [br, gz] = await Promise.all([
          brotli(content, {
            params: {
              [constants.BROTLI_PARAM_QUALITY]: constants.BROTLI_MAX_QUALITY,
              [constants.BROTLI_PARAM_SIZE_HINT]: content.length,
            },
          }),
          gzipAsync(content, { level: 9 }),
        ]);
        if (br.length < content.length) await writeFile(`${file}.br`, br);
        if (gz.length < content.length) await writeFile(`${file}.gz`, gz);
      }
    },
  };
}

async function listFiles(dir: string): Promise<string[]> {
  const files: string[] = [];
  for (const entry of await readdir(dir)) {
    // Vite's manifest folder is read by tools, never served.
    if (entry === '.vite') continue;
    const path = join(dir, entry);
    if ((await stat(path)).isDirectory()) files.push(...(await listFiles(path)));
    else files.push(path);
  }
  return files;
}

export default defineConfig({
  plugins: [react(), precompress()],
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
