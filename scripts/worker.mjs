// `npm run worker`: a standalone packet render worker. It shares the pg-boss queue (schema `pgboss`)
// with the API and with any other worker on the same database; start as many as the machine allows.
// Uses the same database as `npm start` (the local cluster, or DATABASE_URL), builds the API if needed,
// and runs a Nest application context with only what rendering needs (no HTTP server).
import { pathToFileURL } from 'node:url';
import { join } from 'node:path';

import { ensureApiBuilt, ensureDatabase, ensureNpmDependencies, ensurePostgres, localSecrets, log, migrate, redact, root } from './lib/setup.mjs';

ensureNpmDependencies();
const pg = ensurePostgres();
const databaseUrl = await ensureDatabase(pg, pg.external ? undefined : 'loamline');
await migrate(databaseUrl);
ensureApiBuilt();
Object.assign(process.env, { ...localSecrets(), ...process.env, DATABASE_URL: databaseUrl });

await import('reflect-metadata');
const { NestFactory } = await import('@nestjs/core');
const { PacketWorkerModule } = await import(pathToFileURL(join(root, 'api/dist/packets/packet-worker.module.js')).href);
const app = await NestFactory.createApplicationContext(PacketWorkerModule);
app.enableShutdownHooks();
log(`packet worker running against ${redact(databaseUrl)}; Ctrl-C stops it after the renders in progress`);
