import { createHash, createHmac, hkdfSync, randomBytes } from 'node:crypto';

/** A random opaque token (256 bits, base64url) for links and refresh cookies. */
export function newOpaqueToken(): string {
  return randomBytes(32).toString('base64url');
}

/** Tokens are stored only as their SHA-256, so a database leak does not hand out working links. */
export function hashToken(token: string): string {
  return createHash('sha256').update(token).digest('hex');
}

/**
 * The key that derives a refresh token's successor (below), itself derived from the token-signing
 * secret so there is no second secret to configure. Anyone holding it and a refresh token could compute
 * that token's successor; it never leaves the process, like the signing secret it comes from.
 */
export function successorKey(secret: string): Buffer {
  return Buffer.from(hkdfSync('sha256', secret, 'loamline', 'refresh-token successor v1', 32));
}

/**
 * The refresh token that replaces `token` when it is rotated: HMAC(key, token), base64url (256 bits).
 *
 * Deterministic on purpose. Two tabs (or a browser restoring its session) may present the same token at
 * once; the first rotates it, and the others, arriving within the grace window, must get the very same
 * successor rather than a second family member (which would fork the session) or a reuse alarm (which
 * would sign everyone out). Because the successor is recomputed from the token the late request itself
 * presents, the server never keeps a plaintext token: the database holds only SHA-256 hashes, and a
 * leaked database still hands out no working cookie. The token's output is indistinguishable from a
 * random one to anyone without the key, and a caller who can compute it already holds the predecessor,
 * which within the window is worth the same.
 */
export function successorToken(key: Buffer, token: string): string {
  return createHmac('sha256', key).update(`refresh-successor:${token}`).digest('base64url');
}
