import { createHash } from 'node:crypto';

import {
  BadRequestException,
  ConflictException,
  HttpStatus,
  Injectable,
  UnprocessableEntityException,
  type CallHandler,
  type ExecutionContext,
  type NestInterceptor,
} from '@nestjs/common';
import { HTTP_CODE_METADATA } from '@nestjs/common/constants.js';
import { Reflector } from '@nestjs/core';
import type { Request, Response } from 'express';
import { from, lastValueFrom, type Observable } from 'rxjs';

import type { AuthUser } from '../common/decorators/current-user.decorator.js';

import { IdempotencyRepository } from './idempotency.repository.js';

export const IDEMPOTENCY_HEADER = 'Idempotency-Key';
/** Letters, digits and `-_.:`, as a UUID or a short client id needs; 8 to 128 characters. */
export const IDEMPOTENCY_KEY_PATTERN = /^[A-Za-z0-9_.:-]{8,128}$/;
/**
 * A claim whose request never finished (the process died between the write and keeping its answer)
 * is given up after this long, and the request runs again; the route's own version check (If-Match)
 * still refuses a replacing write made twice.
 */
export const ABANDONED_CLAIM_SECONDS = 120;

const WRITE_METHODS = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);

/**
 * `Idempotency-Key` on any signed-in write: the phone's offline queue (web, features/jobs) sends each
 * queued change with a key made once when it was queued. A change whose answer was lost (the signal
 * dropped after the server wrote it) is sent again with the same key and gets the kept answer back
 * (header `Idempotent-Replayed: true`) instead of being written twice.
 *
 * - keys are per user and kept 24 hours (idempotency_keys);
 * - only a 2xx answer is kept: after a 412 version conflict or a 400 the key is free again, so the
 *   crew's "Keep mine and save" re-sends the same change under the same key;
 * - the same key with another method, path or body: 422 `IDEMPOTENCY_KEY_REUSED`;
 * - the same key while its first request is still running: 409 `IDEMPOTENCY_IN_PROGRESS` (try later);
 * - a malformed key: 400 naming the header. No header: nothing changes. Multipart photo uploads are
 *   left to their own `clientUploadId`.
 */
@Injectable()
export class IdempotencyInterceptor implements NestInterceptor {
  constructor(
    private readonly keys: IdempotencyRepository,
    private readonly reflector: Reflector,
  ) {}

  intercept(context: ExecutionContext, next: CallHandler): Observable<unknown> {
    if (context.getType() !== 'http') return next.handle();
    const req = context.switchToHttp().getRequest<Request & { user?: AuthUser }>();
    const header = req.headers['idempotency-key'];
    if (header === undefined || !WRITE_METHODS.has(req.method) || !req.user) return next.handle();
    // Photo uploads (multipart) carry their own per-file clientUploadId, and their body is not parsed yet here.
    if (req.is('multipart/form-data')) return next.handle();
    const key = Array.isArray(header) ? header.join(',') : header;
    if (!IDEMPOTENCY_KEY_PATTERN.test(key)) {
      throw new BadRequestException({
        message: `${IDEMPOTENCY_HEADER}: use 8 to 128 letters, digits or - _ . : (a UUID works)`,
        code: 'VALIDATION_FAILED',
        issues: [{ path: IDEMPOTENCY_HEADER, message: 'use 8 to 128 letters, digits or - _ . : (a UUID works)' }],
      });
    }
    const res = context.switchToHttp().getResponse<Response>();
    const defaultStatus = this.reflector.get<number | undefined>(HTTP_CODE_METADATA, context.getHandler()) ?? (req.method === 'POST' ? HttpStatus.CREATED : HttpStatus.OK);
    return from(this.run(req.user.id, key, req, res, defaultStatus, next));
  }

  private async run(userId: string, key: string, req: Request, res: Response, defaultStatus: number, next: CallHandler): Promise<unknown> {
    const claim = { userId, key, method: req.method, path: req.originalUrl.split('?')[0] ?? req.path, requestHash: hashBody(req.body) };
    if (!(await this.keys.claim(claim))) {
      const kept = await this.keys.find(userId, key);
      if (kept && (kept.method !== claim.method || kept.path !== claim.path || kept.requestHash !== claim.requestHash)) {
        throw new UnprocessableEntityException({
          message: `${IDEMPOTENCY_HEADER}: this key was used for another request; make a new key for each change`,
          code: 'IDEMPOTENCY_KEY_REUSED',
        });
      }
      if (kept && kept.statusCode !== null) {
        res.setHeader('Idempotent-Replayed', 'true');
        return kept.responseBody ?? undefined;
      }
      if (kept && kept.ageSeconds < ABANDONED_CLAIM_SECONDS) {
        throw new ConflictException({ message: 'The same change is still being saved; try again in a moment.', code: 'IDEMPOTENCY_IN_PROGRESS' });
      }
      // Abandoned (or expired between the claim and the look-up): take it over.
      await this.keys.release(userId, key);
      if (!(await this.keys.claim(claim))) {
        throw new ConflictException({ message: 'The same change is still being saved; try again in a moment.', code: 'IDEMPOTENCY_IN_PROGRESS' });
      }
    }
    let body: unknown;
    try {
      body = await lastValueFrom(next.handle(), { defaultValue: undefined });
    } catch (error) {
      await this.keys.release(userId, key).catch(() => undefined);
      throw error;
    }
    // A handler may set its own status (res.status with passthrough); otherwise the route's default.
    const status = res.statusCode >= 200 && res.statusCode < 300 && res.statusCode !== 200 ? res.statusCode : defaultStatus;
    await this.keys.complete(userId, key, status, body);
    return body;
  }
}

function hashBody(body: unknown): string {
  return createHash('sha256').update(JSON.stringify(body ?? null)).digest('hex');
}
