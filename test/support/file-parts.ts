import { readdirSync } from 'node:fs';
import { basename, dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

import { expect, inject } from 'vitest';

/** Whether Vitest's file filters of this run (substrings of the path; none: every file) select any of `files`. */
function partsAreInThisRun(files: string[]): boolean {
  const filters = inject('testFileFilters') ?? [];
  if (files.length === 0) return false;
  return filters.length === 0 || files.some((file) => filters.some((filter) => file.includes(filter)));
}

/**
 * Splits the table of a long table-driven test file (authorization-matrix, bad-input) into parts that
 * run side by side in separate workers, each against its own database: `x.int.spec.ts` runs part 1 and
 * every `x.part-<n>.int.spec.ts` beside it (a file that only imports `./x.int.spec.js`) runs part n.
 * Entries are dealt out in turn (entry i goes to part i mod count + 1), so each part gets a similar mix;
 * whatever the file does outside the table (beforeAll, whole-API checks) runs in every part.
 *
 * Named by its path alone (`npx vitest run test/api/x.int.spec.ts`), the main file runs the whole
 * table; a name filter (`npx vitest run --project integration authorization-matrix`) or a full run
 * selects the part files too, and each runs its share.
 */
export function thisPartOf<T>(mainFileUrl: string, entries: readonly T[]): T[] {
  const mainFile = fileURLToPath(mainFileUrl);
  const stem = basename(mainFile).replace(/\.int\.spec\.ts$/, '');
  const partPattern = new RegExp(`^${stem.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}\\.part-(\\d+)\\.int\\.spec\\.ts$`);
  const parts = readdirSync(dirname(mainFile))
    .map((name) => partPattern.exec(name)?.[1])
    .filter((n): n is string => n !== undefined)
    .map(Number);
  const count = 1 + parts.length;
  const expected = Array.from({ length: parts.length }, (_, i) => i + 2);
  if (parts.sort((a, b) => a - b).join() !== expected.join()) {
    throw new Error(`${stem}: the part files must be numbered 2 to ${count} (found ${parts.join(', ')})`);
  }
  const running = expect.getState().testPath ?? mainFile;
  const index = running === mainFile ? 1 : Number(partPattern.exec(basename(running))?.[1]);
  if (!index) throw new Error(`${basename(running)} is not a part of ${basename(mainFile)}`);
  // The main file named by its path alone (`npx vitest run test/api/x.int.spec.ts`): no part file is in
  // this run, so the main file runs the whole table.
  if (index === 1 && !partsAreInThisRun(parts.map((n) => join(dirname(mainFile), `${stem}.part-${n}.int.spec.ts`)))) return [...entries];
  return entries.filter((_, i) => i % count === index - 1);
}
