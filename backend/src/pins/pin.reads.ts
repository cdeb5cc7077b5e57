import { Injectable } from '@nestjs/common';
import { EntityManager } from '@mikro-orm/postgresql';
import type { PinDetail, PinGeometry, PinReplyView, PinStatus, PinView, SharedPin } from '@fieldbound/shared';
import { isoTime, personFromColumns, selectRows } from '../common/sql-reads';

const PIN_COLUMNS = `
  p.id, p.map_id, p.geometry, p.title, p.body, p.status, p.category, p.version, p.created_at, p.updated_at, p.resolved_at,
  a.id as author_id, a.display_name as author_name, r.id as resolved_by_id, r.display_name as resolved_by_name,
  (select count(*)::int from pin_replies pr where pr.pin_id = p.id) as reply_count`;

const PIN_JOINS = `
  left join users a on a.id = p.author_id
  left join users r on r.id = p.resolved_by_id`;

interface PinRow {
  id: string;
  map_id: string;
  geometry: PinGeometry;
  title: string;
  body: string;
  status: PinStatus;
  category: string | null;
  version: number;
  created_at: Date | string;
  updated_at: Date | string;
  resolved_at: Date | string | null;
  author_id: string | null;
  author_name: string | null;
  resolved_by_id: string | null;
  resolved_by_name: string | null;
  reply_count: number;
}

/** The same view as `toPinView` builds from an entity (pin.views.ts), from one joined row. */
function pinFromRow(row: PinRow): PinView {
  return {
    id: row.id,
    mapId: row.map_id,
    author: personFromColumns(row.author_id, row.author_name),
    geometry: row.geometry,
    title: row.title,
    body: row.body,
    status: row.status,
    category: row.category,
    version: row.version,
    createdAt: isoTime(row.created_at),
    updatedAt: isoTime(row.updated_at),
    resolvedAt: row.resolved_at ? isoTime(row.resolved_at) : null,
    resolvedBy: personFromColumns(row.resolved_by_id, row.resolved_by_name),
    replyCount: row.reply_count,
  };
}

/** Read-only queries of pins and threads for the busiest routes (see common/sql-reads.ts for why plain SQL). */
@Injectable()
export class PinReads {
  constructor(private readonly em: EntityManager) {}

  /** A map's pins, oldest first, with reply counts; optionally only open or only resolved ones. */
  async listForMap(mapId: string, status?: PinStatus): Promise<PinView[]> {
    const rows = await selectRows<PinRow>(
      this.em,
      `select ${PIN_COLUMNS} from pins p ${PIN_JOINS}
       where p.map_id = ?${status ? ' and p.status = ?' : ''}
       order by p.created_at asc, p.id asc`,
      status ? [mapId, status] : [mapId],
    );
    return rows.map(pinFromRow);
  }

  /** A pin (null if none) and the id of its map. */
  async pin(pinId: string): Promise<PinView | null> {
    const rows = await selectRows<PinRow>(this.em, `select ${PIN_COLUMNS} from pins p ${PIN_JOINS} where p.id = ?`, [pinId]);
    return rows[0] ? pinFromRow(rows[0]) : null;
  }

  /** A pin's id, title and map, or null. */
  async mapOfPin(pinId: string): Promise<{ pinId: string; title: string; mapId: string } | null> {
    const rows = await selectRows<{ id: string; title: string; map_id: string }>(this.em, 'select p.id, p.title, p.map_id from pins p where p.id = ?', [pinId]);
    return rows[0] ? { pinId: rows[0].id, title: rows[0].title, mapId: rows[0].map_id } : null;
  }

  /** A pin's thread, oldest reply first. */
  async detail(pin: PinView): Promise<PinDetail> {
    const rows = await selectRows<{ id: string; body: string; created_at: Date | string; author_id: string | null; author_name: string | null }>(
      this.em,
      `select pr.id, pr.body, pr.created_at, u.id as author_id, u.display_name as author_name
       from pin_replies pr left join users u on u.id = pr.author_id
       where pr.pin_id = ? order by pr.created_at asc, pr.id asc`,
      [pin.id],
    );
    const replies: PinReplyView[] = rows.map((r) => ({ id: r.id, author: personFromColumns(r.author_id, r.author_name), body: r.body, createdAt: isoTime(r.created_at) }));
    return { ...pin, replyCount: replies.length, replies };
  }

  /** What a viewing-link holder sees of a map's pins (no people, no thread), oldest first. */
  async sharedForMap(mapId: string): Promise<SharedPin[]> {
    return selectRows<SharedPin>(
      this.em,
      `select p.id, p.geometry, p.title, p.body, p.status, p.category from pins p where p.map_id = ? order by p.created_at asc, p.id asc`,
      [mapId],
    );
  }
}
