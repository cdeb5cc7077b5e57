import type { EntityManager } from '@mikro-orm/postgresql';

/*
 * Plain-SQL reads for the busiest GET routes (map list, open map, pins, a pin's thread, versions, viewing
 * links, the token holder check). The ORM spent ~1–2 ms of CPU per statement building SQL and hydrating
 * entities on this project's machine — more than PostgreSQL spent answering (docs/loadtest.md) — and these
 * routes only turn rows into JSON. Writes keep the ORM (unit of work, optimistic locking, events).
 * Each read module has a test that its answers equal the ORM-built views for the same rows.
 */

/** Rows of one statement (`?` placeholders, bound by the driver; never string-built values). */
export function selectRows<Row>(em: EntityManager, sql: string, params: readonly unknown[]): Promise<Row[]> {
  // Through the current context's manager, as every ORM call goes: the request's fork (and its transaction, if any).
  // `em.execute` alone would use the injected manager's driver, which in a process running two applications
  // (tests) can belong to the other one: passport keeps one strategy per name process-wide.
  return em.getContext(false).execute<Row[]>(sql, params as unknown[], 'all');
}

/** ISO 8601 text of a timestamp column, whichever way the driver handed it over. */
export function isoTime(value: Date | string): string {
  return (value instanceof Date ? value : new Date(value)).toISOString();
}

/** `{ id, displayName }` from a left-joined user's two columns, or null when the user is gone. */
export function personFromColumns(id: string | null, displayName: string | null): { id: string; displayName: string } | null {
  return id === null ? null : { id, displayName: displayName ?? '' };
}
