import { BadRequestException, type PipeTransform } from '@nestjs/common';
import type { z } from 'zod';

import { findUnstorableText } from './unstorable-text.js';

/**
 * Validates a request part against a shared zod schema; 400 with one issue per bad field path. Text
 * that no column can hold (NUL, unpaired surrogates) is refused first, naming where it is, so it never
 * reaches the database as a 500 or a silently replaced character.
 */
export class ZodValidationPipe<S extends z.ZodType> implements PipeTransform<unknown, z.infer<S>> {
  constructor(private readonly schema: S) {}

  transform(value: unknown): z.infer<S> {
    const unstorable = findUnstorableText(value);
    if (unstorable.length > 0) {
      const issues = unstorable.map((path) => ({
        path,
        message: 'must not contain NUL characters or unpaired surrogates (text that cannot be stored)',
      }));
      throw new BadRequestException({ message: `${issues[0]!.path || 'body'}: ${issues[0]!.message}`, code: 'VALIDATION_FAILED', issues });
    }
    const parsed = this.schema.safeParse(value);
    if (parsed.success) return parsed.data;
    const issues = parsed.error.issues.map((issue) => ({
      path: issue.path.map(String).join('.'),
      message: issue.message,
    }));
    const first = issues[0];
    throw new BadRequestException({
      message: first ? `${first.path || 'body'}: ${first.message}` : 'Invalid request',
      code: 'VALIDATION_FAILED',
      issues,
    });
  }
}
