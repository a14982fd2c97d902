import { BadRequestException, type PipeTransform } from '@nestjs/common';
import type { z } from 'zod';

/** Validates a request part against a shared zod schema; 400 with one issue per bad field path. */
export class ZodValidationPipe<S extends z.ZodType> implements PipeTransform<unknown, z.infer<S>> {
  constructor(private readonly schema: S) {}

  transform(value: unknown): z.infer<S> {
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
