import { readdir, readFile, stat, writeFile } from 'node:fs/promises';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { promisify } from 'node:util';
import { brotliCompress, constants, gzip } from 'node:zlib';

import react from '@vitejs/plugin-react';
import { defineConfig, type Plugin, type Rolldown } from 'vite';
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
 * that the public locate page's and the sign-in page's scripts hold no Fluent UI, router or query cache
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

/**
 * The signed-in pages' scripts in a handful of files (issue 17): left to itself the bundler splits the
 * first screen into one chunk per set of routes sharing a module, about 80 files for Today and 100 for a
 * job page (10-600 KB each), and every one is a request over HTTP/1.1 (six at a time) and a
 * `<link rel="modulepreload">` the page adds at 4x CPU slowdown. Here the modules are grouped by the
 * first screen that needs them, from the static import graph (`buildEnd`, before the chunks are made):
 *
 * - `react`: React itself, shared with the public locate page and the sign-in page;
 * - `public-shared`: what the two pages of their own (locate.html, sign-in.html) share with the app's
 *   first screens or with each other, in one chunk (no Fluent UI: neither page's graph holds any,
 *   test/e2e/locate-bundle.e2e.spec.ts). One rather than one per page: the app's start then loads one
 *   script for it, as it did when only the locate page had one (the sign-in page carries the locate
 *   page's few KB of units code for it, about 6 KB compressed); what only one page needs stays in its
 *   entry's chunk;
 * - `start`: main.tsx and the root route (session, router, query cache, Fluent's provider);
 * - `frame`: the signed-in frame (app root and protected routes: header, navigation);
 * - `pages`: what Today and the job page share; `today`, `job`: each page's own code;
 * - `later`: what the frame loads once a page shows (account menu, the runners that send queued
 *   changes), and `job-later`: the part of it the job page needs on its first screen too.
 *
 * Today then loads about seven scripts, a job page about eight. Modules no first screen needs (plan
 * editor, drawings, dialogs behind a button, other routes) keep the bundler's own splitting, and a
 * route that needs part of a group loads the group.
 */
/** A feature's public surface, `src/features/<name>/index.ts`: re-exports only (eslint.config.js). */
const FEATURE_INDEX = /[\\/]src[\\/]features[\\/][^\\/]+[\\/]index\.tsx?$/;

