import { Injectable } from '@nestjs/common';
import { ThrottlerException, ThrottlerGuard } from '@nestjs/throttler';

/**
 * Limits public locate requests per client address (the `locate` throttler of locate.module.ts); the
 * 429 carries the API's common error body with a plain message.
 */
@Injectable()
export class LocateThrottlerGuard extends ThrottlerGuard {
  protected override throwThrottlingException(): Promise<void> {
    throw new ThrottlerException('Too many requests for locate maps from this address; wait a minute and try again.');
  }
}
