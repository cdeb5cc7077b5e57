import { Injectable } from '@nestjs/common';
import { EntityManager } from '@mikro-orm/postgresql';
import type { MapLiveEvent, PinView, SharedLiveEvent, SharedPin } from '@fieldbound/shared';
import { Clock } from '../common/clock';
import type { MapEventKind } from './map-event.entity';

/** What a use case says happened; `data` holds the kind's own fields (see MapLiveEvent). */
export interface MapEventDraft {
  kind: MapEventKind;
  actorId: string | null;
  data: Record<string, unknown>;
}

/** Advisory-lock class of map events (the second key is a hash of the map id). */
const MAP_EVENT_LOCK_CLASS = 7_401;

interface MapEventRow {
  id: string;
  map_id: string;
  kind: MapEventKind;
  payload: Record<string, unknown> | string;
  created_at: Date | string;
  actor_id: string | null;
  actor_name: string | null;
}

const SELECT_EVENTS = `select e.id::text as id, e.map_id, e.kind, e.payload, e.created_at, u.id as actor_id, u.display_name as actor_name
  from map_events e left join users u on u.id = e.actor_id`;

/**
 * Writes and reads `map_events`. A change and its event are stored in one transaction; the table's
 * trigger announces the event (NOTIFY map_events), delivered by PostgreSQL only after the commit.
 */
@Injectable()
export class MapEventsService {
  constructor(
    private readonly em: EntityManager,
    private readonly clock: Clock,
  ) {}

  /**
   * Flushes the pending changes of `em` and records the event in the same transaction. `describe` runs
   * after the flush (ids, versions and counts are final) and after the map's event lock is taken, so
   * per map, event ids grow in commit order: a reader that saw event n of a map never misses a smaller one.
   */
  async flushAndRecord(em: EntityManager, mapId: string, describe: (tx: EntityManager) => MapEventDraft | Promise<MapEventDraft>): Promise<void> {
    await em.transactional(async (tx) => {
      await tx.flush();
      // em.execute runs in the transaction and turns driver errors into MikroORM's (so an outage answers 503).
      await tx.execute('select pg_advisory_xact_lock(?, hashtext(?))', [MAP_EVENT_LOCK_CLASS, mapId], 'get');
      const draft = await describe(tx);
      await tx.execute(
        'insert into map_events (map_id, kind, payload, actor_id, created_at) values (?, ?, ?::jsonb, ?, ?)',
        [mapId, draft.kind, JSON.stringify(draft.data), draft.actorId, this.clock.now()],
        'run',
      );
    });
  }

  /** Events of one map with an id above `afterId`, oldest first, at most `limit`. */
  async after(mapId: string, afterId: bigint, limit = 500): Promise<MapLiveEvent[]> {
    const rows = await this.em.execute<MapEventRow[]>(
      `${SELECT_EVENTS} where e.map_id = ? and e.id > ? order by e.id limit ?`,
      [mapId, afterId.toString(), limit],
    );
    return rows.map(toLiveEvent);
  }

  /** The id of the map's newest committed event (0 when it has none). */
  async latestId(mapId: string): Promise<bigint> {
    const [row] = await this.em.execute<{ id: string | null }[]>('select max(id)::text as id from map_events where map_id = ?', [mapId]);
    return BigInt(row?.id ?? 0);
  }

  /** Removes events older than `days` days; returns how many. */
  async prune(days: number): Promise<number> {
    const cutoff = new Date(this.clock.now().getTime() - days * 86_400_000);
    const result = await this.em.execute<{ affectedRows: number }>('delete from map_events where created_at < ?', [cutoff], 'run');
    return result.affectedRows ?? 0;
  }
}

function toLiveEvent(row: MapEventRow): MapLiveEvent {
  const payload = typeof row.payload === 'string' ? (JSON.parse(row.payload) as Record<string, unknown>) : row.payload;
  return {
    ...payload,
    id: row.id,
    mapId: row.map_id,
    at: new Date(row.created_at).toISOString(),
    actor: row.actor_id ? { id: row.actor_id, displayName: row.actor_name ?? '' } : null,
    kind: row.kind,
  } as MapLiveEvent;
}

function sharedPin(pin: PinView): SharedPin {
  return { id: pin.id, geometry: pin.geometry, title: pin.title, body: pin.body, status: pin.status, category: pin.category };
}

/**
 * What a viewing-link holder's stream carries of an event: no actor, no authors, no threads; pin events
 * only when the link shows pins. Null when the event is not for them.
 */
export function toSharedLiveEvent(event: MapLiveEvent, includePins: boolean): SharedLiveEvent | null {
  const base = { id: event.id, mapId: event.mapId, at: event.at };
  switch (event.kind) {
    case 'pin.created':
    case 'pin.updated':
      return includePins ? { ...base, kind: event.kind, pin: sharedPin(event.pin) } : null;
    case 'pin.deleted':
      return includePins ? { ...base, kind: event.kind, pinId: event.pinId } : null;
    case 'map.saved':
      return { ...base, kind: event.kind, version: event.version, title: event.title, updatedAt: event.updatedAt };
    default:
      return null;
  }
}
