import { existsSync, mkdirSync, rmSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

/** Bundles made by this process, by compiled path. */
const bundles = new Map<string, Promise<URL>>();

/**
 * The file a worker thread runs. The built API (dist/) has the compiled `.js` beside its caller. When the
 * API runs from its TypeScript sources (Vitest's integration project), Node 20 cannot load a `.ts` file
 * in a worker thread (loader hooks do not reach it), so the worker entry is bundled once with esbuild (a
 * dev-only dependency, imported only here and only then) into node_modules/.cache, where its packages
 * still resolve from the project's node_modules.
 */
export async function workerScriptUrl(compiled: URL): Promise<URL> {
  const compiledPath = fileURLToPath(compiled);
  if (existsSync(compiledPath)) return compiled;
  // Test files of one worker process share it (Vitest's isolate: false): bundle each entry once.
  let bundled = bundles.get(compiledPath);
  if (!bundled) {
    bundled = bundleFromSource(compiledPath);
    bundles.set(compiledPath, bundled);
    bundled.catch(() => bundles.delete(compiledPath));
  }
  return bundled;
}

async function bundleFromSource(compiledPath: string): Promise<URL> {
  const source = compiledPath.replace(/\.js$/, '.ts');
  if (!existsSync(source)) throw new Error(`worker script ${compiledPath} is missing (and no ${source} to build it from)`);
  const srcRoot = source.slice(0, source.lastIndexOf('/src/'));
  const outDir = join(srcRoot, '..', 'node_modules', '.cache', 'loamline-workers');
  mkdirSync(outDir, { recursive: true });
  const outfile = join(outDir, `${source.slice(srcRoot.length + 1).replace(/[/\\]/g, '__').replace(/\.ts$/, '')}-${process.pid}.mjs`);
  const esbuild = (await import('esbuild' as string)) as {
    build(options: Record<string, unknown>): Promise<unknown>;
  };
  await esbuild.build({
    entryPoints: [source],
    outfile,
    bundle: true,
    platform: 'node',
    format: 'esm',
    target: 'node20',
    packages: 'external',
    logLevel: 'silent',
    absWorkingDir: dirname(source),
  });
  // One bundle per process (parallel test files), removed when the process ends.
  process.once('exit', () => rmSync(outfile, { force: true }));
  return pathToFileURL(outfile);
}
