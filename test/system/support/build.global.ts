// @ts-expect-error -- plain ESM script shared with `npm start`; no type declarations.
import { ensureApiBuilt } from '../../../scripts/lib/setup.mjs';

/**
 * The system tests spawn the built API (api/dist/main.js) and `npm run worker`, exactly as they run in
 * production; build the API first when its sources changed (as `npm test` does before Vitest).
 */
export default function setup(): void {
  // `npm test` has built it just before Vitest started (LOAMLINE_BUILDS_READY).
  if (!process.env.LOAMLINE_BUILDS_READY) ensureApiBuilt();
}
