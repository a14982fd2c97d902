import { Module } from '@nestjs/common';
import { ConfigModule } from '@nestjs/config';

import { readEnv } from './config/env.schema.js';
import { DbModule } from './db/db.module.js';
import { HealthModule } from './health/health.module.js';

@Module({
  imports: [
    ConfigModule.forRoot({ isGlobal: true, ignoreEnvFile: true, validate: (env) => readEnv(env) }),
    DbModule,
    HealthModule,
  ],
})
export class AppModule {}
