import { isApiError } from './api-error';

/*
 * Plain sentences for a failed request, without zod or the API client (form-errors.ts re-exports them
 * for the app; the sign-in page, web/sign-in.html, uses them directly).
 */

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

/** A plain sentence for a failed request, for a message bar or toast. */
export function describeRequestError(error: unknown, fallback = 'Something went wrong. Try again.'): string {
  if (!isApiError(error)) return fallback;
  if (error.status === 0) return `${error.message} Check your connection and try again.`;
  return error.message ? toSentence(error.message) : fallback;
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
