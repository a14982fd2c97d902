import { Injectable } from '@nestjs/common';
import { hash, verify } from '@node-rs/argon2';

/**
 * Argon2id with the library's defaults (19 MiB, 2 passes, 1 lane): OWASP's Password Storage Cheat
 * Sheet lists exactly this as a minimum configuration.
 */
@Injectable()
export class PasswordHasher {
  // Verified against when the e-mail is unknown, so both failures take the same time.
  private readonly dummyHash = hash('not-a-real-password-used-for-timing');

  hash(password: string): Promise<string> {
    return hash(password);
  }

  async verify(hashValue: string | undefined, password: string): Promise<boolean> {
    const target = hashValue ?? (await this.dummyHash);
    try {
      const ok = await verify(target, password);
      return ok && hashValue !== undefined;
    } catch {
      return false;
    }
  }
}
