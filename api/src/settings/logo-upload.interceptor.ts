import { BadRequestException, type CallHandler, type ExecutionContext, HttpException, Injectable, type NestInterceptor } from '@nestjs/common';
import { catchError, type Observable, throwError } from 'rxjs';

import { LOGO_MAX_BYTES } from '../domain/company/company-profile.schema.js';
import { logoTooLarge } from './logo-processor.js';

/**
 * Wraps Multer on the logo upload so that its errors name the `file` field: 413 with the limit for a
 * file that is too big, 400 for more than one file or a file under another name. Multer keeps the
 * file in memory and drops it on error, so a refused request stores nothing.
 */
@Injectable()
export class LogoUploadInterceptor implements NestInterceptor {
  intercept(_context: ExecutionContext, next: CallHandler): Observable<unknown> {
    return next.handle().pipe(
      catchError((error: unknown) => {
        const code = error instanceof HttpException ? (error.cause as { code?: unknown } | undefined)?.code : undefined;
        if (code === 'LIMIT_FILE_SIZE') {
          return throwError(() => logoTooLarge(`the logo is larger than the ${LOGO_MAX_BYTES / 1024 / 1024} MB allowed. Nothing was stored.`, 'FILE_TOO_LARGE'));
        }
        if (code === 'LIMIT_FILE_COUNT' || code === 'LIMIT_UNEXPECTED_FILE') {
          const message = 'send exactly one image, in the multipart field "file"';
          return throwError(() => new BadRequestException({ message: `file: ${message}`, code: 'VALIDATION_FAILED', issues: [{ path: 'file', message }] }));
        }
        return throwError(() => error);
      }),
    );
  }
}
