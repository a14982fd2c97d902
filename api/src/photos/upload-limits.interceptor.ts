import { type CallHandler, type ExecutionContext, HttpException, Injectable, type NestInterceptor } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { catchError, type Observable, throwError } from 'rxjs';

import type { Env } from '../config/env.schema.js';
import { uploadTooLarge } from './photo-errors.js';

const megabytes = (bytes: number) => `${Math.round((bytes / 1024 / 1024) * 10) / 10} MB`;

/**
 * Wraps the Multer interceptor: its size and count errors become 413s that name the limit and its
 * setting (Nest reports too many files as a bare 400 "Too many files"). Multer keeps files in memory
 * and drops them on error, so a refused request stores nothing.
 */
@Injectable()
export class UploadLimitsInterceptor implements NestInterceptor {
  constructor(private readonly config: ConfigService<Env, true>) {}

  intercept(_context: ExecutionContext, next: CallHandler): Observable<unknown> {
    return next.handle().pipe(
      catchError((error: unknown) => {
        const code = error instanceof HttpException ? (error.cause as { code?: unknown } | undefined)?.code : undefined;
        if (code === 'LIMIT_FILE_SIZE') {
          const limit = this.config.get('UPLOAD_MAX_FILE_BYTES', { infer: true });
          return throwError(() =>
            uploadTooLarge(`A photo is larger than the ${megabytes(limit)} allowed per file (UPLOAD_MAX_FILE_BYTES). Nothing was stored.`, 'FILE_TOO_LARGE'),
          );
        }
        if (code === 'LIMIT_FILE_COUNT') {
          const limit = this.config.get('UPLOAD_MAX_FILES', { infer: true });
          return throwError(() =>
            uploadTooLarge(`At most ${limit} photos may be sent in one upload (UPLOAD_MAX_FILES). Nothing was stored; send the rest separately.`, 'TOO_MANY_FILES'),
          );
        }
        return throwError(() => error);
      }),
    );
  }
}
