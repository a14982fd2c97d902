import { BadRequestException } from '@nestjs/common';
import { describe, expect, it } from 'vitest';
import { z } from 'zod';

import { ZodValidationPipe } from './zod-validation.pipe.js';

function refusal(pipe: ZodValidationPipe<z.ZodType>, value: unknown) {
  try {
    pipe.transform(value);
  } catch (error) {
    expect(error).toBeInstanceOf(BadRequestException);
    return (error as BadRequestException).getResponse() as { message: string; code: string; issues: { path: string; message: string }[] };
  }
  throw new Error('expected a refusal');
}

describe(ZodValidationPipe.name, () => {
  const sut = new ZodValidationPipe(z.object({ name: z.string().max(120), tags: z.array(z.string()).optional() }));

  it('should pass a valid value through the schema', () => {
    expect(sut.transform({ name: 'Patio \u202e zone \u{1F50A}', extra: 1 })).toEqual({ name: 'Patio \u202e zone \u{1F50A}' });
  });

  it('should name the field of a schema error', () => {
    const body = refusal(sut, { name: 12 });
    expect(body.code).toBe('VALIDATION_FAILED');
    expect(body.issues[0]?.path).toBe('name');
  });

  // Found by the bad-input suite: POST /api/customers with name "N\u0000UL" was a 500 (PostgreSQL text
  // refuses NUL), and POST /api/sites/:siteId/locate-links with note "Lc\ud800N" stored "Lc\ufffdN".
  it.each([
    ['NUL in a field', { name: 'N\u0000UL' }, 'name'],
    ['a lone high surrogate', { name: 'half \ud83d' }, 'name'],
    ['a lone low surrogate inside an array', { name: 'ok', tags: ['fine', 'a\udc00b'] }, 'tags.1'],
    ['NUL in a key the schema would strip', { name: 'ok', 'k\u0000': 1 }, 'k\u0000'],
  ])('should refuse %s, naming where it is', (_case, value, path) => {
    const body = refusal(sut, value);
    expect(body.issues.map((issue) => issue.path)).toEqual([path]);
    expect(body.message).toContain('cannot be stored');
  });

  it('should accept paired surrogates (astral-plane characters)', () => {
    expect(sut.transform({ name: '\u{1D11E}\u{1F50A}' })).toEqual({ name: '\u{1D11E}\u{1F50A}' });
  });

  it('should walk a value nested 100 000 levels deep without a stack overflow', () => {
    let deep: unknown = 'N\u0000UL';
    for (let i = 0; i < 100_000; i += 1) deep = [deep];
    const body = refusal(sut, { name: 'ok', tags: deep });
    expect(body.issues[0]?.path.startsWith('tags.0.0.0')).toBe(true);
  });
});
