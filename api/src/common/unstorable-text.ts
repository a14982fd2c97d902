/** At most this many offending paths are reported (a hostile body may hold millions). */
const MAX_REPORTED = 20;

/** NUL (PostgreSQL text and jsonb cannot hold it), or a UTF-16 surrogate without its pair (not Unicode). */
// eslint-disable-next-line no-control-regex -- NUL is exactly what this looks for
const UNSTORABLE = /\u0000|[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

function isUnstorable(text: string): boolean {
  return UNSTORABLE.test(text);
}

/**
 * The dotted paths (`''` for the value itself) of strings, or object keys, in a parsed request part that
 * cannot be stored as text: they contain NUL or an unpaired surrogate. PostgreSQL refuses NUL in text
 * (a 500 otherwise), and the UTF-8 encoder silently replaces a lone surrogate with U+FFFD, so neither
 * could be given back as sent. Walks iteratively, so a body nested 100 000 levels deep is no stack risk.
 */
export function findUnstorableText(value: unknown): string[] {
  const found: string[] = [];
  const stack: { value: unknown; path: string }[] = [{ value, path: '' }];
  const join = (path: string, key: string) => (path ? `${path}.${key}` : key);
  while (stack.length > 0 && found.length < MAX_REPORTED) {
    const next = stack.pop()!;
    if (typeof next.value === 'string') {
      if (isUnstorable(next.value)) found.push(next.path);
    } else if (Array.isArray(next.value)) {
      next.value.forEach((entry, i) => stack.push({ value: entry, path: join(next.path, String(i)) }));
    } else if (next.value !== null && typeof next.value === 'object') {
      for (const [key, entry] of Object.entries(next.value)) {
        if (isUnstorable(key)) found.push(join(next.path, key));
        else stack.push({ value: entry, path: join(next.path, key) });
      }
    }
  }
  return found;
}
