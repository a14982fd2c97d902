// The demo seed is TypeScript compiled with the API (api/src/db/seed/demo-seed.ts), so it shares the
// API's schema and as-built mapping; call this after ensureApiBuilt(). Running it again changes nothing.
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';

import { root } from './setup.mjs';

/** Seeds the invented demo company, its users and jobs into `databaseUrl`; returns lines to print. */
export async function seedDemo(databaseUrl) {
  const { seedDemo: seed } = await import(pathToFileURL(join(root, 'api/dist/db/seed/demo-seed.js')).href);
  return seed(databaseUrl);
}
