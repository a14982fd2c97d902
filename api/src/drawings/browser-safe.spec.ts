import { readFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

import { describe, expect, it } from 'vitest';

/**
 * The web app imports the drawings (`@drawings/*`), so nothing reachable from the drawing entry points
 * may need Node: no `node:` modules, no svgdom (node-svg-window.ts is the server's canvas, kept out),
 * and elkjs only as its bundled, worker-free build.
 */
const HERE = dirname(fileURLToPath(import.meta.url));
const ENTRIES = ['site-plan.ts', 'wiring-schematic.ts', 'depth-profile.ts', 'job-drawings.ts'];
const NODE_BUILTINS = /^(node:|fs$|path$|url$|os$|crypto$|child_process$|stream$|buffer$)/;

function importsOf(file: string): string[] {
  const source = readFileSync(file, 'utf8');
  return [...source.matchAll(/^\s*(?:import|export)\s[^'"]*?from\s+['"]([^'"]+)['"]/gm)].map((m) => m[1]!);
}

/** Every module reachable from `entry` through relative imports, with the bare specifiers they use. */
function reachable(entry: string): { files: Set<string>; packages: Set<string> } {
  const files = new Set<string>();
  const packages = new Set<string>();
  const queue = [resolve(HERE, entry)];
  while (queue.length > 0) {
    const file = queue.pop()!;
    if (files.has(file)) continue;
    files.add(file);
    for (const specifier of importsOf(file)) {
      if (specifier.startsWith('.')) queue.push(join(dirname(file), specifier.replace(/\.js$/, '.ts')));
      else packages.add(specifier);
    }
  }
  return { files, packages };
}

describe('drawings shared with the browser', () => {
  it.each(ENTRIES)('should reach no Node-only module from %s', (entry) => {
    const { files, packages } = reachable(entry);
    expect([...files].some((f) => f.endsWith('node-svg-window.ts'))).toBe(false);
    expect([...packages].filter((p) => NODE_BUILTINS.test(p) || p === 'svgdom')).toEqual([]);
    expect([...packages].filter((p) => p.startsWith('elkjs') && p !== 'elkjs/lib/elk.bundled.js')).toEqual([]);
  });

  it('should notice a Node import (the check itself can fail)', () => {
    const { packages } = reachable('node-svg-window.ts');
    expect(packages.has('svgdom')).toBe(true);
  });
});
