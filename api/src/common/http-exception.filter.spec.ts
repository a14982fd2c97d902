import { type ArgumentsHost, BadRequestException, ParseUUIDPipe } from '@nestjs/common';
import { describe, expect, it, vi } from 'vitest';

import {
  ConflictError,
  ForbiddenError,
  NotFoundError,
  RuleViolationError,
  ValidationError,
  VersionConflictError,
} from '../domain/errors.js';
import { HttpExceptionFilter } from './http-exception.filter.js';

function hostFor(params: Record<string, string>) {
  const res = { headersSent: false, status: vi.fn(), json: vi.fn() };
  res.status.mockReturnValue(res);
  const host = { switchToHttp: () => ({ getResponse: () => res, getRequest: () => ({ params }) }) } as unknown as ArgumentsHost;
  return { host, res };
}

async function parseUuidError(value: string): Promise<unknown> {
  try {
    await new ParseUUIDPipe().transform(value, { type: 'param', data: 'jobId' });
  } catch (error) {
    return error;
  }
  throw new Error('expected ParseUUIDPipe to refuse');
}

describe(HttpExceptionFilter.name, () => {
  const sut = new HttpExceptionFilter();

  // Found by the bad-input suite: POST /api/jobs/not-a-uuid/zones answered "Validation failed (uuid is
  // expected)" without saying which path parameter was wrong.
  it('should name the path parameter that is not a uuid', async () => {
    const { host, res } = hostFor({ jobId: 'not-a-uuid', zoneId: '0b3c6f9e-5d1a-4c1e-9a57-3f2a1e7c9d10' });
    sut.catch(await parseUuidError('not-a-uuid'), host);
    expect(res.status).toHaveBeenCalledWith(400);
    expect(res.json).toHaveBeenCalledWith({
      statusCode: 400,
      error: 'Bad Request',
      message: 'jobId: must be a uuid',
      code: 'VALIDATION_FAILED',
      issues: [{ path: 'jobId', message: 'must be a uuid' }],
    });
  });

  it('should leave other 400s as they are', () => {
    const { host, res } = hostFor({ jobId: 'not-a-uuid' });
    sut.catch(new BadRequestException({ message: 'title: is required', code: 'VALIDATION_FAILED', issues: [{ path: 'title', message: 'is required' }] }), host);
    expect(res.json).toHaveBeenCalledWith(expect.objectContaining({ message: 'title: is required', issues: [{ path: 'title', message: 'is required' }] }));
  });

  it('should answer an unknown error with a generic 500 that leaks nothing', () => {
    const { host, res } = hostFor({});
    const logged = vi.spyOn((sut as unknown as { logger: { error: (m: string) => void } }).logger, 'error').mockImplementation(() => undefined);
    sut.catch(new Error('duplicate key value violates unique constraint "users_email_key"'), host);
    expect(res.status).toHaveBeenCalledWith(500);
    expect(JSON.stringify(res.json.mock.calls[0]![0])).not.toMatch(/duplicate|constraint|users_email/);
    logged.mockRestore();
  });

  it.each([
    [new ValidationError([{ path: 'gauge.awg', message: 'is not in the AWG table' }]), 400, 'Bad Request'],
    [new ForbiddenError('ROLE_NOT_ALLOWED', 'Only an admin may do this.'), 403, 'Forbidden'],
    [new NotFoundError('JOB_NOT_FOUND', 'No such job.'), 404, 'Not Found'],
    [new ConflictError('IN_USE', 'This run is still in use.', [{ path: 'runs[0]', message: 'ends at it' }]), 409, 'Conflict'],
    [new VersionConflictError('Someone saved this job first.', 7), 412, 'Precondition Failed'],
    [new RuleViolationError('PACKET_ALREADY_ISSUED', 'Issued already.'), 422, 'Unprocessable Entity'],
  ])('should answer %s with its status and the one error body', (error, status, text) => {
    const { host, res } = hostFor({});
    sut.catch(error, host);
    expect(res.status).toHaveBeenCalledWith(status);
    expect(res.json).toHaveBeenCalledWith({
      statusCode: status,
      error: text,
      message: error.message,
      code: error.code,
      ...(error.issues ? { issues: error.issues } : {}),
      ...(error instanceof VersionConflictError ? { currentVersion: 7 } : {}),
    });
  });

  it('should name the first field in a validation error\'s message', () => {
    const error = new ValidationError([{ path: 'gauge.awg', message: 'is not in the AWG table' }]);
    expect(error.message).toBe('gauge.awg: is not in the AWG table');
    expect(error.code).toBe('VALIDATION_FAILED');
  });
});
