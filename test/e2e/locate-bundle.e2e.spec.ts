import { readFileSync } from 'node:fs';
import { join } from 'node:path';

import { describe, expect, it } from 'vitest';

// @ts-expect-error -- plain ESM script shared with `npm start`; no type declarations.
import { root } from '../../scripts/lib/setup.mjs';

/*
 * The public locate view and the sign-in page are pages of their own (issue 17): a stranger's phone on a
 * weak signal loads React and the locate view only, a crew lead's phone React and the sign-in form only.
 * Read from the build the e2e server serves (web/dist): Vite's manifest says
 * which scripts the page loads (its entry and every chunk that imports statically), and
 * .vite/chunk-contents.json (web/vite.config.ts, `chunkContents`) what is bundled into each.
 */
const dist = join(root as string, 'web/dist');
type ManifestChunk = { file: string; isEntry?: boolean; imports?: string[]; dynamicImports?: string[]; css?: string[] };
const manifest = JSON.parse(readFileSync(join(dist, '.vite/manifest.json'), 'utf8')) as Record<string, ManifestChunk>;
const contents = JSON.parse(readFileSync(join(dist, '.vite/chunk-contents.json'), 'utf8')) as Record<string, { packages: string[]; sources: string[] }>;

/** The entry's script and every script it imports statically, transitively (what the page loads to start). */
function staticScripts(key: string, files = new Set<string>()): Set<string> {
  const chunk = manifest[key];
  if (!chunk) throw new Error(`not in the Vite manifest: ${key}`);
  if (files.has(chunk.file)) return files;
  files.add(chunk.file);
  for (const imported of chunk.imports ?? []) staticScripts(imported, files);
  return files;
}

describe('the locate page’s scripts (built web app)', () => {
  const locate = staticScripts('locate.html');
  const packages = new Set([...locate].flatMap((file) => contents[file]?.packages ?? []));
  const sources = [...locate].flatMap((file) => contents[file]?.sources ?? []);

  it('should be the locate entry with React and the map, and nothing of the app shell', () => {
    expect(manifest['locate.html']?.isEntry).toBe(true);
    for (const file of locate) expect(contents[file], file).toBeDefined();
    // What it is made of: React, and d3 for the map's pan and zoom.
    expect(packages).toContain('react-dom');
    expect(packages).toContain('d3-zoom');
    expect(sources).toContain('web/src/locate-main.tsx');
    expect(sources).toContain('web/src/features/locate/components/site-map-plan.tsx');
    // No Fluent UI (nor its styling and focus runtimes), no router, no query cache.
    const shell = [...packages].filter((p) => p.startsWith('@fluentui/') || p.startsWith('@griffel/') || p === 'tabster' || p === 'react-router' || p.startsWith('@tanstack/'));
    expect(shell).toEqual([]);
    // Nor the app's own shell: its entry, router, providers or session start-up.
    expect(sources.filter((s) => s.startsWith('web/src/app/') || s === 'web/src/main.tsx')).toEqual([]);
    // And it loads nothing later either (no lazy chunks to wait for).
    for (const file of locate) {
      const chunk = Object.values(manifest).find((c) => c.file === file)!;
      expect(chunk.dynamicImports ?? [], file).toEqual([]);
    }
  });

  it('should hold no zod and none of the session or API-client code (a stranger’s map needs neither)', () => {
    // Building zod's schemas at module load took a phone 200-300 ms of the page's blocking time (issue 17):
    // the page's fetch is lib/public-api.ts, and it imports the API's schemas for their types only.
    expect([...packages].filter((p) => p === 'zod' || p.startsWith('@zod/'))).toEqual([]);
    expect(sources.filter((s) => s.startsWith('web/src/lib/session') || s.startsWith('web/src/lib/api-client'))).toEqual([]);
    expect(sources).toContain('web/src/lib/public-api.ts');
  });

  it('should not be loaded by the app: the app’s entry shares no locate-only code', () => {
    const app = staticScripts('index.html');
    expect([...app].flatMap((file) => contents[file]?.sources ?? []).filter((s) => s.includes('locate-main') || s.includes('locate-page'))).toEqual([]);
  });
});

/** npm packages of the app's shell: Fluent UI, its styling and focus runtimes, the router, the query cache, zod. */
const isShellPackage = (p: string) =>
  p.startsWith('@fluentui/') || p.startsWith('@griffel/') || p === 'tabster' || p === 'react-router' || p.startsWith('@tanstack/') || p === 'zod' || p.startsWith('@zod/');

describe('the sign-in page’s scripts (built web app)', () => {
  const signIn = staticScripts('sign-in.html');
  const packages = new Set([...signIn].flatMap((file) => contents[file]?.packages ?? []));
  const sources = [...signIn].flatMap((file) => contents[file]?.sources ?? []);

  it('should be the sign-in entry with React and the form, and nothing of the app shell, zod or the session', () => {
    expect(manifest['sign-in.html']?.isEntry).toBe(true);
    for (const file of signIn) expect(contents[file], file).toBeDefined();
    expect(packages).toContain('react-dom');
    expect(sources).toContain('web/src/sign-in-main.tsx');
    expect(sources).toContain('web/src/features/auth/components/sign-in-page.tsx');
    // Its requests are public-api.ts's (no token, no refresh; the app restores the session after it).
    expect(sources).toContain('web/src/lib/public-api.ts');
    expect([...packages].filter(isShellPackage)).toEqual([]);
    expect(sources.filter((s) => s.startsWith('web/src/app/') || s === 'web/src/main.tsx')).toEqual([]);
    expect(sources.filter((s) => s.startsWith('web/src/lib/session') || s.startsWith('web/src/lib/api-client') || s.includes('restore-session'))).toEqual([]);
    // Nor anything of the locate view, nor anything loaded later.
    expect(sources.filter((s) => s.includes('/locate/') || s.includes('locate-main'))).toEqual([]);
    for (const file of signIn) {
      const chunk = Object.values(manifest).find((c) => c.file === file)!;
      expect(chunk.dynamicImports ?? [], file).toEqual([]);
    }
  });

  it('should not be loaded by the app, nor by the locate page', () => {
    const app = staticScripts('index.html');
    const locate = staticScripts('locate.html');
    for (const files of [app, locate]) {
      expect([...files].flatMap((file) => contents[file]?.sources ?? []).filter((s) => s.includes('sign-in-main') || s.includes('sign-in-page'))).toEqual([]);
    }
  });
});
