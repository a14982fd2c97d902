import { createHash } from 'node:crypto';

import { type CallHandler, type ExecutionContext, Injectable, type NestInterceptor } from '@nestjs/common';
import type { Request, Response } from 'express';
import { map, type Observable } from 'rxjs';

/**
 * Headers of a versioned record's GET: its ETag, so a client that keeps the answer can ask again with
 * `If-None-Match` and get a 304. These answers carry personal data (homeowners' and customers' names and
 * contacts, the company's), so nothing may store them on disk: `no-store`, as every authenticated API
 * answer (issue 18 §5). A browser therefore refetches; API clients that keep answers in memory revalidate.
 */
export function setEtagHeaders(res: Response, etag: string): void {
  res.set({ ETag: etag, 'Cache-Control': 'no-store', Vary: 'Authorization' });
}

/** True when `If-None-Match` (a list, `*`, or weak forms) names `etag`. */
export function isNotModified(ifNoneMatch: string | undefined, etag: string): boolean {
  if (!ifNoneMatch) return false;
  const bare = etag.replace(/^W\//, '');
  return ifNoneMatch
    .split(',')
    .map((tag) => tag.trim())
    .some((tag) => tag === '*' || tag.replace(/^W\//, '') === bare);
}

/** A strong ETag from a hash of the JSON text of a body. */
export function contentEtag(json: string): string {
  return `"${createHash('sha1').update(json).digest('base64url')}"`;
}

/**
 * On a GET of a versioned record (job, site, company settings, profile, depth rules): an ETag from a
 * hash of the answer's JSON — it changes with the record's version and with anything else the answer
 * shows (a renamed crew lead or customer does not bump the job's version) — and 304 without a body
 * when `If-None-Match` names it. The 304 itself is Express's (`res.send` answers 304 without a body
 * when the request is fresh against the ETag set here); Nest would overwrite a status set in an
 * interceptor with the route's own.
 */
@Injectable()
export class ContentEtagInterceptor implements NestInterceptor {
  intercept(context: ExecutionContext, next: CallHandler): Observable<unknown> {
    const http = context.switchToHttp();
    const req = http.getRequest<Request>();
    const res = http.getResponse<Response>();
    return next.handle().pipe(
      map((body: unknown) => {
        if (req.method !== 'GET' || body === undefined) return body;
        setEtagHeaders(res, contentEtag(JSON.stringify(body)));
        return body;
      }),
    );
  }
}
