import { type AsBuilt, AsBuiltSchema } from '../as-built/as-built.schema.js';
import type { FieldIssue } from '../errors.js';

export type { FieldIssue };

/**
 * Validates a job's whole as-built as it would be after a change, so that every stored record always
 * passes AsBuiltSchema (references, pairs within the conductor count, stations within the run, no loop
 * in the wiring …). Issues inside the changed record (`focus`, e.g. ['runs', 4]) are reported relative
 * to it, as paths of the request body (`toItemId`); issues elsewhere keep their as-built path with an
 * `asBuilt.` prefix (e.g. `asBuilt.runs.2.toItemId` when a change closes a loop through another run).
 * Returns an empty list when the record is valid.
 */
export function validateRecord(asBuilt: AsBuilt, focus: readonly (string | number)[] = []): FieldIssue[] {
  const parsed = AsBuiltSchema.safeParse(asBuilt);
  if (parsed.success) return [];
  return parsed.error.issues.map((issue) => {
    const isInFocus = focus.length > 0 && focus.every((segment, i) => issue.path[i] === segment);
    const path = isInFocus ? issue.path.slice(focus.length) : ['asBuilt', ...issue.path];
    return { path: path.map(String).join('.'), message: issue.message };
  });
}
