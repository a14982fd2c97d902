import { Module } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { JwtModule } from '@nestjs/jwt';
import { PassportModule } from '@nestjs/passport';
import { ThrottlerModule } from '@nestjs/throttler';
import type { Request } from 'express';

import type { Env } from '../config/env.schema.js';
import { OutgoingMailModule } from '../outgoing-mail/outgoing-mail.module.js';
import { AuthController } from './auth.controller.js';
import { AuthRepository } from './auth.repository.js';
import { AuthService } from './auth.service.js';
import { JwtStrategy } from './jwt.strategy.js';
import { LocalStrategy } from './local.strategy.js';
import { PasswordHasher } from './password-hasher.js';

/** The account a sign-in or reset request is about, so guessing one account's password is limited too. */
function accountTracker(req: Record<string, unknown>): Promise<string> {
  const email = ((req as unknown as Request).body as { email?: unknown } | undefined)?.email;
  return Promise.resolve(typeof email === 'string' ? email.trim().toLowerCase().slice(0, 254) : '');
}

@Module({
  imports: [
    OutgoingMailModule,
    PassportModule,
    JwtModule.registerAsync({
      inject: [ConfigService],
      useFactory: (config: ConfigService<Env, true>) => ({
        secret: config.get('JWT_ACCESS_SECRET', { infer: true }),
        signOptions: { algorithm: 'HS256' },
      }),
    }),
    ThrottlerModule.forRootAsync({
      inject: [ConfigService],
      useFactory: (config: ConfigService<Env, true>) => ({
        throttlers: [
          // Per client address: generous, so an office behind one address is not locked out.
          { name: 'address', ttl: 60_000, limit: config.get('SIGN_IN_LIMIT_PER_ADDRESS_PER_MINUTE', { infer: true }) },
          // Per account: by default the tenth attempt within 15 minutes is refused with 429.
          {
            name: 'account',
            ttl: 15 * 60_000,
            limit: config.get('SIGN_IN_LIMIT_PER_ACCOUNT', { infer: true }),
            getTracker: accountTracker,
          },
        ],
      }),
    }),
  ],
  controllers: [AuthController],
  providers: [AuthService, AuthRepository, PasswordHasher, LocalStrategy, JwtStrategy],
  exports: [AuthService, PasswordHasher],
})
export class AuthModule {}
