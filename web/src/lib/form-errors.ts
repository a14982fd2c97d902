import { z } from 'zod';

import { type FieldErrors, toSentence } from './describe-error';

// Defined without zod or the API client (the sign-in page uses them too); the app imports them from here.
export { describeRequestError, fieldErrorsFromApi, type FieldErrors, toSentence } from './describe-error';

/** The first problem per top-level field of a failed `safeParse`. */
export function fieldErrorsFromZod<TField extends string>(error: z.ZodError): FieldErrors<TField> {
  const errors: FieldErrors<string> = {};
  for (const issue of error.issues) {
    const field = String(issue.path[0] ?? '');
    if (field && errors[field] === undefined) errors[field] = toSentence(issue.message);
  }
  return errors as FieldErrors<TField>;
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
