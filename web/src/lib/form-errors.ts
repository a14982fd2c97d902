import { z } from 'zod';

import { isApiError } from './api-client';

/** Field name → the message shown under that field. */
export type FieldErrors<TField extends string = string> = Partial<Record<TField, string>>;

/**
 * Our schemas word their messages to follow the field label ("must be at least 10 characters");
 * under a field they read as a sentence of their own.
 */
export function toSentence(message: string): string {
  const trimmed = message.trim();
  if (trimmed === '') return trimmed;
  const capitalised = trimmed.charAt(0).toUpperCase() + trimmed.slice(1);
  return /[.!?]$/.test(capitalised) ? capitalised : `${capitalised}.`;
}

/** The first problem per top-level field of a failed `safeParse`. */
export function fieldErrorsFromZod<TField extends string>(error: z.ZodError): FieldErrors<TField> {
  const errors: FieldErrors<string> = {};
  for (const issue of error.issues) {
    const field = String(issue.path[0] ?? '');
    if (field && errors[field] === undefined) errors[field] = toSentence(issue.message);
  }
  return errors as FieldErrors<TField>;
}

/** The API's validation `issues`, keyed by top-level field; empty for any other error. */
export function fieldErrorsFromApi<TField extends string>(error: unknown): FieldErrors<TField> {
  const errors: FieldErrors<string> = {};
  if (!isApiError(error)) return errors as FieldErrors<TField>;
  for (const issue of error.issues) {
    const field = issue.path.split('.')[0] ?? '';
    if (field && errors[field] === undefined) errors[field] = toSentence(issue.message);
  }
  return errors as FieldErrors<TField>;
}

/** A plain sentence for a failed request, for a message bar or toast. */
export function describeRequestError(error: unknown, fallback = 'Something went wrong. Try again.'): string {
  if (!isApiError(error)) return fallback;
  if (error.status === 0) return `${error.message} Check your connection and try again.`;
  return error.message ? toSentence(error.message) : fallback;
}

/**
 * A form's optional text field for a shared schema's optional, nullable one: blank is "none" (null).
 * Optional itself so that the shared schema, whose field may also be left out, can follow it in a pipe.
 */
export function blankToNull() {
  return z
    .string()
    .transform((value) => (value.trim() === '' ? null : value))
    .optional();
}
