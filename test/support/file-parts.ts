import { readdirSync } from 'node:fs';
import { basename, dirname } from 'node:path';
import { fileURLToPath } from 'node:url';

import { expect } from 'vitest';

/**
 * Splits the table of a long table-driven test file (authorization-matrix, bad-input) into parts that
 * run side by side in separate workers, each against its own database: `x.int.spec.ts` runs part 1 and
 * every `x.part-<n>.int.spec.ts` beside it (a file that only imports `./x.int.spec.js`) runs part n.
 * Entries are dealt out in turn (entry i goes to part i mod count + 1), so each part gets a similar mix;
 * whatever the file does outside the table (beforeAll, whole-API checks) runs in every part.
 *
 * To run every part of one file, name it as a filter rather than a path:
 * `npx vitest run --project integration authorization-matrix`.
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
  return entries.filter((_, i) => i % count === index - 1);
}
