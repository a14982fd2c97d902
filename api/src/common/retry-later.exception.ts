import { HttpException } from '@nestjs/common';

/**
 * An answer that asks the client to come back later (429 or 503): the error filter sends
 * `Retry-After: <retryAfterSeconds>` with the usual error body.
 */
export class RetryLaterException extends HttpException {
  constructor(
    status: 429 | 503,
    body: { message: string; code: string },
    readonly retryAfterSeconds: number,
  ) {
    super(body, status);
  }
}
