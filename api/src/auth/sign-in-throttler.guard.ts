import { Injectable } from '@nestjs/common';
import { ThrottlerException, ThrottlerGuard } from '@nestjs/throttler';

/**
 * Limits sign-in and reset requests per client address and per account (the named throttlers in
 * auth.module.ts); the 429 carries the API's common error body with a plain message.
 */
@Injectable()
export class SignInThrottlerGuard extends ThrottlerGuard {
  protected override throwThrottlingException(): Promise<void> {
    throw new ThrottlerException('Too many attempts; wait a few minutes and try again.');
  }
}
