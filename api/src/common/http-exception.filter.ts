import {
  type ArgumentsHost,
  Catch,
  type ExceptionFilter,
  HttpException,
  HttpStatus,
  Logger,
} from '@nestjs/common';
import type { Request, Response } from 'express';

import {
  ConflictError,
  DomainError,
  ForbiddenError,
  NotFoundError,
  RuleViolationError,
  ValidationError,
  VersionConflictError,
} from '../domain/errors.js';
import { LimiterBusyError } from './concurrency-limiter.js';
import { isDatabaseBusy } from './db-errors.js';
import { RetryLaterException } from './retry-later.exception.js';
import { WorkerPoolBusyError } from './worker-pool.js';

export interface ErrorBody {
  statusCode: number;
  error: string;
  message: string;
  code?: string;
  issues?: { path: string; message: string }[];
  /** With `VERSION_CONFLICT`: the job's version now, so the client can reload or merge. */
  currentVersion?: number;
}

const DOMAIN_STATUS = new Map<abstract new (...args: never[]) => unknown, HttpStatus>([
  [ValidationError, HttpStatus.BAD_REQUEST],
  [ForbiddenError, HttpStatus.FORBIDDEN],
  [NotFoundError, HttpStatus.NOT_FOUND],
  [ConflictError, HttpStatus.CONFLICT],
  [VersionConflictError, HttpStatus.PRECONDITION_FAILED],
  [RuleViolationError, HttpStatus.UNPROCESSABLE_ENTITY],
]);

const STATUS_TEXT: Record<number, string> = {
  400: 'Bad Request',
  401: 'Unauthorized',
  403: 'Forbidden',
  404: 'Not Found',
  409: 'Conflict',
  412: 'Precondition Failed',
  413: 'Payload Too Large',
  415: 'Unsupported Media Type',
  422: 'Unprocessable Entity',
  428: 'Precondition Required',
  429: 'Too Many Requests',
  500: 'Internal Server Error',
  503: 'Service Unavailable',
};

/** Postgres error classes that mean "the database is not reachable right now". */
function isDatabaseUnavailable(error: unknown): boolean {
  // Drizzle wraps the driver's error in a DrizzleQueryError ("Failed query: …") with the original as `cause`.
  for (let e: unknown = error, depth = 0; e && depth < 4; e = (e as { cause?: unknown }).cause, depth += 1) {
    const code = (e as { code?: unknown }).code;
    const message = e instanceof Error ? e.message : '';
    if (
      code === 'ECONNREFUSED' ||
      code === 'ECONNRESET' ||
      (typeof code === 'string' && code.startsWith('08')) || // connection_exception class
      code === '57P01' || // admin_shutdown
      code === '57P02' || // crash_shutdown
      code === '57P03' || // cannot_connect_now
      /Connection terminated|timeout exceeded when trying to connect|ECONNREFUSED|not queryable/.test(message)
    ) {
      return true;
    }
  }
  return false;
}

/** Seconds a client should wait before trying again, for answers that say "later" (429, 503). */
function retryAfterSeconds(exception: unknown, body: ErrorBody): number | undefined {
  if (exception instanceof RetryLaterException) return exception.retryAfterSeconds;
  if (exception instanceof LimiterBusyError) return exception.retryAfterSeconds;
  if (body.code === 'SERVER_BUSY' || body.code === 'DATABASE_BUSY') return 2;
  if (body.code === 'DATABASE_UNAVAILABLE') return 5;
  return undefined;
}

/** What Nest's ParseUUIDPipe says, without naming the parameter. */
const PARSE_UUID_MESSAGE = /^Validation failed \(uuid( v\d)? is expected\)$/;
const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/**
 * ParseUUIDPipe's 400 does not say which path parameter was wrong; the request's params do. Names each
 * parameter that is not a uuid, so that every validation error names its field.
 */
