import { Entity, Index, ManyToOne, type Opt, PrimaryKey, Property } from '@mikro-orm/core';
import { User } from '../users/user.entity';

/** A one-time password reset link sent by e-mail. Only the SHA-256 of its secret is stored. */
@Entity({ tableName: 'password_reset_tokens' })
@Index({ name: 'password_reset_tokens_user_index', properties: ['user'] })
export class PasswordResetToken {
  @PrimaryKey({ type: 'uuid' })
  id: string;

  @ManyToOne(() => User, { deleteRule: 'cascade' })
  user: User;

  @Property({ type: 'string', length: 64, hidden: true })
  tokenHash: string;

  @Property({ type: 'datetime' })
  createdAt: Date;

  @Property({ type: 'datetime' })
  expiresAt: Date;

  @Property({ type: 'datetime', nullable: true })
  usedAt: Date | null = null;

  constructor(init: { id: string; user: User; tokenHash: string; createdAt: Date; expiresAt: Date }) {
    this.id = init.id;
    this.user = init.user;
    this.tokenHash = init.tokenHash;
    this.createdAt = init.createdAt;
    this.expiresAt = init.expiresAt;
  }
}
