import { createHash, randomBytes } from 'node:crypto';

/** A random opaque token (256 bits, base64url) for links and refresh cookies. */
export function newOpaqueToken(): string {
  return randomBytes(32).toString('base64url');
}

/** Tokens are stored only as their SHA-256, so a database leak does not hand out working links. */
export function hashToken(token: string): string {
  return createHash('sha256').update(token).digest('hex');
}
