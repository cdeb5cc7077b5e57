import crypto from 'node:crypto';
import { Entity, type Opt, PrimaryKey, Property } from '@mikro-orm/core';

/** A person with an account. The e-mail is stored lower-cased; the password only as an argon2id hash. */
@Entity({ tableName: 'users' })
export class User {
  @PrimaryKey({ type: 'uuid' })
  id: string = crypto.randomUUID();

  @Property({ type: 'string', length: 254, unique: 'users_email_unique' })
  email: string;

  @Property({ type: 'string', length: 100 })
  displayName: string;

  /** argon2id encoded hash; never serialised. */
  @Property({ type: 'string', length: 255, hidden: true, lazy: true })
  passwordHash: string;

  /** Bumped when the password changes or is reset: access tokens carrying an older version are refused. */
  @Property({ type: 'integer', hidden: true })
  tokenVersion: number & Opt = 0;

  @Property({ type: 'datetime', nullable: true })
  lastSignInAt: Date | null = null;

  @Property({ type: 'datetime' })
  createdAt: Date & Opt = new Date();

  @Property({ type: 'datetime', onUpdate: () => new Date() })
  updatedAt: Date & Opt = new Date();

  constructor(email: string, displayName: string, passwordHash: string) {
    this.email = User.normaliseEmail(email);
    this.displayName = displayName.trim();
    this.passwordHash = passwordHash;
  }

  static normaliseEmail(email: string): string {
    return email.trim().toLowerCase();
  }
}
