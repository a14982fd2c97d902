/** A key that is not a plain relative path inside the storage root (absolute, `..`, backslashes, NUL …). */
export class InvalidObjectKeyError extends Error {
  constructor(readonly key: string) {
    super(`invalid storage key ${JSON.stringify(key)}`);
    this.name = 'InvalidObjectKeyError';
  }
}

const SEGMENT = /^[A-Za-z0-9][A-Za-z0-9._-]*$/;

/**
 * Checks that a key is `segment/segment/…` made of letters, digits, `.`, `_` and `-`, with no empty,
 * `.` or `..` segment. Both drivers call it, so a key that would escape the disk root is refused on S3
 * as well and the two drivers accept exactly the same keys.
 */
export function assertSafeKey(key: string): string {
  if (key.length === 0 || key.length > 1024) throw new InvalidObjectKeyError(key);
  for (const segment of key.split('/')) {
    if (!SEGMENT.test(segment) || segment === '.' || segment === '..') throw new InvalidObjectKeyError(key);
  }
  return key;
}
