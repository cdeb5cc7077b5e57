import crypto from 'node:crypto';
import { Entity, Index, ManyToOne, type Opt, PrimaryKey, Property } from '@mikro-orm/core';
import { SavedMap } from '../maps/map.entity';
import { User } from '../users/user.entity';

/**
 * A read-only link to one map. The token (32 random bytes, base64url) is shown once at creation;
 * only its SHA-256 is stored, so a database leak yields no working link.
 */
@Entity({ tableName: 'viewing_links' })
@Index({ name: 'viewing_links_map_index', properties: ['map'] })
export class ViewingLink {
  @PrimaryKey({ type: 'uuid' })
  id: string = crypto.randomUUID();

  @ManyToOne(() => SavedMap, { deleteRule: 'cascade' })
  map: SavedMap;

  /** Hex SHA-256 of the token. */
  @Property({ type: 'string', length: 64, unique: 'viewing_links_token_hash_unique', hidden: true })
  tokenHash: string;

  @ManyToOne(() => User, { nullable: true, deleteRule: 'set null' })
  createdBy: User | null;

  @Property({ type: 'datetime' })
  createdAt: Date & Opt = new Date();

  @Property({ type: 'datetime', nullable: true })
  expiresAt: Date | null = null;

  @Property({ type: 'boolean' })
  includePins: boolean & Opt = false;

  @Property({ type: 'integer' })
  viewCount: number & Opt = 0;

  @Property({ type: 'datetime', nullable: true })
  lastViewedAt: Date | null = null;

  @Property({ type: 'datetime', nullable: true })
  revokedAt: Date | null = null;

  @ManyToOne(() => User, { nullable: true, deleteRule: 'set null' })
  revokedBy: User | null = null;

  constructor(map: SavedMap, tokenHash: string, createdBy: User, now: Date) {
    this.map = map;
    this.tokenHash = tokenHash;
    this.createdBy = createdBy;
    this.createdAt = now;
  }
}