function firstScreenChunks(): { plugin: Plugin; groups: Rolldown.CodeSplittingGroup[] } {
  const groupOf = new Map<string, string>();
  const src = (path: string) => resolve(appRoot, path);
  const isReact = (id: string) => /[\\/]node_modules[\\/](react|react-dom|scheduler)[\\/]/.test(id);
  const isOurs = (id: string) => !id.includes('/node_modules/') && !id.startsWith('\0');
  const plugin: Plugin = {
    name: 'loamline-first-screen-chunks',
    apply: 'build',
    async buildEnd() {
      // Fluent's `@fluentui/react-components` re-exports every component package; followed as it is, it
      // would put all of them on the first screen. Our modules' named imports from it are followed to
      // the package that exports each name instead.
      const barrel = await this.resolve('@fluentui/react-components', src('src/main.tsx'));
      const packageOf = new Map<string, string>();
      const packageId = new Map<string, string>();
      if (barrel) {
        const text = await readFile(barrel.id, 'utf8');
        for (const [, names, from] of text.matchAll(/export\s*\{([^}]*)\}\s*from\s*"([^"]+)"/g)) {
          for (const name of names!.replace(/\/\/[^\n]*/g, '').split(',')) {
            const exported = name.trim().split(/\s+as\s+/).pop()!;
            if (exported) packageOf.set(exported, from!);
          }
        }
        for (const from of new Set(packageOf.values())) {
          const resolved = await this.resolve(from, barrel.id);
          if (resolved) packageId.set(from, resolved.id);
        }
      }
      // Our features' public `index.ts` files re-export each name from the module that defines it; followed
      // as they are, Today importing one jobs query from `features/jobs` would reach every jobs component
      // (forms, dialogs, react-hook-form) and put the job page's code on Today's first screen. Named
      // imports from a feature's index are followed to the modules that export those names.
      const featureIndex = new Map<string, Map<string, string>>();
      for (const id of this.getModuleIds()) {
        if (!isOurs(id) || !FEATURE_INDEX.test(id)) continue;
        const exportsFrom = new Map<string, string>();
        for (const [, names, from] of (await readFile(id, 'utf8')).matchAll(/export\s*\{([^}]*)\}\s*from\s*['"]([^'"]+)['"]/g)) {
          const target = (await this.resolve(from!, id))?.id;
          if (!target) continue;
          for (const name of names!.replace(/\/\/[^\n]*/g, '').split(',')) {
            const exported = name.trim().replace(/^type\s+/, '').split(/\s+as\s+/).pop()!;
            if (exported) exportsFrom.set(exported, target);
          }
        }
        featureIndex.set(id, exportsFrom);
      }
      /** The modules behind `names` imported from our module `id`'s import of `specifier`, if it is a feature index. */
      const throughIndex = (id: string, specifier: string, names: string) => {
        const exportsFrom = featureIndex.get(resolve(dirname(id), specifier, 'index.ts')) ?? featureIndex.get(resolve(dirname(id), specifier, 'index.tsx'));
        if (!exportsFrom) return undefined;
        const targets: string[] = [];
        for (const name of names.split(',')) {
          const imported = name.trim().replace(/^type\s+/, '').split(/\s+as\s+/)[0]!;
          if (!imported) continue;
          const target = exportsFrom.get(imported);
          // A name the index does not list as re-exported: follow the whole index, as before.
          if (!target) return undefined;
          targets.push(target);
        }
        return { index: exportsFrom, targets };
      };
      const importsOf = (id: string): string[] => {
        const info = this.getModuleInfo(id);
        if (!info) return [];
        if (!isOurs(id)) return info.importedIds;
        const code = info.code ?? '';
        let imported = info.importedIds;
        const named = new Set<string>();
        if (barrel && imported.includes(barrel.id)) {
          for (const [, names] of code.matchAll(/import\s*\{([^}]*)\}\s*from\s*["']@fluentui\/react-components["']/g)) {
            for (const name of names!.split(',')) {
              const importedName = name.trim().replace(/^type\s+/, '').split(/\s+as\s+/)[0]!;
              const from = packageOf.get(importedName);
              if (from && packageId.has(from)) named.add(packageId.get(from)!);
            }
          }
          imported = imported.filter((next) => next !== barrel.id);
        }
        if (imported.some((next) => featureIndex.has(next))) {
          // Each feature index this module imports, and whether every import of it was named ones it re-exports.
          const precise = new Map<string, boolean>();
          for (const [statement, names, specifier] of code.matchAll(/import\s*(?:\{([^}]*)\}\s*from\s*)?["']([^"']+)["']/g)) {
            if (!specifier!.startsWith('.')) continue;
            const index = [...featureIndex.keys()].find((key) => dirname(key) === resolve(dirname(id), specifier!));
            if (!index) continue;
            const through = names === undefined || /import\s*\*/.test(statement) ? undefined : throughIndex(id, specifier!, names);
            if (!through) precise.set(index, false);
            else {
              if (!precise.has(index)) precise.set(index, true);
              for (const target of through.targets) named.add(target);
            }
          }
          imported = imported.filter((next) => !precise.get(next));
        }
        return [...imported, ...named];
      };
      const reach = (roots: string[], outside: Set<string> = new Set()) => {
        const seen = new Set<string>();
        const queue = roots.filter((id) => this.getModuleInfo(id));
        while (queue.length > 0) {
          const id = queue.pop()!;
          if (seen.has(id) || outside.has(id)) continue;
          seen.add(id);
          queue.push(...importsOf(id));
        }
        return seen;
      };
      const locate = reach([src('locate.html')]);
      const signInPage = reach([src('sign-in.html')]);
      const publicPages = new Set([...locate, ...signInPage]);
      const start = reach([src('index.html'), src('src/app/routes/root.tsx')]);
      const frame = reach([src('src/app/routes/app/root.tsx'), src('src/app/routes/app/protected.tsx')], start);
      const before = new Set([...start, ...frame]);
      const today = reach([src('src/app/routes/app/home.tsx')], before);
      const job = reach([src('src/app/routes/app/job.tsx')], before);
      // What the frame loads by itself once a page shows (the account menu, the runners that send queued
      // photos and job changes) is one chunk of its own, `later`: left in the job page's group it would
      // download the whole job page on Today. (The office's work queue, which Today loads lazily, keeps
      // the bundler's splitting.)
      // Only what those two route modules load lazily: the phone menu's drawer (app shell) waits for a
      // tap, and what the start loads lazily (the toaster, the service worker's helper) is loaded on the
      // sign-in page too, so both stay out of this group.
      const frameRoutes = [src('src/app/routes/app/root.tsx'), src('src/app/routes/app/protected.tsx')];
      const lazyRoots = frameRoutes.flatMap((id) => this.getModuleInfo(id)?.dynamicallyImportedIds ?? []);
      const later = reach(lazyRoots, new Set([...before, ...today]));
      groupOf.clear();
      const assign = (ids: Iterable<string>, name: string) => {
        for (const id of ids) {
          if (groupOf.has(id)) continue;
          groupOf.set(id, isReact(id) ? 'react' : publicPages.has(id) ? 'public-shared' : name);
        }
      };
      assign(start, 'start');
      assign(frame, 'frame');
      assign([...today].filter((id) => job.has(id)), 'pages');
      assign(today, 'today');
      // What the frame's later code and the job page both need (the job writer, the ties editor, site
      // writes): its own chunk, so the job page's first screen does not wait for the rest of `later`.
      assign([...later].filter((id) => job.has(id)), 'job-later');
      assign(later, 'later');
      assign(job, 'job');
      // React is shared with the public pages whether or not a first screen reaches it first; what the two
      // public pages share with each other (and no first screen) is one chunk too, not one per module.
      for (const id of publicPages) if (isReact(id)) groupOf.set(id, 'react');
      for (const id of locate) if (signInPage.has(id) && !groupOf.has(id)) groupOf.set(id, 'public-shared');
    },
  };
  // Highest priority first: a group's modules take their own dependencies along (the bundler's default),
  // so the groups nearer the root claim theirs before a later group could.
  const order = ['react', 'public-shared', 'start', 'frame', 'pages', 'today', 'job-later', 'later', 'job'];
  const groups = order.map((name, i) => ({
    name,
    priority: order.length - i,
    test: (id: string) => groupOf.get(id) === name,
  }));
  return { plugin, groups };
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
    // The sign-in page (sign-in.html) is: a lead whose session ended with no signal still gets it.
    globIgnores: ['locate.html'],
    // The largest route chunk (the plan editor with elkjs) is above Workbox's 2 MiB default.
    maximumFileSizeToCacheInBytes: 8 * 1024 * 1024,
    // A reload of any client-side route with no signal gets the precached shell…
    navigateFallback: '/index.html',
    // …but never for the API, nor for the public locate view's own links (`/locate/<token>`) or the sign-in
    // page (`/sign-in`, with or without a query), which the server answers with locate.html and sign-in.html,
    // pages of their own.
    navigateFallbackDenylist: [/^\/api(\/|$)/, /^\/locate\//, /^\/sign-in\/?(\?|$)/],
    // /sign-in from the network (the server's sign-in.html, so a new build's page is used at once), or with
    // no signal the precached sign-in.html: a lead whose session ended offline sees the sign-in page, not
    // the browser's offline error. Nothing else at run time: /api answers are never kept by the worker.
    runtimeCaching: [
      {
        urlPattern: ({ request, url }) => request.mode === 'navigate' && /^\/sign-in\/?$/.test(url.pathname),
        handler: 'NetworkOnly',
        options: { precacheFallback: { fallbackURL: '/sign-in.html' } },
      },
    ],
    cleanupOutdatedCaches: true,
    // One file: no workbox-<hash>.js beside sw.js for the server to keep fresh.
    inlineWorkboxRuntime: true,
    // The hashed file names are the revision already.
    dontCacheBustURLsMatching: /^assets\//,
  },
  devOptions: { enabled: false },
});

const firstScreen = firstScreenChunks();

export default defineConfig({
  plugins: [react(), pwa, precompress(), chunkContents(), firstScreen.plugin],
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
      // Three pages: the app, and two pages of their own (issue 17: React and one view only, no Fluent UI,
      // router, query cache, zod or session): the public locate view and the sign-in page
      // (api/src/common/web-app.ts answers /locate/<token> and /sign-in with them).
      input: { index: resolve(appRoot, 'index.html'), locate: resolve(appRoot, 'locate.html'), 'sign-in': resolve(appRoot, 'sign-in.html') },
      output: { codeSplitting: { groups: firstScreen.groups } },
      // A feature's public `index.ts` only re-exports: declared free of side effects, an import through it
      // goes straight to the chunk of the module that defines the name, and Today importing one jobs query
      // does not load the chunk of every module the index re-exports (the job page's).
      treeshake: { moduleSideEffects: (id: string) => !FEATURE_INDEX.test(id) },
    },
  },
});
