import { Entity, Index, ManyToOne, type Opt, PrimaryKey, Property } from '@mikro-orm/core';
import { SavedMap } from '../maps/map.entity';
import { User } from '../users/user.entity';

/** The kinds of change a map's live stream carries (shared/src/api/live.ts). */
export const MAP_EVENT_KINDS = ['pin.created', 'pin.updated', 'pin.deleted', 'pin.replied', 'map.saved'] as const;
export type MapEventKind = (typeof MAP_EVENT_KINDS)[number];

/**
 * One change of a map, written in the same transaction as the change itself and announced with
 * `NOTIFY map_events` by a trigger (so every server instance can deliver it to its live streams).
 * `id` is a bigserial: per map, ids grow in commit order (writers take a per-map advisory lock
 * before inserting), which is what makes catch-up by `Last-Event-ID` exact.
 * `payload` holds the kind's own fields (e.g. `{ pin }`); rows older than the retention are pruned.
 */
@Entity({ tableName: 'map_events' })
@Index({ name: 'map_events_map_id_index', properties: ['map', 'id'] })
@Index({ name: 'map_events_created_at_index', properties: ['createdAt'] })
export class MapEvent {
  @PrimaryKey({ type: 'bigint', autoincrement: true })
  id!: string & Opt;

  @ManyToOne(() => SavedMap, { deleteRule: 'cascade' })
  map!: SavedMap;

  @Property({ type: 'string', length: 20 })
  kind!: MapEventKind;

  @Property({ type: 'json' })
  payload!: Record<string, unknown>;

  @ManyToOne(() => User, { nullable: true, deleteRule: 'set null' })
  actor: User | null = null;

  @Property({ type: 'datetime' })
  createdAt!: Date;
}
