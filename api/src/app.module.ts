import { Module } from '@nestjs/common';
import { ConfigModule } from '@nestjs/config';
import { APP_GUARD } from '@nestjs/core';

import { AnalysisModule } from './analysis/analysis.module.js';
import { AuditModule } from './audit/audit.module.js';
import { AuthModule } from './auth/auth.module.js';
import { JwtAuthGuard } from './common/guards/jwt-auth.guard.js';
import { RolesGuard } from './common/guards/roles.guard.js';
import { readEnv } from './config/env.schema.js';
import { CustomersModule } from './customers/customers.module.js';
import { DbModule } from './db/db.module.js';
import { DeliveryModule } from './delivery/delivery.module.js';
import { HealthModule } from './health/health.module.js';
import { IdempotencyModule } from './idempotency/idempotency.module.js';
import { JobsModule } from './jobs/jobs.module.js';
import { LocateModule } from './locate/locate.module.js';
import { MailModule } from './mail/mail.module.js';
import { PacketsModule } from './packets/packets.module.js';
import { PhotosModule } from './photos/photos.module.js';
import { PortalModule } from './portal/portal.module.js';
import { SettingsModule } from './settings/settings.module.js';
import { SignupModule } from './signup/signup.module.js';
import { SitesModule } from './sites/sites.module.js';
import { StorageModule } from './storage/storage.module.js';
import { UsersModule } from './users/users.module.js';

@Module({
  imports: [
    ConfigModule.forRoot({ isGlobal: true, ignoreEnvFile: true, validate: (env) => readEnv(env) }),
    DbModule,
    StorageModule,
    AuditModule,
    MailModule,
    HealthModule,
    AuthModule,
    IdempotencyModule,
    UsersModule,
    AnalysisModule,
    CustomersModule,
    SitesModule,
    JobsModule,
    PacketsModule,
    PhotosModule,
    LocateModule,
    DeliveryModule,
    PortalModule,
    SettingsModule,
    SignupModule,
  ],
  providers: [
    // Default-deny: every route needs a signed-in user unless marked @Public(); then @Roles() applies.
    { provide: APP_GUARD, useClass: JwtAuthGuard },
    { provide: APP_GUARD, useClass: RolesGuard },
  ],
})
export class AppModule {}
