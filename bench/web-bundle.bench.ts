/**
 * Web bundle benchmark: `npx tsx bench/web-bundle.bench.ts` (part of `npm run bench`).
 *
 * Builds the web app if its sources changed, then adds up the gzipped JavaScript a browser downloads
 * to show the first route, `/` (goal: under 250 KB): the entry script and the modulepreload links of
 * web/dist/index.html, plus the lazily loaded route modules that `/` matches (app/router.tsx: the root
 * layout, the app frame, the signed-in guard and the home page) with every chunk they import statically,
 * read from Vite's build manifest (web/dist/.vite/manifest.json). The sign-in page (sign-in.html, where a
 * signed-out visitor lands), the public locate view's page (locate.html) — both pages of their own — and
 * the whole build are printed beside it for scale.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';

// @ts-expect-error -- plain ESM script shared with `npm start`; no type declarations.
import { ensureWebBuilt, root } from '../scripts/lib/setup.mjs';
import { recordResults } from './results.js';

const GOAL_KB = 250;
const dist = join(root as string, 'web/dist');

interface ManifestChunk {
  file: string;
  src?: string;
  isEntry?: boolean;
  imports?: string[];
  dynamicImports?: string[];
  css?: string[];
}

/** The route modules each page loads through React Router's `lazy` (web/src/app/router.tsx). */
const ROUTES: Record<string, string[]> = {
  '/': ['app/routes/root', 'app/routes/app/root', 'app/routes/app/protected', 'app/routes/app/home'],
};

ensureWebBuilt();
const manifest = JSON.parse(readFileSync(join(dist, '.vite/manifest.json'), 'utf8')) as Record<string, ManifestChunk>;
const html = readFileSync(join(dist, 'index.html'), 'utf8');

const gzipCache = new Map<string, { raw: number; gzip: number }>();
function sizeOf(file: string): { raw: number; gzip: number } {
  let size = gzipCache.get(file);
  if (!size) {
    const content = readFileSync(join(dist, file));
    size = { raw: content.length, gzip: gzipSync(content).length };
    gzipCache.set(file, size);
  }
  return size;
}

/** A chunk's file and the files of everything it imports statically (loaded with it), transitively. */
function withStaticImports(key: string, files: Set<string>): void {
  const chunk = manifest[key];
  if (!chunk) throw new Error(`not in the Vite manifest: ${key}`);
  if (files.has(chunk.file)) return;
  files.add(chunk.file);
  for (const imported of chunk.imports ?? []) withStaticImports(imported, files);
}

// What each built script holds (web/vite.config.ts, `chunkContents`): a route module grouped into a
// first-screen chunk with others (`firstScreenChunks`) has no manifest key of its own.
const contents = JSON.parse(readFileSync(join(dist, '.vite/chunk-contents.json'), 'utf8')) as Record<string, { sources: string[] }>;

function manifestKey(module: string): string {
  const pattern = new RegExp(`(^|/)src/${module}\\.(tsx|ts|jsx|js)$`);
  const own = Object.keys(manifest).find((k) => pattern.test(k));
  if (own) return own;
  const file = Object.keys(contents).find((f) => contents[f]!.sources.some((source) => pattern.test(source)));
  const key = file && Object.keys(manifest).find((k) => manifest[k]!.file === file);
  if (!key) throw new Error(`route module ${module} is not in the Vite manifest (was it renamed? update ROUTES)`);
  return key;
}

// What index.html itself loads: the entry script and its modulepreload links.
const htmlScripts = [
  ...[...html.matchAll(/<script\b[^>]*\bsrc="\/([^"]+\.js)"/g)].map((m) => m[1]!),
  ...[...html.matchAll(/<link\b[^>]*rel="modulepreload"[^>]*href="\/([^"]+\.js)"/g)].map((m) => m[1]!),
];
if (htmlScripts.length === 0) throw new Error('web/dist/index.html loads no script');
// Three entries (web/vite.config.ts): the app (index.html), the sign-in page (sign-in.html) and the public
// locate view's page (locate.html).
const entryKey = 'index.html';
if (!manifest[entryKey]?.isEntry) throw new Error('the Vite manifest has no index.html entry');
const entryFiles = new Set<string>();
withStaticImports(entryKey, entryFiles);
// The manifest and the page agree on what loads first (a cross-check of this script's reading).
for (const file of htmlScripts) if (!entryFiles.has(file)) throw new Error(`index.html loads ${file}, which the manifest entry does not list`);

const kb = (bytes: number) => bytes / 1024;
const total = (files: Iterable<string>) => [...files].reduce((sum, f) => ({ raw: sum.raw + sizeOf(f).raw, gzip: sum.gzip + sizeOf(f).gzip }), { raw: 0, gzip: 0 });

console.log(`Loamline web bundle — gzipped JavaScript (zlib default level) from web/dist`);
console.log('');
console.log('route         chunks   raw KB   gzip KB');
const perRoute = new Map<string, { raw: number; gzip: number; chunks: number }>();
for (const [route, modules] of Object.entries(ROUTES)) {
  const files = new Set(entryFiles);
  for (const module of modules) withStaticImports(manifestKey(module), files);
  const size = total(files);
  perRoute.set(route, { ...size, chunks: files.size });
  console.log(`${route.padEnd(12)} ${String(files.size).padStart(7)} ${kb(size.raw).toFixed(1).padStart(8)} ${kb(size.gzip).toFixed(1).padStart(9)}`);
}
// The sign-in page and the locate view are pages of their own (issue 17): each entry and what it imports
// statically, no route modules.
function page(route: string, entry: string) {
  const files = new Set<string>();
  withStaticImports(entry, files);
  const size = total(files);
  console.log(`${route.padEnd(12)} ${String(files.size).padStart(7)} ${kb(size.raw).toFixed(1).padStart(8)} ${kb(size.gzip).toFixed(1).padStart(9)}`);
  return size;
}
const signIn = page('/sign-in', 'sign-in.html');
const locate = page('/locate/…', 'locate.html');
const allJs = Object.values(manifest).map((c) => c.file).filter((f) => f.endsWith('.js'));
const whole = total(new Set(allJs));
console.log(`${'whole build'.padEnd(12)} ${String(new Set(allJs).size).padStart(7)} ${kb(whole.raw).toFixed(1).padStart(8)} ${kb(whole.gzip).toFixed(1).padStart(9)}`);
const first = perRoute.get('/')!;
const isMet = kb(first.gzip) < GOAL_KB;
console.log('');
console.log(`goal: first route "/" under ${GOAL_KB} KB gzipped → ${kb(first.gzip).toFixed(1)} KB, ${isMet ? 'MET' : 'NOT MET'}`);

recordResults('web-bundle', [
  { label: 'first route "/" JavaScript, gzipped', value: kb(first.gzip), unit: 'KB', goal: `< ${GOAL_KB} KB`, isMet },
  { label: 'first route "/" JavaScript, raw', value: kb(first.raw), unit: 'KB' },
  { label: 'sign-in page JavaScript, gzipped', value: kb(signIn.gzip), unit: 'KB' },
  { label: 'locate page JavaScript, gzipped', value: kb(locate.gzip), unit: 'KB' },
  { label: 'whole build JavaScript, gzipped', value: kb(whole.gzip), unit: 'KB' },
]);
