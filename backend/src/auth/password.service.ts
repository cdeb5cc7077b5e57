import { Injectable } from '@nestjs/common';
import argon2 from 'argon2';

/**
 * argon2id with the OWASP Password Storage baseline (19 MiB, 2 passes, 1 lane): ~0.14 s per hash on
 * this project's 2-core machines, against ~0.8 s for the library's 64 MiB/3/4 default, which would
 * make sign-in itself a denial-of-service lever. The parameters travel inside each encoded hash, so
 * raising them later only affects new hashes. Only the encoded hash ever reaches the database; the
 * clear password lives only for the length of the request.
 */
export const ARGON2_OPTIONS = { type: argon2.argon2id, memoryCost: 19_456, timeCost: 2, parallelism: 1 } as const;

@Injectable()
export class PasswordService {
  /** A hash of a random password, verified against when the e-mail is unknown so both cases cost the same. */
  private readonly decoy: Promise<string> = argon2.hash(`decoy-${Math.random()}-${Date.now()}`, ARGON2_OPTIONS);

  hash(password: string): Promise<string> {
    return argon2.hash(password, ARGON2_OPTIONS);
  }

  async verify(hash: string, password: string): Promise<boolean> {
    try {
      return await argon2.verify(hash, password);
    } catch {
      return false;
    }
  }

  /** Spends the same work as a real verification, and always fails. */
  async verifyDecoy(password: string): Promise<false> {
    await this.verify(await this.decoy, password);
    return false;
  }
}
