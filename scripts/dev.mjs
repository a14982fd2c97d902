// `npm run dev`: PostgreSQL as for `npm start`, the API compiled in watch mode and restarted on change
// (port API_PORT, default 3001), and Vite's dev server with HMR (port PORT, default 3000) proxying /api.
import { spawn } from 'node:child_process';
import { join } from 'node:path';

import {
  ensureApiBuilt,
  ensureDatabase,
  ensureDebianPackages,
  ensureNpmDependencies,
  ensurePostgres,
  localSecrets,
  log,
  migrate,
  root,
  stopPostgres,
} from './lib/setup.mjs';
import { seedDemoUnlessDisabled } from './lib/seed.mjs';

const apiPort = process.env.API_PORT ?? '3001';
const webPort = process.env.PORT ?? '3000';
const children = [];
let pg;

function start(command, args, options) {
  const child = spawn(command, args, { stdio: 'inherit', ...options });
  children.push(child);
  return child;
}

function shutdown() {
  for (const child of children) if (child.exitCode === null) child.kill('SIGTERM');
  stopPostgres(pg);
  process.exit(0);
}
process.on('SIGINT', shutdown);
process.on('SIGTERM', shutdown);

ensureDebianPackages({ postgres: !process.env.DATABASE_URL });
ensureNpmDependencies();
pg = ensurePostgres();
const databaseUrl = await ensureDatabase(pg, pg.external ? undefined : 'loamline');
await migrate(databaseUrl);
ensureApiBuilt();
const demo = await seedDemoUnlessDisabled(databaseUrl);

start('npx', ['tsc', '-p', 'api/tsconfig.build.json', '--watch', '--preserveWatchOutput'], { cwd: root });
start(process.execPath, ['--watch-path', join(root, 'api/dist'), join(root, 'api/dist/main.js')], {
  cwd: root,
  env: { ...process.env, ...localSecrets(), NODE_ENV: 'development', DATABASE_URL: databaseUrl, PORT: apiPort, LOG_FORMAT: 'text' },
});
start('npx', ['vite', '--port', webPort, '--strictPort', '--host', '127.0.0.1'], {
  cwd: join(root, 'web'),
  env: { ...process.env, API_PORT: apiPort },
});
log(`dev server: http://127.0.0.1:${webPort} (API on ${apiPort})`);
for (const line of demo.lines) log(line);
