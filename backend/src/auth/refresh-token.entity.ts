import { Entity, Index, ManyToOne, type Opt, PrimaryKey, Property } from '@mikro-orm/core';
import { User } from '../users/user.entity';

/**
 * One refresh token of a sign-in "family". Each refresh uses the token up (usedAt) and issues its
 * successor in the same family; presenting a used token again revokes the whole family.
 * Only the SHA-256 of the secret is stored.
 */
@Entity({ tableName: 'refresh_tokens' })
@Index({ name: 'refresh_tokens_family_index', properties: ['familyId'] })
@Index({ name: 'refresh_tokens_user_index', properties: ['user'] })
export class RefreshToken {
  @PrimaryKey({ type: 'uuid' })
  id: string;

  @ManyToOne(() => User, { deleteRule: 'cascade' })
  user: User;

  @Property({ type: 'uuid' })
  familyId: string;

  @Property({ type: 'string', length: 64, hidden: true })
  tokenHash: string;

  @Property({ type: 'datetime' })
  createdAt: Date;

  @Property({ type: 'datetime' })
  expiresAt: Date;

  @Property({ type: 'datetime', nullable: true })
  usedAt: Date | null = null;

  @Property({ type: 'datetime', nullable: true })
  revokedAt: Date | null = null;

  @Property({ type: 'string', length: 300, nullable: true })
  userAgent: string | null = null;

  constructor(init: { id: string; user: User; familyId: string; tokenHash: string; createdAt: Date; expiresAt: Date; userAgent?: string | null }) {
    this.id = init.id;
    this.user = init.user;
    this.familyId = init.familyId;
    this.tokenHash = init.tokenHash;
    this.createdAt = init.createdAt;
    this.expiresAt = init.expiresAt;
    this.userAgent = init.userAgent?.slice(0, 300) ?? null;
  }
}
