import crypto from 'node:crypto';
import { Entity, EntityRepositoryType, Index, ManyToOne, OneToOne, type Opt, PrimaryKey, Property, type Ref } from '@mikro-orm/core';
import type { MapSetup } from '@fieldbound/shared';
import { Team } from '../teams/team.entity';
import { User } from '../users/user.entity';
import { MapRepository } from './map.repository';
import { MapResultSummary } from './map-result-summary.entity';
import { MapThumbnail } from './map-thumbnail.entity';

/**
 * A saved map of a team: title, description, tags and the full validated setup.
 *
 * `version` counts saves of this content (title, description, tags, setup): every save writes a
 * MapVersion with the same number, and a write must name the version it was based on (optimistic
 * locking; a stale one gets 409). Summaries, thumbnails and deletion do not change it.
 */
@Entity({ tableName: 'maps', repository: () => MapRepository })
@Index({ name: 'maps_team_index', properties: ['team', 'deletedAt'] })
@Index({ name: 'maps_tags_index', properties: ['tags'], type: 'gin' })
export class SavedMap {
  [EntityRepositoryType]?: MapRepository;

  @PrimaryKey({ type: 'uuid' })
  id: string = crypto.randomUUID();

  @ManyToOne(() => Team, { deleteRule: 'cascade' })
  team: Team;

  @Property({ type: 'string', length: 200 })
  title: string;

  @Property({ type: 'text' })
  description: string & Opt = '';

  @Property({ type: 'text[]' })
  tags: string[] & Opt = [];

  @Property({ type: 'json' })
  setup: MapSetup;

  @Property({ type: 'integer' })
  version: number & Opt = 1;

  @ManyToOne(() => User, { nullable: true, deleteRule: 'set null' })
  createdBy: User | null;

  @Property({ type: 'datetime' })
  createdAt: Date & Opt = new Date();

  @ManyToOne(() => User, { nullable: true, deleteRule: 'set null' })
  updatedBy: User | null;

  @Property({ type: 'datetime' })
  updatedAt: Date & Opt = new Date();

  /** Set when the map is in the bin; an owner can restore it for MAP_LIMITS.restoreWindowDays. */
  @Property({ type: 'datetime', nullable: true })
  deletedAt: Date | null = null;

  @ManyToOne(() => User, { nullable: true, deleteRule: 'set null' })
  deletedBy: User | null = null;

  @OneToOne(() => MapResultSummary, (summary) => summary.map, { nullable: true, ref: true })
  summary: Ref<MapResultSummary> | null = null;

  @OneToOne(() => MapThumbnail, (thumbnail) => thumbnail.map, { nullable: true, ref: true })
  thumbnail: Ref<MapThumbnail> | null = null;

  constructor(team: Team, title: string, setup: MapSetup, author: User, now: Date) {
    this.team = team;
    this.title = title;
    this.setup = setup;
    this.createdBy = author;
    this.updatedBy = author;
    this.createdAt = now;
    this.updatedAt = now;
  }
}
