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
  importProjectPackage,
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
      // The built-in mail capture server is only used from inside the process: any free port will do.
      LOCAL_SMTP_PORT: process.env.LOCAL_SMTP_PORT ?? '0',
    },
  });
  server.on('exit', (code) => {
    if (!stopping) {
      log(`server exited with ${code}`);
      void shutdown(code ?? 1);
    }
  });
  await waitForHealth(`http://${host === '0.0.0.0' ? '127.0.0.1' : host}:${port}/api/health`);
  const base = `http://${host}:${port}`;
  log(`Loamline is ready at ${base}`);
  for (const line of demo.lines) log(line);
  log(mailLine(process.env.SMTP_URL));
  if (!(await hasCompany(databaseUrl))) {
    const mode = process.env.SIGNUP_MODE ?? 'open';
    log(
      mode === 'closed'
        ? 'no company exists yet; sign-up is closed (SIGNUP_MODE=closed): create one with npm run company:create -- --name "…" --admin-email …'
        : `no company exists yet: create the first one at ${base}/sign-up${mode === 'invite' ? ' (with a code from npm run company:invite)' : ''}`,
    );
  }
  log('Press Ctrl-C to stop.');
} catch (error) {
  console.error(`[loamline] ${error instanceof Error ? error.message : error}`);
  await shutdown(1);
}

/** Where mail goes, without the SMTP service's credentials. */
function mailLine(smtpUrl) {
  if (!smtpUrl) return 'mail is captured locally: read it on the Outbox page (set SMTP_URL to deliver it)';
  try {
    const url = new URL(smtpUrl);
    return `mail goes to ${url.protocol}//${url.hostname}${url.port ? `:${url.port}` : ''}`;
  } catch {
    return 'mail goes to the SMTP_URL service';
  }
}

async function hasCompany(databaseUrl) {
  const { Client } = await importProjectPackage('pg');
  const client = new Client({ connectionString: databaseUrl });
  await client.connect();
  try {
    return (await client.query('select exists (select 1 from companies) as any')).rows[0].any;
  } finally {
    await client.end();
  }
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
