import type { NextFunction, Request, Response } from 'express';

import type { ErrorBody } from './http-exception.filter.js';

/** What a request body may be: JSON everywhere, multipart forms on the upload routes. */
const ACCEPTED_TYPES = ['application/json', 'application/*+json', 'multipart/form-data'];

/**
 * Refuses a request body of any other content type with 415 before a parser sees it. Without this a
 * form-encoded body (which Nest parses by default) reached the routes as an object of stray keys, so a
 * replace with every field optional (an amplifier channel's setup) "succeeded" and wiped the record.
 */
export function requireJsonOrMultipartBody(req: Request, res: Response, next: NextFunction): void {
  // An empty body (Content-Length: 0, as fetch sends for a bare POST) needs no type.
  if (req.headers['content-length'] === '0') return next();
  // No Content-Type at all: no parser reads the body, so the route sees none (and validation answers
  // 400 where a body is needed). Bodiless POSTs from some clients arrive chunked, without a length.
  if (req.headers['content-type'] === undefined) return next();
  // `req.is` answers null for a request without a body and false for a body of another type.
  if (req.is(ACCEPTED_TYPES) !== false) return next();
  const body: ErrorBody = {
    statusCode: 415,
    error: 'Unsupported Media Type',
    message: 'Send the body as application/json (multipart/form-data for uploads).',
    code: 'UNSUPPORTED_MEDIA_TYPE',
  };
  res.status(415).json(body);
}
