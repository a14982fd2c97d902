import 'reflect-metadata';

import type { ModuleMetadata } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import type { NestExpressApplication } from '@nestjs/platform-express';
import { Test, type TestingModuleBuilder } from '@nestjs/testing';
import pg from 'pg';
import { AppModule } from '../../api/src/app.module.js';
import { configureApp } from '../../api/src/app.setup.js';
import { readEnv } from '../../api/src/config/env.schema.js';

export interface TestAppOptions {
  /** Adjust the module before compiling it (e.g. override a provider). */
  override?: (builder: TestingModuleBuilder) => TestingModuleBuilder;
  imports?: ModuleMetadata['imports'];
}

/**
 * The real AppModule against this project's test database (environment from test/setup/api-env.ts),
 * configured exactly like main.ts.
 */
export async function createTestApp(options: TestAppOptions = {}): Promise<NestExpressApplication> {
  await dropQueuedJobsOfEarlierFiles();
  // ConfigModule.forRoot reads the environment once, when AppModule is first imported; the files of a
  // worker share that import (isolate: false), so each app gets the environment as it is now (a file may
  // set its own limits before starting its app).
  let builder = Test.createTestingModule({ imports: [AppModule, ...(options.imports ?? [])] })
    .overrideProvider(ConfigService)
    .useValue(new ConfigService(readEnv(process.env)));
  if (options.override) builder = options.override(builder);
  const moduleRef = await builder.compile();
  const app = moduleRef.createNestApplication<NestExpressApplication>({ logger: ['error'] });
  configureApp(app, readEnv(process.env));
  await app.init();
  return app;
}

/**
 * The integration files of a worker share one database and run one after another, and every test app
 * works that database's queues: a packet or an e-mail an earlier file queued and left would otherwise be
 * rendered or sent by this file's app, in the middle of its tests (it wrote into another spec's storage
 * snapshot, and added queries to a fixed query count). Each file's app starts with no job waiting; jobs a
 * file queues itself are untouched, and so are jobs being worked (an earlier app stops only when its
 * jobs in flight have finished).
 */
async function dropQueuedJobsOfEarlierFiles(): Promise<void> {
  const client = new pg.Client({ connectionString: process.env.DATABASE_URL });
  await client.connect();
  try {
    const { rows } = await client.query<{ present: boolean }>(`select to_regclass('pgboss.job') is not null as present`);
    if (rows[0]?.present) await client.query(`delete from pgboss.job where state in ('created', 'retry')`);
  } finally {
    await client.end();
  }
}
