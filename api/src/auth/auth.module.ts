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
import { PasswordResetRequests } from './password-reset-requests.js';

/** The account a sign-in or reset request names (lower-cased), or '' when it names none. */
function accountOf(req: Record<string, unknown>): string {
  const email = ((req as unknown as Request).body as { email?: unknown } | undefined)?.email;
  return typeof email === 'string' ? email.trim().toLowerCase().slice(0, 254) : '';
}

/**
 * The account together with the client address: guessing one account's password from one place is
 * limited tightly, while someone naming the account from elsewhere cannot lock its owner out.
 */
function accountAtAddressTracker(req: Record<string, unknown>): Promise<string> {
  return Promise.resolve(`${accountOf(req)}\n${(req as unknown as Request).ip ?? ''}`);
}

/** The account alone: a higher ceiling across all addresses (password guessing spread over many). */
function accountTracker(req: Record<string, unknown>): Promise<string> {
  return Promise.resolve(accountOf(req));
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
          // Per account and address: by default the tenth attempt within 15 minutes is refused with 429.
          {
            name: 'account',
            ttl: 15 * 60_000,
            limit: config.get('SIGN_IN_LIMIT_PER_ACCOUNT', { infer: true }),
            getTracker: accountAtAddressTracker,
          },
          // Per account from every address together: a higher ceiling.
          {
            name: 'account-global',
            ttl: 15 * 60_000,
            limit: config.get('SIGN_IN_LIMIT_PER_ACCOUNT_GLOBAL', { infer: true }),
            getTracker: accountTracker,
          },
        ],
      }),
    }),
  ],
  controllers: [AuthController],
  providers: [
    AuthService,
    AuthRepository,
    PasswordHasher,
    LocalStrategy,
    JwtStrategy,
    PasswordResetRequests,
  ],
  exports: [AuthService, PasswordHasher],
})
export class AuthModule {}
