import 'reflect-metadata';

import type { ModuleMetadata } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import type { NestExpressApplication } from '@nestjs/platform-express';
import { Test, type TestingModuleBuilder } from '@nestjs/testing';
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
