import { Module } from '@nestjs/common';
import { APP_INTERCEPTOR } from '@nestjs/core';

import { IdempotencyInterceptor } from './idempotency.interceptor.js';
import { IdempotencyRepository } from './idempotency.repository.js';

/** `Idempotency-Key` on every signed-in write (see IdempotencyInterceptor). */
@Module({
  providers: [IdempotencyRepository, { provide: APP_INTERCEPTOR, useClass: IdempotencyInterceptor }],
})
export class IdempotencyModule {}
