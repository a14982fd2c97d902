import 'reflect-metadata';

import { ConsoleLogger, type LogLevel } from '@nestjs/common';
import { NestFactory } from '@nestjs/core';
import type { NestExpressApplication } from '@nestjs/platform-express';

import { AppModule } from './app.module.js';
import { configureApp } from './app.setup.js';
import { readEnv } from './config/env.schema.js';

const LEVELS: LogLevel[] = ['fatal', 'error', 'warn', 'log', 'debug', 'verbose'];

const env = readEnv();
const logger = new ConsoleLogger('Loamline', {
  json: env.LOG_FORMAT === 'json',
  logLevels: LEVELS.slice(0, LEVELS.indexOf(env.LOG_LEVEL) + 1),
});
const app = await NestFactory.create<NestExpressApplication>(AppModule, { logger });
configureApp(app, env);
app.enableShutdownHooks();
await app.listen(env.PORT, env.HOST);
logger.log(`listening on ${await app.getUrl()}`, 'Bootstrap');
