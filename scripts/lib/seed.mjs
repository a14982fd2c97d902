// The demo seed is TypeScript compiled with the API (api/src/db/seed/demo-seed.ts), so it shares the
// API's schema and as-built mapping; call this after ensureApiBuilt(). Running it again changes nothing.
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';

import { log, root } from './setup.mjs';

/** Seeds the invented demo company, its users and jobs into `databaseUrl`; returns lines to print. */
export async function seedDemo(databaseUrl) {
  const { seedDemo: seed } = await import(pathToFileURL(join(root, 'api/dist/db/seed/demo-seed.js')).href);
  return seed(databaseUrl);
}

/**
 * Whether `npm start` / `npm run dev` seed the demo company, whose password is published in the README:
 * LOAMLINE_SEED_DEMO=1 always, LOAMLINE_SEED_DEMO=0 never; unset, everywhere except NODE_ENV=production,
 * so a production database never gets accounts anyone can sign in to.
 * @returns {{ seed: true } | { seed: false, reason: string }}
 */
export function demoSeedDecision(env = process.env) {
  const flag = env.LOAMLINE_SEED_DEMO?.trim();
  if (flag === '1') return { seed: true };
  if (flag === '0') return { seed: false, reason: 'LOAMLINE_SEED_DEMO=0' };
  if (flag) throw new Error(`LOAMLINE_SEED_DEMO must be 1 (seed the demo company) or 0 (do not), not "${flag}"`);
  if (env.NODE_ENV === 'production') {
    return { seed: false, reason: 'NODE_ENV=production (set LOAMLINE_SEED_DEMO=1 to seed the demo company anyway)' };
  }
  return { seed: true };
}

/** seedDemo() when demoSeedDecision() allows it; otherwise logs why it was skipped and returns no lines. */
export async function seedDemoUnlessDisabled(databaseUrl, env = process.env) {
  const decision = demoSeedDecision(env);
  if (!decision.seed) {
    log(`demo seed skipped: ${decision.reason}`);
    return { lines: [] };
  }
  return seedDemo(databaseUrl);
}
