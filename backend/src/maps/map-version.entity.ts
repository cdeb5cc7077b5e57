import crypto from 'node:crypto';
import { Entity, ManyToOne, type Opt, PrimaryKey, Property, Unique } from '@mikro-orm/core';
import type { MapSetup } from '@fieldbound/shared';
import { User } from '../users/user.entity';
import { SavedMap } from './map.entity';

/**
 * A numbered snapshot of a map's content, written by every save. The unique (map, number) pair is what
 * makes concurrent saves safe: two writers based on the same version cannot both add its successor.
 */
@Entity({ tableName: 'map_versions' })
@Unique({ name: 'map_versions_map_number_unique', properties: ['map', 'number'] })
export class MapVersion {
  @PrimaryKey({ type: 'uuid' })
  id: string = crypto.randomUUID();

  @ManyToOne(() => SavedMap, { deleteRule: 'cascade' })
  map: SavedMap;

  @Property({ type: 'integer' })
  number: number;

  @Property({ type: 'string', length: 200 })
  title: string;

  @Property({ type: 'text' })
  description: string;

  @Property({ type: 'text[]' })
  tags: string[];

  @Property({ type: 'json' })
  setup: MapSetup;

  @ManyToOne(() => User, { nullable: true, deleteRule: 'set null' })
  createdBy: User | null;

  @Property({ type: 'datetime' })
  createdAt: Date & Opt = new Date();

  /** The version this one restored, when it was made by a restore. */
  @Property({ type: 'integer', nullable: true })
  restoredFrom: number | null = null;

  /** The map and version this map was copied from (only on version 1 of a duplicate). */
  @Property({ type: 'uuid', nullable: true })
  duplicatedFromMapId: string | null = null;

  @Property({ type: 'integer', nullable: true })
  duplicatedFromVersion: number | null = null;

  /** Snapshots the map's current content under its current version number. */
  constructor(map: SavedMap, author: User | null, now: Date) {
    this.map = map;
    this.number = map.version;
    this.title = map.title;
    this.description = map.description;
    this.tags = [...map.tags];
    this.setup = structuredClone(map.setup);
    this.createdBy = author;
    this.createdAt = now;
  }
}
