import { isApiError } from '../../../lib/api-client';
import { describeRequestError, toSentence } from '../../../lib/form-errors';

/**
 * The API names the failing field of a record write by its body path (`measuredLengthM`,
 * `pairs.1.pairIndex`); forms show it under the field whose name starts the path.
 */
export function saveErrors(error: unknown): { fields: Record<string, string>; message?: string } {
  if (!isApiError(error)) return { fields: {}, message: describeRequestError(error) };
  const fields: Record<string, string> = {};
  for (const issue of error.issues) {
    const key = issue.path.split('.')[0] ?? '';
    if (key && !key.startsWith('asBuilt') && fields[key] === undefined) fields[key] = toSentence(issue.message);
  }
  return Object.keys(fields).length > 0 ? { fields } : { fields, message: describeRequestError(error) };
}
