import { type ChildProcess, spawn } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { createServer } from 'node:net';
import { join } from 'node:path';

import type { TestProject } from 'vitest/node';

// @ts-expect-error -- plain ESM script shared with `npm start`; no type declarations.
import { ensureApiBuilt, ensureWebBuilt, root } from '../../scripts/lib/setup.mjs';

declare module 'vitest' {
  export interface ProvidedContext {
    baseUrl: string;
  }
}

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = createServer();
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const address = server.address();
      server.close(() => resolve(typeof address === 'object' && address ? address.port : 0));
    });
  });
}

/**
 * Starts the built server (API + web app on one port, as `npm start` does) against this project's
 * database, for the browser tests.
 */
export default async function setup(project: TestProject): Promise<() => Promise<void>> {
  // `npm test` builds both before Vitest starts (LOAMLINE_BUILDS_READY); a direct `npx vitest` builds here.
  if (!process.env.LOAMLINE_BUILDS_READY) {
    ensureApiBuilt();
    ensureWebBuilt();
  }
  const port = await freePort();
  const baseUrl = `http://127.0.0.1:${port}`;
  const server: ChildProcess = spawn(process.execPath, [join(root, 'api/dist/main.js')], {
    stdio: ['ignore', 'ignore', 'inherit'],
    env: {
      ...process.env,
      NODE_ENV: 'test',
      DATABASE_URL: project.getProvidedContext().databaseUrl,
      PORT: String(port),
      HOST: '127.0.0.1',
      WEB_DIST_DIR: join(root, 'web/dist'),
      LOG_LEVEL: 'warn',
      JWT_ACCESS_SECRET: randomBytes(32).toString('hex'),
      LOCAL_SMTP_PORT: '0',
      // Every browser test signs in from 127.0.0.1 against this one server; the limits themselves are
      // tested in the integration project, so here they must not turn a later file's sign-in into a 429.
      SIGN_IN_LIMIT_PER_ADDRESS_PER_MINUTE: '10000',
      SIGN_IN_LIMIT_PER_ACCOUNT: '10000',
      SIGN_IN_LIMIT_PER_ACCOUNT_GLOBAL: '10000',
      LOCATE_RATE_LIMIT_PER_MINUTE: '10000',
    },
  });
  // Generous: on two cores busy with other test files the API can take half a minute to boot.
  const deadline = Date.now() + 90_000;
  for (;;) {
    if (server.exitCode !== null) throw new Error(`the server exited with ${server.exitCode}`);
    try {
      if ((await fetch(`${baseUrl}/api/health`)).ok) break;
    } catch {
      // not listening yet
    }
    if (Date.now() > deadline) {
      // No teardown runs when set-up throws: stop it here, or it outlives the run on its own.
      server.kill('SIGKILL');
      throw new Error('the server did not become healthy within 90 s');
    }
    await new Promise((resolve) => setTimeout(resolve, 150));
  }
  project.provide('baseUrl', baseUrl);
  return async () => {
    server.kill('SIGTERM');
    await new Promise((resolve) => (server.exitCode === null ? server.once('exit', resolve) : resolve(null)));
  };
}
