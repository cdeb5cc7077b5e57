import { Entity, ManyToOne, OneToOne, type Opt, Property } from '@mikro-orm/core';
import type { ResultCounts } from '@fieldbound/shared';
import { User } from '../users/user.entity';
import { SavedMap } from './map.entity';

/** The summary of the last computation a client attached to a map (one per map, replaced on each upload). */
@Entity({ tableName: 'map_result_summaries' })
export class MapResultSummary {
  @OneToOne(() => SavedMap, (map) => map.summary, { primary: true, owner: true, deleteRule: 'cascade', fieldName: 'map_id' })
  map: SavedMap;

  @Property({ type: 'string', length: 40 })
  engineVersion: string;

  @Property({ type: 'string', length: 64 })
  setupFingerprint: string;

  @Property({ type: 'json' })
  counts: ResultCounts;

  @Property({ type: 'double' })
  computationMs: number;

  @Property({ type: 'datetime' })
  computedAt: Date & Opt = new Date();

  @ManyToOne(() => User, { nullable: true, deleteRule: 'set null' })
  computedBy: User | null;

  constructor(map: SavedMap, init: { engineVersion: string; setupFingerprint: string; counts: ResultCounts; computationMs: number }, by: User, now: Date) {
    this.map = map;
    this.engineVersion = init.engineVersion;
    this.setupFingerprint = init.setupFingerprint;
    this.counts = init.counts;
    this.computationMs = init.computationMs;
    this.computedBy = by;
    this.computedAt = now;
  }
}
