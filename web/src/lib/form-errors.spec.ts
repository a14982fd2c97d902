import { describe, expect, it } from 'vitest';
import { z } from 'zod';

import { ApiError } from './api-client';
import { fieldErrorsFromApi, fieldErrorsFromZod, toSentence } from './form-errors';

describe('toSentence', () => {
  it.each([
    ['must be at least 10 characters', 'Must be at least 10 characters.'],
    ['Already a sentence.', 'Already a sentence.'],
    ['', ''],
  ])('should turn %j into %j', (input, expected) => {
    expect(toSentence(input)).toBe(expected);
  });
});

describe('fieldErrorsFromZod', () => {
  it('should keep the first message per field', () => {
    const schema = z.object({ name: z.string().min(2, { error: 'is too short' }).max(1, { error: 'second' }) });
    const result = schema.safeParse({ name: 'x' });

    expect(result.success).toBe(false);
    expect(fieldErrorsFromZod(result.error!)).toEqual({ name: 'Is too short.' });
  });
});

describe('fieldErrorsFromApi', () => {
  it('should key issues by their first path segment', () => {
    const error = new ApiError({
      status: 400,
      message: 'Validation failed',
      issues: [
        { path: 'email', message: 'must be an e-mail address' },
        { path: 'runs.0.lengthM', message: 'must be positive' },
      ],
    });

    expect(fieldErrorsFromApi(error)).toEqual({ email: 'Must be an e-mail address.', runs: 'Must be positive.' });
  });

  it('should give nothing for errors that are not from the API', () => {
    expect(fieldErrorsFromApi(new Error('boom'))).toEqual({});
  });
});
