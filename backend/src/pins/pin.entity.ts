import crypto from 'node:crypto';
import { Collection, Entity, Enum, Formula, Index, ManyToOne, OneToMany, type Opt, PrimaryKey, Property } from '@mikro-orm/core';
import { PIN_STATUSES, type PinGeometry, type PinStatus } from '@fieldbound/shared';
import { SavedMap } from '../maps/map.entity';
import { User } from '../users/user.entity';
import { PinReply } from './pin-reply.entity';

/**
 * A note pinned to a region of a map. The geometry is stored in physical units (polarizability a₀³,
 * field in tesla) so it stays on the same physics when axes, ranges or display units change.
 * `version` is MikroORM's optimistic-lock column: every update checks and bumps it.
 */
@Entity({ tableName: 'pins' })
@Index({ name: 'pins_map_index', properties: ['map'] })
export class Pin {
  @PrimaryKey({ type: 'uuid' })
  id: string = crypto.randomUUID();

  @ManyToOne(() => SavedMap, { deleteRule: 'cascade' })
  map: SavedMap;

  @ManyToOne(() => User, { nullable: true, deleteRule: 'set null' })
  author: User | null;

  @Property({ type: 'json' })
  geometry: PinGeometry;

  @Property({ type: 'string', length: 200 })
  title: string;

  /** Plain text, never rendered as HTML. */
  @Property({ type: 'text' })
  body: string & Opt = '';

  @Enum({ items: () => [...PIN_STATUSES], type: 'string' })
  status: PinStatus & Opt = 'open';

  @Property({ type: 'string', length: 40, nullable: true })
  category: string | null = null;

  @Property({ type: 'integer', version: true })
  version!: number & Opt;

  @Property({ type: 'datetime' })
  createdAt: Date & Opt = new Date();

  @Property({ type: 'datetime' })
  updatedAt: Date & Opt = new Date();

  @ManyToOne(() => User, { nullable: true, deleteRule: 'set null' })
  updatedBy: User | null = null;

  @Property({ type: 'datetime', nullable: true })
  resolvedAt: Date | null = null;

  @ManyToOne(() => User, { nullable: true, deleteRule: 'set null' })
  resolvedBy: User | null = null;

  @OneToMany(() => PinReply, (reply) => reply.pin, { orderBy: { createdAt: 'asc', id: 'asc' } })
  replies = new Collection<PinReply>(this);

  @Formula((alias) => `(select count(*)::int from pin_replies r where r.pin_id = ${alias}.id)`, { lazy: false })
  replyCount: number & Opt = 0;

  constructor(map: SavedMap, author: User, geometry: PinGeometry, title: string, now: Date) {
    this.map = map;
    this.author = author;
    this.geometry = geometry;
    this.title = title;
    this.createdAt = now;
    this.updatedAt = now;
    this.updatedBy = author;
  }
}
