// The demo seed is TypeScript compiled with the API (api/src/db/seed/demo-seed.ts), so it shares the
// API's schema and as-built mapping; call this after ensureApiBuilt(). Running it again changes nothing.
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';

import { log, root } from './setup.mjs';

/** Seeds the invented demo company, its users and jobs into `databaseUrl`; returns lines to print. */
export async function seedDemo(databaseUrl) {
  const { seedDemo: seed } = await import(pathToFileURL(join(root, 'api/dist/db/seed/demo-seed.js')).href);
  // The demo logo goes where the API keeps uploads (the same settings and defaults as api/src/config/env.schema.ts).
  const { createObjectStorage } = await import(pathToFileURL(join(root, 'api/dist/storage/storage.module.js')).href);
  const env = process.env;
  const storage = createObjectStorage({
    STORAGE_DRIVER: env.STORAGE_DRIVER === 's3' ? 's3' : 'disk',
    UPLOADS_DIR: env.UPLOADS_DIR || '.data/uploads',
    S3_BUCKET: env.S3_BUCKET,
    S3_REGION: env.S3_REGION || 'us-east-1',
    S3_ENDPOINT: env.S3_ENDPOINT,
    S3_ACCESS_KEY_ID: env.S3_ACCESS_KEY_ID,
    S3_SECRET_ACCESS_KEY: env.S3_SECRET_ACCESS_KEY,
    S3_FORCE_PATH_STYLE: env.S3_FORCE_PATH_STYLE === 'true',
  });
  return seed(databaseUrl, { storage });
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
