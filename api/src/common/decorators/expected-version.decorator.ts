import { BadRequestException, createParamDecorator, type ExecutionContext, HttpException, HttpStatus } from '@nestjs/common';
import type { Request } from 'express';

/** `7`, `"7"` or `W/"7"`: the job version as an entity tag. */
const IF_MATCH = /^(?:W\/)?"?(\d{1,9})"?$/;

/** What the version belongs to: `@ExpectedVersion()` a job, `@ExpectedVersion('site')` a site. */
export type VersionedThing = 'job' | 'site';

function fromIfMatch(header: string | undefined, thing: VersionedThing): number | undefined {
  if (header === undefined || header.trim() === '') return undefined;
  const match = IF_MATCH.exec(header.trim());
  if (!match) {
    throw new BadRequestException({
      message: `If-Match: must be the ${thing} version you last read, e.g. If-Match: "7"`,
      code: 'VALIDATION_FAILED',
      issues: [{ path: 'If-Match', message: `must be the ${thing} version, e.g. "7"` }],
    });
  }
  return Number(match[1]);
}

function fromBody(body: unknown, thing: VersionedThing): number | undefined {
  if (typeof body !== 'object' || body === null || !('expectedVersion' in body)) return undefined;
  const value = (body as { expectedVersion: unknown }).expectedVersion;
  if (typeof value === 'number' && Number.isInteger(value) && value >= 1) return value;
  throw new BadRequestException({
    message: `expectedVersion: must be the ${thing} version you last read (a whole number from 1)`,
    code: 'VALIDATION_FAILED',
    issues: [{ path: 'expectedVersion', message: 'must be a whole number from 1' }],
  });
}

/**
 * The job (or, with `'site'`, site) version the client last saw, for optimistic locking of every
 * write to a job or a site and their children: the `If-Match` header (`If-Match: "7"`), or `expectedVersion` in a JSON body. Neither →
 * 428 `VERSION_REQUIRED`; both but different → 400.
 */
export const ExpectedVersion = createParamDecorator((data: VersionedThing | undefined, ctx: ExecutionContext): number => {
  const thing = data ?? 'job';
  const request = ctx.switchToHttp().getRequest<Request>();
  const header = fromIfMatch(request.headers['if-match'], thing);
  const body = fromBody(request.body, thing);
  if (header !== undefined && body !== undefined && header !== body) {
    throw new BadRequestException({
      message: 'If-Match and expectedVersion disagree: send one of them',
      code: 'VALIDATION_FAILED',
      issues: [{ path: 'expectedVersion', message: 'differs from If-Match' }],
    });
  }
  const version = header ?? body;
  if (version === undefined) {
    throw new HttpException(
      {
        message: `Say which version of the ${thing} you are changing: send If-Match: "<version>" (or expectedVersion in the body).`,
        code: 'VERSION_REQUIRED',
      },
      HttpStatus.PRECONDITION_REQUIRED,
    );
  }
  return version;
});
