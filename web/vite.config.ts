import { readdir, readFile, stat, writeFile } from 'node:fs/promises';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { promisify } from 'node:util';
import { brotliCompress, constants, gzip } from 'node:zlib';

import react from '@vitejs/plugin-react';
import { defineConfig, type Plugin } from 'vite';
import { VitePWA } from 'vite-plugin-pwa';

const repoRoot = fileURLToPath(new URL('..', import.meta.url));
const appRoot = fileURLToPath(new URL('.', import.meta.url));
const domain = fileURLToPath(new URL('../api/src/domain', import.meta.url));
const drawings = fileURLToPath(new URL('../api/src/drawings', import.meta.url));
const apiTarget = `http://127.0.0.1:${process.env.API_PORT ?? '3001'}`;

const brotli = promisify(brotliCompress);
const gzipAsync = promisify(gzip);

/** Text files (and WebAssembly) worth compressing; images and fonts (woff2) are compressed already. */
const COMPRESSIBLE = /\.(js|mjs|css|html|svg|json|txt|map|webmanifest|wasm)$/;
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

/**
 * Writes `dist/.vite/chunk-contents.json`: for every built script, the npm packages and the source files
 * bundled into it. Vite's manifest names only chunks; this says what is inside them, so a test can check
 * that the public locate page's scripts hold no Fluent UI, router or query cache
 * (test/e2e/locate-bundle.e2e.spec.ts). Not served: the server skips `.vite/`.
 */
function chunkContents(): Plugin {
  return {
    name: 'loamline-chunk-contents',
    apply: 'build',
    generateBundle(_options, bundle) {
      const contents: Record<string, { packages: string[]; sources: string[] }> = {};
      for (const output of Object.values(bundle)) {
        if (output.type !== 'chunk') continue;
        const packages = new Set<string>();
        const sources = new Set<string>();
        for (const id of output.moduleIds) {
          const path = id.replace(/\\/g, '/').replace(/^\0/, '');
          const inPackage = /\/node_modules\/((?:@[^/]+\/)?[^/]+)\//.exec(path);
          if (inPackage) packages.add(inPackage[1]!);
          else if (path.startsWith(repoRoot.replace(/\\/g, '/'))) sources.add(path.slice(repoRoot.length));
        }
        contents[output.fileName] = { packages: [...packages].sort(), sources: [...sources].sort() };
      }
      this.emitFile({ type: 'asset', fileName: '.vite/chunk-contents.json', source: JSON.stringify(contents, null, 1) });
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

/**
 * The installable, offline-capable app (issue 17): a web app manifest and a Workbox service worker
 * (`sw.js`, generated at build time) that precaches every built file the app can ask for — the shell,
 * every route chunk, the fonts and the icons — so any screen opens with no signal after the first visit.
 *
 * - Nothing under `/api/` is cached by the worker: the answers hold people's and companies' contacts
 *   and are per user. What a crew lead needs offline is kept by the app itself (the TanStack Query
 *   cache persisted to IndexedDB per user, cleared on sign-out; web/src/lib/query-persistence.ts).
 * - `registerType: 'prompt'`: a new version installs in the background and waits; the app says
 *   "A new version is ready" with a Reload button (web/src/components/app-update.tsx) rather than
 *   swapping code under a half-typed form.
 * - The worker is registered by our own code (no inline script: the Content-Security-Policy forbids it).
 */
const pwa = VitePWA({
  strategies: 'generateSW',
  registerType: 'prompt',
  injectRegister: false,
  filename: 'sw.js',
  manifestFilename: 'manifest.webmanifest',
  includeAssets: ['favicon.svg', 'apple-touch-icon.png'],
  manifest: {
    id: '/',
    name: 'Loamline',
    short_name: 'Loamline',
    description: 'As-built records, cable checks and handover packets for low-voltage and outdoor-audio crews.',
    start_url: '/',
    scope: '/',
    display: 'standalone',
    orientation: 'any',
    background_color: '#ffffff',
    theme_color: '#335c1c',
    icons: [
      { src: '/icon-192.png', sizes: '192x192', type: 'image/png', purpose: 'any' },
      { src: '/icon-512.png', sizes: '512x512', type: 'image/png', purpose: 'any' },
      { src: '/icon-maskable-512.png', sizes: '512x512', type: 'image/png', purpose: 'maskable' },
      { src: '/favicon.svg', sizes: 'any', type: 'image/svg+xml', purpose: 'any' },
    ],
  },
  workbox: {
    // Every file of the build the app can load (the compressed .br/.gz copies are the server's business).
    // The HEIC converter's WebAssembly is among them, so a HEIC photo taken offline converts too.
    globPatterns: ['**/*.{js,css,html,svg,png,woff2,webmanifest,wasm}'],
    // The public locate page is not: it shows nothing without its /api answer, which the worker never
    // keeps, and the stranger it is for never installs the app (its scripts are precached with the rest).
    globIgnores: ['locate.html'],
    // The largest route chunk (the plan editor with elkjs) is above Workbox's 2 MiB default.
    maximumFileSizeToCacheInBytes: 8 * 1024 * 1024,
    // A reload of any client-side route with no signal gets the precached shell…
    navigateFallback: '/index.html',
    // …but never for the API, nor for the public locate view's own links (`/locate/<token>`), which the
    // server answers with locate.html, a page of its own.
    navigateFallbackDenylist: [/^\/api(\/|$)/, /^\/locate\//],
    // Nothing at run time: /api answers are never kept by the worker (see above).
    runtimeCaching: [],
    cleanupOutdatedCaches: true,
    // One file: no workbox-<hash>.js beside sw.js for the server to keep fresh.
    inlineWorkboxRuntime: true,
    // The hashed file names are the revision already.
    dontCacheBustURLsMatching: /^assets\//,
  },
  devOptions: { enabled: false },
});

export default defineConfig({
  plugins: [react(), pwa, precompress(), chunkContents()],
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
    rolldownOptions: {
      // Two pages: the app, and the public locate view on its own (issue 17: React and the locate view
      // only, no Fluent UI, router or query cache; api/src/common/web-app.ts answers /locate/* with it).
      input: { index: resolve(appRoot, 'index.html'), locate: resolve(appRoot, 'locate.html') },
    },
  },
});