function withUuidParamIssues(body: ErrorBody, req: Request | undefined): ErrorBody {
  if (body.statusCode !== 400 || body.issues || !PARSE_UUID_MESSAGE.test(body.message)) return body;
  const params = Object.entries((req?.params ?? {}) as Record<string, unknown>).filter(
    ([name, value]) => /(^id|Id)$/.test(name) && !(typeof value === 'string' && UUID.test(value)),
  );
  if (params.length === 0) return body;
  const issues = params.map(([name]) => ({ path: name, message: 'must be a uuid' }));
  return { ...body, message: `${issues[0]!.path}: must be a uuid`, code: 'VALIDATION_FAILED', issues };
}

/**
 * One shape for every error the API returns: `{ statusCode, error, message, code?, issues?, currentVersion? }`.
 * Domain errors map to 400/403/404/409/412/422; unknown errors become a generic 500 whose stack goes only to the log.
 */
@Catch()
export class HttpExceptionFilter implements ExceptionFilter {
  private readonly logger = new Logger(HttpExceptionFilter.name);

  catch(exception: unknown, host: ArgumentsHost): void {
    const res = host.switchToHttp().getResponse<Response>();
    const body = withUuidParamIssues(this.toBody(exception), host.switchToHttp().getRequest<Request | undefined>());
    if (body.statusCode >= 500 && body.statusCode !== HttpStatus.SERVICE_UNAVAILABLE) {
      this.logger.error(exception instanceof Error ? exception.stack : String(exception));
    }
    if (res.headersSent) return;
    const retryAfter = retryAfterSeconds(exception, body);
    if (retryAfter !== undefined) res.setHeader('Retry-After', String(retryAfter));
    res.status(body.statusCode).json(body);
  }

  private toBody(exception: unknown): ErrorBody {
    if (exception instanceof HttpException) {
      const statusCode = exception.getStatus();
      const response = exception.getResponse();
      const fields = typeof response === 'object' && response !== null ? (response as Record<string, unknown>) : {};
      const message = Array.isArray(fields.message)
        ? fields.message.join('; ')
        : typeof fields.message === 'string'
          ? fields.message
          : exception.message;
      return {
        statusCode,
        error: STATUS_TEXT[statusCode] ?? (typeof fields.error === 'string' ? fields.error : 'Error'),
        message,
        ...(typeof fields.code === 'string' ? { code: fields.code } : {}),
        ...(Array.isArray(fields.issues) ? { issues: fields.issues as ErrorBody['issues'] } : {}),
        ...(typeof fields.currentVersion === 'number' ? { currentVersion: fields.currentVersion } : {}),
      };
    }
    if (exception instanceof DomainError) {
      const statusCode =
        [...DOMAIN_STATUS].find(([type]) => exception instanceof type)?.[1] ?? HttpStatus.UNPROCESSABLE_ENTITY;
      return {
        statusCode,
        error: STATUS_TEXT[statusCode] ?? 'Error',
        message: exception.message,
        code: exception.code,
        ...(exception.issues ? { issues: exception.issues } : {}),
        ...(exception instanceof VersionConflictError ? { currentVersion: exception.currentVersion } : {}),
      };
    }
    if (exception instanceof LimiterBusyError || exception instanceof WorkerPoolBusyError) {
      return {
        statusCode: HttpStatus.SERVICE_UNAVAILABLE,
        error: STATUS_TEXT[503]!,
        message: 'The server is busy with other requests right now; try again shortly.',
        code: 'SERVER_BUSY',
      };
    }
    // Before "unavailable": a pool wait that timed out while the database answers is load, not an outage.
    if (isDatabaseBusy(exception)) {
      return {
        statusCode: HttpStatus.SERVICE_UNAVAILABLE,
        error: STATUS_TEXT[503]!,
        message: 'The database is busy with other requests right now; try again shortly.',
        code: 'DATABASE_BUSY',
      };
    }
    if (isDatabaseUnavailable(exception)) {
      return {
        statusCode: HttpStatus.SERVICE_UNAVAILABLE,
        error: STATUS_TEXT[503]!,
        message: 'The database is not reachable right now; try again shortly.',
        code: 'DATABASE_UNAVAILABLE',
      };
    }
    return {
      statusCode: HttpStatus.INTERNAL_SERVER_ERROR,
      error: STATUS_TEXT[500]!,
      message: 'Something went wrong on our side; it has been logged.',
    };
  }
}
