/** The SQLSTATE of a PostgreSQL error, whether raised directly or wrapped by Drizzle (`cause`). */
function sqlState(error: unknown): string | undefined {
  for (let e: unknown = error, depth = 0; e && depth < 3; e = (e as { cause?: unknown }).cause, depth += 1) {
    const code = (e as { code?: unknown }).code;
    if (typeof code === 'string' && /^[0-9A-Z]{5}$/.test(code)) return code;
  }
  return undefined;
}

/** A foreign-key violation: the row is still referenced (delete) or references something gone (insert). */
export function isForeignKeyViolation(error: unknown): boolean {
  return sqlState(error) === '23503';
}

export function isUniqueViolation(error: unknown): boolean {
  return sqlState(error) === '23505';
}
