// `npm start`: install what is missing, start PostgreSQL on loopback, migrate, seed, build, and serve
// the API and the web app on one port. Ctrl-C / SIGTERM stops the server and then PostgreSQL.
import { spawn } from 'node:child_process';
import { join } from 'node:path';

import {
  ensureApiBuilt,
  ensureDatabase,
  ensureDebianPackages,
  ensureNpmDependencies,
  ensurePostgres,
  ensureWebBuilt,
  localSecrets,
  log,
  migrate,
  redact,
  root,
  stopPostgres,
} from './lib/setup.mjs';
import { seedDemoUnlessDisabled } from './lib/seed.mjs';

const port = process.env.PORT ?? '3000';
const host = process.env.HOST ?? '127.0.0.1';

let pg;
let server;
let stopping = false;

async function shutdown(code) {
  if (stopping) return;
  stopping = true;
  if (server && server.exitCode === null) {
    server.kill('SIGTERM');
    await new Promise((resolve) => server.once('exit', resolve));
  }
  stopPostgres(pg);
  process.exit(code);
}

process.on('SIGINT', () => void shutdown(0));
process.on('SIGTERM', () => void shutdown(0));

try {
  ensureDebianPackages({ postgres: !process.env.DATABASE_URL, chromium: true });
  ensureNpmDependencies();
  pg = ensurePostgres();
  const databaseUrl = await ensureDatabase(pg, pg.external ? undefined : 'loamline');
  log(`database ${redact(databaseUrl)}`);
  await migrate(databaseUrl);
  ensureApiBuilt();
  const demo = await seedDemoUnlessDisabled(databaseUrl);
  ensureWebBuilt();

  server = spawn(process.execPath, [join(root, 'api/dist/main.js')], {
    stdio: 'inherit',
    env: {
      ...process.env,
      ...localSecrets(),
      NODE_ENV: process.env.NODE_ENV ?? 'production',
      DATABASE_URL: databaseUrl,
      PORT: port,
      HOST: host,
      WEB_DIST_DIR: join(root, 'web/dist'),
    },
  });
  server.on('exit', (code) => {
    if (!stopping) {
      log(`server exited with ${code}`);
      void shutdown(code ?? 1);
    }
  });
  await waitForHealth(`http://${host === '0.0.0.0' ? '127.0.0.1' : host}:${port}/api/health`);
  log(`Loamline is ready at http://${host}:${port}`);
  for (const line of demo.lines) log(line);
  log('Press Ctrl-C to stop.');
} catch (error) {
  console.error(`[loamline] ${error instanceof Error ? error.message : error}`);
  await shutdown(1);
}

async function waitForHealth(url) {
  const deadline = Date.now() + 60_000;
  while (Date.now() < deadline && !stopping) {
    try {
      const res = await fetch(url);
      if (res.ok) return;
    } catch {
      // not listening yet
    }
    await new Promise((resolve) => setTimeout(resolve, 200));
  }
  if (!stopping) throw new Error(`the server did not answer ${url} within 60 s`);
}
